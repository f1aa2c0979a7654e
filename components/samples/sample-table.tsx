import Ionicons from '@expo/vector-icons/Ionicons';
import { Link, type Href } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS } from '@/shared/samples';
import type { SampleListRow } from '@/shared/schemas/sample';
import { fontFaces, radii, sizes, space, useTheme } from '@/components/theme';
import { formatDate } from '@/components/ui/format';
import { Text } from '@/components/ui/text';
import type { SampleSort, SortOrder } from '@/hooks/use-samples';
import { SampleStatusPill } from './sample-status-pill';

interface Column {
  sort: SampleSort;
  label: string;
  /** Share of the table's width. */
  flex: number;
  /** Order on the first click: dates newest first, words A to Z. */
  firstOrder: SortOrder;
}

const COLUMNS: readonly Column[] = [
  { sort: 'code', label: 'Code', flex: 1.5, firstOrder: 'asc' },
  { sort: 'kind', label: 'Kind', flex: 1.05, firstOrder: 'asc' },
  { sort: 'material', label: 'Material', flex: 0.95, firstOrder: 'asc' },
  { sort: 'status', label: 'Status', flex: 1.3, firstOrder: 'asc' },
  { sort: 'createdAt', label: 'Created', flex: 0.95, firstOrder: 'desc' },
];

export interface SampleTableProps {
  samples: readonly SampleListRow[];
  sort: SampleSort;
  order: SortOrder;
  onSort: (sort: SampleSort, order: SortOrder) => void;
  selectedCode: string | null;
  hrefFor: (code: string) => Href;
}

/** The wide-screen list: one line per sample, sorted by clicking a column's heading. */
export function SampleTable({ samples, sort, order, onSort, selectedCode, hrefFor }: SampleTableProps) {
  const { colors } = useTheme();
  return (
    // Rows are links (the address selects the sample), so the table is announced as sort buttons
    // above a list of links rather than as a grid.
    <View style={[styles.table, { borderColor: colors.hairline }]} testID="sample-table">
      <View style={[styles.row, styles.headerRow, { backgroundColor: colors.sunken }]}>
        {COLUMNS.map((column) => {
          const current = column.sort === sort;
          const nextOrder: SortOrder = current ? (order === 'asc' ? 'desc' : 'asc') : column.firstOrder;
          return (
            <Pressable
              key={column.sort}
              accessibilityRole="button"
              accessibilityLabel={`${column.label}${current ? (order === 'asc' ? ', sorted ascending' : ', sorted descending') : ''}. Sort by ${column.label.toLowerCase()}.`}
              onPress={() => onSort(column.sort, nextOrder)}
              testID={`sample-sort-${column.sort}`}
              style={({ pressed }) => [styles.header, { flex: column.flex }, pressed && { backgroundColor: colors.hairline }]}
            >
              <Text variant="caption" style={[styles.headerText, { color: current ? colors.primary : colors.inkMuted }]}>
                {column.label}
              </Text>
              {current ? (
                <Ionicons name={order === 'asc' ? 'arrow-up' : 'arrow-down'} size={sizes.iconSmall} color={colors.primary} />
              ) : null}
            </Pressable>
          );
        })}
      </View>
      <View role="list" accessibilityLabel="Samples">
        {samples.map((sample) => (
          <View key={sample.code} role="listitem">
            <SampleTableRow sample={sample} selected={sample.code === selectedCode} href={hrefFor(sample.code)} />
          </View>
        ))}
      </View>
    </View>
  );
}

function SampleTableRow({ sample, selected, href }: { sample: SampleListRow; selected: boolean; href: Href }) {
  const { colors } = useTheme();
  return (
    <Link href={href} asChild>
      <Pressable
        testID={`sample-row-${sample.code}`}
        aria-current={selected ? 'true' : undefined}
        accessibilityLabel={`${sample.code}, ${SAMPLE_KIND_LABELS[sample.kind]}, ${sample.material}`}
        style={styles.rowTarget}
      >
        {({ pressed }) => (
          <View
            style={[
              styles.row,
              styles.bodyRow,
              {
                borderTopColor: colors.hairline,
                backgroundColor: selected ? colors.primarySoft : pressed ? colors.sunken : colors.surface,
              },
            ]}
          >
            <View style={[styles.cell, { flex: COLUMNS[0].flex }]}>
              <Text variant="code" tone="primary" numberOfLines={1}>
                {sample.code}
              </Text>
              {sample.name ? (
                <Text variant="caption" tone="muted" numberOfLines={1}>
                  {sample.name}
                </Text>
              ) : null}
            </View>
            <View style={[styles.cell, { flex: COLUMNS[1].flex }]}>
              <Text variant="caption">{SAMPLE_KIND_LABELS[sample.kind]}</Text>
            </View>
            <View style={[styles.cell, { flex: COLUMNS[2].flex }]}>
              <Text variant="caption" numberOfLines={2}>
                {sample.material}
              </Text>
            </View>
            <View style={[styles.cell, { flex: COLUMNS[3].flex }]}>
              <SampleStatusPill status={sample.status} />
            </View>
            <View style={[styles.cell, { flex: COLUMNS[4].flex }]}>
              <Text variant="caption" tone="muted">
                {formatDate(sample.createdAt)}
              </Text>
            </View>
          </View>
        )}
      </Pressable>
    </Link>
  );
}

/** Tight cells: the table shares the screen with filters and the open record. */
const CELL_PADDING = space.xs + space.xxs;

const styles = StyleSheet.create({
  table: { borderWidth: sizes.hairline, borderRadius: radii.md, overflow: 'hidden' },
  row: { flexDirection: 'row', alignItems: 'center' },
  headerRow: { minHeight: sizes.touchTarget },
  header: {
    minHeight: sizes.touchTarget,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xxs,
    paddingHorizontal: CELL_PADDING,
  },
  headerText: { fontFamily: fontFaces.sansSemiBold },
  rowTarget: { minHeight: sizes.touchTarget },
  bodyRow: { minHeight: sizes.touchTarget, borderTopWidth: sizes.hairline, paddingVertical: space.xs },
  cell: { paddingHorizontal: CELL_PADDING, minWidth: 0, gap: space.xxs },
});
