import { StyleSheet, View } from 'react-native';
import { radii, space } from '@/components/theme';
import { Text } from '@/components/ui/text';

export interface LegendEntry {
  label: string;
  colour: string;
  /** Drawn as a dashed stroke rather than a filled swatch (a measured level, a fitted curve). */
  dashed?: boolean;
}

/** What each colour in a plot means, in words, under the plot. */
export function PlotLegend({ entries }: { entries: readonly LegendEntry[] }) {
  return (
    <View style={styles.legend}>
      {entries.map((entry) => (
        <View key={entry.label} style={styles.entry}>
          <View
            style={[
              styles.swatch,
              entry.dashed
                ? { borderColor: entry.colour, borderWidth: 2, borderStyle: 'dashed' }
                : { backgroundColor: entry.colour },
            ]}
          />
          <Text variant="caption">{entry.label}</Text>
        </View>
      ))}
    </View>
  );
}

const SWATCH = space.lg;

const styles = StyleSheet.create({
  legend: { flexDirection: 'row', flexWrap: 'wrap', columnGap: space.lg, rowGap: space.xs },
  entry: { flexDirection: 'row', alignItems: 'center', gap: space.xs },
  swatch: { width: SWATCH, height: SWATCH / 2, borderRadius: radii.sm / 2 },
});
