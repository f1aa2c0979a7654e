import { StyleSheet, View } from 'react-native';
import { ROLE_LABELS, type Role } from '@/shared/roles';
import type { UserStatus } from '@/shared/schemas/user';
import { radii, space, useTheme, type Palette } from '@/components/theme';
import { Text } from './text';

interface Look {
  background: keyof Palette;
  text: keyof Palette;
}

function Chip({ label, look, accessibilityLabel }: { label: string; look: Look; accessibilityLabel: string }) {
  const { colors } = useTheme();
  return (
    <View
      accessibilityLabel={accessibilityLabel}
      style={[styles.chip, { backgroundColor: colors[look.background] }]}
    >
      <Text variant="caption" style={[styles.chipText, { color: colors[look.text] }]}>
        {label}
      </Text>
    </View>
  );
}

const ROLE_LOOKS: Record<Role, Look> = {
  manager: { background: 'primarySoft', text: 'onPrimarySoft' },
  researcher: { background: 'successSoft', text: 'onSuccessSoft' },
  reviewer: { background: 'neutralSoft', text: 'onNeutralSoft' },
};

export function RoleBadge({ role }: { role: Role }) {
  return <Chip label={ROLE_LABELS[role]} look={ROLE_LOOKS[role]} accessibilityLabel={`Role: ${ROLE_LABELS[role]}`} />;
}

export const STATUS_LABELS: Record<UserStatus, string> = {
  invited: 'Invited',
  active: 'Active',
  deactivated: 'Deactivated',
};

const STATUS_LOOKS: Record<UserStatus, Look> = {
  invited: { background: 'warnSoft', text: 'onWarnSoft' },
  active: { background: 'successSoft', text: 'onSuccessSoft' },
  deactivated: { background: 'neutralSoft', text: 'onNeutralSoft' },
};

export function StatusPill({ status }: { status: UserStatus }) {
  return (
    <Chip
      label={STATUS_LABELS[status]}
      look={STATUS_LOOKS[status]}
      accessibilityLabel={`Status: ${STATUS_LABELS[status]}`}
    />
  );
}

const styles = StyleSheet.create({
  chip: {
    alignSelf: 'flex-start',
    borderRadius: radii.pill,
    paddingHorizontal: space.md,
    paddingVertical: space.xxs,
  },
  chipText: { fontFamily: 'IBMPlexSans_500Medium' },
});
