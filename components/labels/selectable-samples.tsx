import Ionicons from '@expo/vector-icons/Ionicons';
import { Pressable, StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS } from '@/shared/samples';
import type { SampleListRow } from '@/shared/schemas/sample';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Text } from '@/components/ui/text';

export interface SelectableSamplesProps {
  samples: readonly SampleListRow[];
  chosen: readonly string[];
  onToggle: (code: string) => void;
}

/** The list while choosing samples for labels: each row is one big checkbox. */
export function SelectableSamples({ samples, chosen, onToggle }: SelectableSamplesProps) {
  const { colors } = useTheme();
  return (
    <View style={styles.list} role="list" accessibilityLabel="Samples to choose from" testID="sample-select-list">
      {samples.map((sample) => {
        const checked = chosen.includes(sample.code);
        return (
          <View key={sample.code} role="listitem">
            <Pressable
              accessibilityRole="checkbox"
              accessibilityLabel={`${sample.code}, ${SAMPLE_KIND_LABELS[sample.kind]}, ${sample.material}`}
              accessibilityState={{ checked }}
              onPress={() => onToggle(sample.code)}
              testID={`select-sample-${sample.code}`}
              style={({ pressed }) => [
                styles.row,
                {
                  borderColor: checked ? colors.primary : colors.hairline,
                  backgroundColor: checked ? colors.primarySoft : pressed ? colors.sunken : colors.surface,
                },
              ]}
            >
              <Ionicons
                name={checked ? 'checkbox' : 'square-outline'}
                size={sizes.icon}
                color={checked ? colors.primary : colors.outline}
              />
              <View style={styles.text}>
                <Text variant="code" tone="primary">
                  {sample.code}
                </Text>
                <Text variant="caption" tone="muted" numberOfLines={1}>
                  {[SAMPLE_KIND_LABELS[sample.kind], sample.material, sample.name].filter(Boolean).join(' · ')}
                </Text>
              </View>
            </Pressable>
          </View>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.xs },
  row: {
    minHeight: sizes.touchTarget,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    borderRadius: radii.md,
    borderWidth: sizes.hairline,
  },
  text: { flex: 1, minWidth: 0, gap: space.xxs },
});
