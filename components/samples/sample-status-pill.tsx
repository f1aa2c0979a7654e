import { StyleSheet, View } from 'react-native';
import { SAMPLE_STATUS_LABELS, type SampleStatus } from '@/shared/samples';
import { fontFaces, radii, space, useTheme, type Palette } from '@/components/theme';
import { Text } from '@/components/ui/text';

interface Look {
  background: keyof Palette;
  text: keyof Palette;
  dot: keyof Palette;
}

/** Usable states read as calm colours; states that stop work (missing, retired) stand out. */
const LOOKS: Record<SampleStatus, Look> = {
  ready: { background: 'successSoft', text: 'onSuccessSoft', dot: 'onSuccessSoft' },
  in_process: { background: 'infoSoft', text: 'onInfoSoft', dot: 'onInfoSoft' },
  used_up: { background: 'neutralSoft', text: 'onNeutralSoft', dot: 'outline' },
  missing: { background: 'warnSoft', text: 'onWarnSoft', dot: 'onWarnSoft' },
  discarded: { background: 'neutralSoft', text: 'onNeutralSoft', dot: 'outline' },
  retired: { background: 'dangerSoft', text: 'onDangerSoft', dot: 'onDangerSoft' },
};

/** Where a sample is in its life, as a rounded pill with a dot (like the people list's status). */
export function SampleStatusPill({ status }: { status: SampleStatus }) {
  const { colors } = useTheme();
  const look = LOOKS[status];
  return (
    <View
      accessibilityLabel={`Status: ${SAMPLE_STATUS_LABELS[status]}`}
      style={[styles.pill, { backgroundColor: colors[look.background] }]}
      testID={`sample-status-${status}`}
    >
      <View style={[styles.dot, { backgroundColor: colors[look.dot] }]} />
      <Text variant="caption" numberOfLines={1} style={[styles.text, { color: colors[look.text] }]}>
        {SAMPLE_STATUS_LABELS[status]}
      </Text>
    </View>
  );
}

const DOT_SIZE = space.sm;

const styles = StyleSheet.create({
  pill: {
    alignSelf: 'flex-start',
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs + space.xxs,
    paddingHorizontal: space.sm + space.xxs,
    paddingVertical: space.xxs,
    borderRadius: radii.pill,
  },
  dot: { width: DOT_SIZE, height: DOT_SIZE, borderRadius: DOT_SIZE / 2 },
  text: { fontFamily: fontFaces.sansMedium },
});
