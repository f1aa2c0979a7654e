import { StyleSheet, View } from 'react-native';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Text } from '@/components/ui/text';

/** A cell: its value, and optionally a second, quieter line (the ± uncertainty, a unit). */
export type DataCell = string | { value: string; detail?: string };

export interface DataTableProps {
  headers: readonly string[];
  rows: readonly (readonly DataCell[])[];
  /** Relative column widths; equal when left out. A label column usually wants more. */
  columnFlex?: readonly number[];
  /** Rows get `<testID>-row-<n>`. */
  testID: string;
}

const mainOf = (cell: DataCell | undefined) => (typeof cell === 'string' ? cell : (cell?.value ?? ''));

/** A few columns of numbers that still fit a phone: one row per peak, level or quantity. */
export function DataTable({ headers, rows, columnFlex, testID }: DataTableProps) {
  const { colors } = useTheme();
  const flex = (j: number) => ({ flex: columnFlex?.[j] ?? 1 });
  // A two-column list of facts needs no header row.
  const withHeader = headers.some((header) => header !== '');
  return (
    <View style={[styles.table, { borderColor: colors.hairline }]} testID={testID}>
      {withHeader ? (
        <View style={styles.row}>
          {headers.map((header, j) => (
            <Text key={`${header}-${j}`} variant="caption" tone="muted" style={flex(j)}>
              {header}
            </Text>
          ))}
        </View>
      ) : null}
      {rows.map((row, i) => (
        <View
          key={`${mainOf(row[0])}-${i}`}
          style={[styles.row, (withHeader || i > 0) && styles.ruled, { borderTopColor: colors.hairline }]}
          testID={`${testID}-row-${i}`}
        >
          {row.map((cell, j) => (
            <View key={`${headers[j]}-${j}`} style={flex(j)}>
              <Text variant={j === 0 ? 'label' : 'body'}>{mainOf(cell)}</Text>
              {typeof cell !== 'string' && cell.detail ? (
                <Text variant="caption" tone="muted">
                  {cell.detail}
                </Text>
              ) : null}
            </View>
          ))}
        </View>
      ))}
    </View>
  );
}

/**
 * A measured value with its one-sigma error, the error rounded to one significant figure and the
 * value to the same decimal place (common practice for reporting uncertainties, no source).
 */
export function withError(value: number, stdErr: number | undefined, fallbackDigits: number): DataCell {
  if (stdErr === undefined || !Number.isFinite(stdErr) || stdErr <= 0) return value.toFixed(fallbackDigits);
  const digits = Math.min(6, Math.max(0, -Math.floor(Math.log10(stdErr))));
  return { value: value.toFixed(digits), detail: `± ${stdErr.toFixed(digits)}` };
}

const styles = StyleSheet.create({
  table: { borderWidth: sizes.hairline, borderRadius: radii.md, paddingHorizontal: space.md },
  row: {
    flexDirection: 'row',
    alignItems: 'center',
    minHeight: sizes.touchTarget - space.sm,
    gap: space.sm,
    paddingVertical: space.xs,
  },
  ruled: { borderTopWidth: sizes.hairline },
});
