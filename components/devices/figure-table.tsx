import { StyleSheet, View } from 'react-native';
import { sizes, space, useTheme } from '@/components/theme';
import { Text } from '@/components/ui/text';

export interface FigureTableProps {
  /** Column headings; the first column names the row. */
  columns: readonly string[];
  rows: readonly { key: string; cells: readonly string[]; emphasis?: boolean }[];
  accessibilityLabel: string;
  testID?: string;
}

/** A small table of figures that fits a phone: equal columns, numbers right-aligned. */
export function FigureTable({ columns, rows, accessibilityLabel, testID }: FigureTableProps) {
  const { colors } = useTheme();
  return (
    <View role="table" accessibilityLabel={accessibilityLabel} testID={testID} style={styles.table}>
      <View role="row" style={[styles.row, { borderBottomColor: colors.outline }]}>
        {columns.map((column, index) => (
          <Text
            key={column}
            role="columnheader"
            variant="caption"
            tone="muted"
            style={[styles.cell, index === 0 ? styles.name : styles.number]}
          >
            {column}
          </Text>
        ))}
      </View>
      {rows.map((row) => (
        <View
          key={row.key}
          role="row"
          style={[styles.row, { borderBottomColor: colors.hairline }, row.emphasis && { backgroundColor: colors.primarySoft }]}
        >
          {row.cells.map((cell, index) => (
            <Text
              key={`${row.key}-${index}`}
              role="cell"
              variant={index === 0 ? 'label' : 'body'}
              style={[styles.cell, index === 0 ? styles.name : styles.number, row.emphasis && { color: colors.onPrimarySoft }]}
            >
              {cell}
            </Text>
          ))}
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  table: { alignSelf: 'stretch' },
  row: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    paddingHorizontal: space.xs,
    paddingVertical: space.xs,
    borderBottomWidth: sizes.hairline,
  },
  cell: { flex: 1 },
  /** The row's name is short ("m = 3", "532 nm"); the numbers get the room. */
  name: { flex: 0.75 },
  number: { textAlign: 'right', fontVariant: ['tabular-nums'] },
});
