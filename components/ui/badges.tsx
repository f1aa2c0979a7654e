import { StyleSheet, View } from 'react-native';
import { ROLE_LABELS, type Role } from '@/shared/roles';
import type { UserStatus } from '@/shared/schemas/user';
import { fontFaces, radii, space, useTheme, type Palette } from '@/components/theme';
import { Text } from './text';

interface Look {
  background: keyof Palette;
  text: keyof Palette;
}

const ROLE_LOOKS: Record<Role, Look> = {
  manager: { background: 'primarySoft', text: 'onPrimarySoft' },
  researcher: { background: 'copperSoft', text: 'onCopperSoft' },
  reviewer: { background: 'neutralSoft', text: 'onNeutralSoft' },
};

/** A squared tag, so a role never reads as a status pill at a glance. */
export function RoleBadge({ role }: { role: Role }) {
  const { colors } = useTheme();
  const look = ROLE_LOOKS[role];
  return (
    <View
      accessibilityLabel={`Role: ${ROLE_LABELS[role]}`}
      style={[styles.chip, styles.tag, { backgroundColor: colors[look.background] }]}
    >
      <Text variant="caption" style={[styles.chipText, { color: colors[look.text] }]}>
        {ROLE_LABELS[role]}
      </Text>
    </View>
  );
}

export const STATUS_LABELS: Record<UserStatus, string> = {
  invited: 'Invited',
  active: 'Active',
  deactivated: 'Deactivated',
};

/** Colours of a pill: its background, its text and its dot. */
export type PillLook = Look & { dot: keyof Palette };

const STATUS_LOOKS: Record<UserStatus, PillLook> = {
  invited: { background: 'warnSoft', text: 'onWarnSoft', dot: 'onWarnSoft' },
  active: { background: 'successSoft', text: 'onSuccessSoft', dot: 'onSuccessSoft' },
  deactivated: { background: 'neutralSoft', text: 'onNeutralSoft', dot: 'outline' },
};

/** A rounded pill with a dot: the shape every status takes, so statuses never read as roles. */
export function DotPill({ label, look, testID }: { label: string; look: PillLook; testID?: string }) {
  const { colors } = useTheme();
  return (
    <View
      accessibilityLabel={`Status: ${label}`}
      style={[styles.chip, styles.pill, { backgroundColor: colors[look.background] }]}
      testID={testID}
    >
      <View style={[styles.dot, { backgroundColor: colors[look.dot] }]} />
      <Text variant="caption" numberOfLines={1} style={[styles.chipText, { color: colors[look.text] }]}>
        {label}
      </Text>
    </View>
  );
}

/** Whether the account can be used right now. */
export function StatusPill({ status }: { status: UserStatus }) {
  return <DotPill label={STATUS_LABELS[status]} look={STATUS_LOOKS[status]} />;
}

const DOT_SIZE = space.sm;

const styles = StyleSheet.create({
  chip: {
    alignSelf: 'flex-start',
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs + space.xxs,
    paddingHorizontal: space.sm + space.xxs,
    paddingVertical: space.xxs,
  },
  tag: { borderRadius: radii.sm },
  pill: { borderRadius: radii.pill },
  dot: { width: DOT_SIZE, height: DOT_SIZE, borderRadius: DOT_SIZE / 2 },
  chipText: { fontFamily: fontFaces.sansMedium },
});
