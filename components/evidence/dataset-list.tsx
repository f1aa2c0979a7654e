import { StyleSheet, View } from 'react-native';
import type { DatasetInfo } from '@/shared/optics/materials';
import { space } from '@/components/theme';
import { Text } from '@/components/ui/text';

/** Where a prediction's optical constants come from, shown as the papers themselves. */
export function DatasetList({ datasets, testID }: { datasets: readonly DatasetInfo[]; testID?: string }) {
  return (
    <View style={styles.list} testID={testID}>
      {datasets.map((dataset) => (
        <View key={dataset.id} style={styles.item}>
          <Text variant="caption">{dataset.citation}</Text>
          <Text variant="caption" tone="muted">
            {[
              `${dataset.kind === 'table' ? 'Tabulated' : 'Dispersion formula'}, ${dataset.fromNm}–${dataset.toNm} nm`,
              dataset.doi ? `doi:${dataset.doi}` : null,
              dataset.note ?? null,
            ]
              .filter(Boolean)
              .join(' · ')}
          </Text>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  item: { gap: space.xxs },
});
