import { Link, type Href } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS } from '@/shared/samples';
import type { SampleListRow } from '@/shared/schemas/sample';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Text } from '@/components/ui/text';
import { SampleStatusPill } from './sample-status-pill';

export interface SampleCardProps {
  sample: SampleListRow;
  href: Href;
}

/**
 * One sample in the phone list: the code to match against the label in hand, then what it is.
 * Under <Link asChild> the Pressable takes only a flat style, so an inner view draws the card.
 */
export function SampleCard({ sample, href }: SampleCardProps) {
  const { colors } = useTheme();
  return (
    <Link href={href} asChild>
      <Pressable
        testID={`sample-row-${sample.code}`}
        accessibilityLabel={`${sample.code}, ${SAMPLE_KIND_LABELS[sample.kind]}, ${sample.material}`}
        style={styles.target}
      >
        {({ pressed }) => (
          <View
            style={[styles.card, { backgroundColor: pressed ? colors.sunken : colors.surface, borderColor: colors.hairline }]}
          >
            <View style={styles.top}>
              <Text variant="code" tone="primary" style={styles.code} numberOfLines={1}>
                {sample.code}
              </Text>
              <SampleStatusPill status={sample.status} />
            </View>
            <Text variant="label" numberOfLines={1}>
              {`${SAMPLE_KIND_LABELS[sample.kind]} · ${sample.material}`}
            </Text>
            {sample.name ? (
              <Text numberOfLines={1} tone="muted">
                {sample.name}
              </Text>
            ) : null}
            <Text variant="caption" tone="muted" numberOfLines={1}>
              {sample.owner.displayName}
            </Text>
          </View>
        )}
      </Pressable>
    </Link>
  );
}

const styles = StyleSheet.create({
  target: { minHeight: sizes.touchTarget },
  card: {
    minHeight: sizes.touchTarget,
    gap: space.xxs,
    paddingHorizontal: space.lg,
    paddingVertical: space.md,
    borderRadius: radii.md,
    borderWidth: sizes.hairline,
  },
  top: { flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: space.sm },
  code: { flexShrink: 1 },
});
