import { Link } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS, SAMPLE_STATUS_LABELS } from '@/shared/samples';
import type { SampleSummary } from '@/shared/schemas/sample';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Text } from '@/components/ui/text';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { sampleHref } from './sample-list-params';

export interface SampleChipProps {
  sample: SampleSummary;
  /** A few words after the kind, e.g. "used up". */
  note?: string;
}

/** A related sample as a tappable chip: its code, then kind and material. */
export function SampleChip({ sample, note }: SampleChipProps) {
  const { colors } = useTheme();
  const { isWide } = useBreakpoints();
  const inactive = sample.status !== 'ready' && sample.status !== 'in_process';
  const details = [SAMPLE_KIND_LABELS[sample.kind], sample.material, inactive ? SAMPLE_STATUS_LABELS[sample.status] : null, note]
    .filter(Boolean)
    .join(' · ');
  return (
    <Link href={sampleHref(sample.code, { wide: isWide })} asChild>
      <Pressable testID={`sample-chip-${sample.code}`} accessibilityLabel={`${sample.code}, ${details}`} style={styles.target}>
        {({ pressed }) => (
          <View style={[styles.chip, { borderColor: colors.outline, backgroundColor: pressed ? colors.sunken : colors.surface }]}>
            <Text variant="code" tone="primary">
              {sample.code}
            </Text>
            <Text variant="caption" tone="muted" numberOfLines={1}>
              {details}
            </Text>
          </View>
        )}
      </Pressable>
    </Link>
  );
}

/** Chips in a wrapping row, or a line saying there are none. */
export function SampleChips({ samples, empty, testID }: { samples: readonly SampleSummary[]; empty: string; testID?: string }) {
  if (samples.length === 0) {
    return (
      <Text tone="muted" testID={testID}>
        {empty}
      </Text>
    );
  }
  return (
    <View style={styles.row} testID={testID}>
      {samples.map((sample) => (
        <SampleChip key={sample.code} sample={sample} />
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  target: { minHeight: sizes.touchTarget },
  chip: {
    minHeight: sizes.touchTarget,
    justifyContent: 'center',
    paddingHorizontal: space.md,
    paddingVertical: space.xs,
    borderRadius: radii.md,
    borderWidth: sizes.hairline,
  },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
