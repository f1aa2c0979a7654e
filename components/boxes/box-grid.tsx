import { useState } from 'react';
import { Pressable, ScrollView, StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS } from '@/shared/samples';
import type { Box } from '@/shared/schemas/storage';
import { axisLabel } from '@/shared/slots';
import { fontFaces, radii, sizes, space, useTheme } from '@/components/theme';
import { Text } from '@/components/ui/text';

export type BoxSlot = Box['slots'][number];

/**
 * Cells are square and never smaller than this: a gloved finger needs 48 px (sizes.touchTarget),
 * and the code body of a sample (seven monospaced characters) needs about 70.
 */
const MIN_CELL = 76;
/** Wide screens stop growing cells here, so a small box does not turn into a few huge tiles. */
const MAX_CELL = 112;
/** Below this a cell shows the code without its kind prefix (the prefix alone takes 25 px). */
const FULL_CODE_CELL = 100;
const GAP = space.xs;
const ROW_HEADER = space.xl;

export interface BoxGridProps {
  box: Box;
  selectedSlot: string | null;
  onSelect: (slot: BoxSlot) => void;
  /** browse: any slot can be opened; pick: only free slots can be chosen (full ones are dimmed). */
  mode?: 'browse' | 'pick';
  /** Each cell's testID is `<prefix>-<slot>`. */
  testIDPrefix?: string;
}

/** The code as it fits a cell: whole when there is room, otherwise without its two-letter kind prefix. */
function cellCode(code: string, cell: number): string {
  if (cell >= FULL_CODE_CELL) return code;
  const dash = code.indexOf('-');
  return dash >= 0 ? code.slice(dash + 1) : code;
}

/**
 * A box as it looks from above: rows × columns of square cells with the row and column names
 * along the edges. Cells grow to fill the width up to a limit; a box wider than the screen
 * scrolls sideways rather than shrinking its cells below a fingertip.
 */
export function BoxGrid({ box, selectedSlot, onSelect, mode = 'browse', testIDPrefix = 'slot' }: BoxGridProps) {
  const { colors } = useTheme();
  const [width, setWidth] = useState(0);
  const fitted = Math.floor((width - ROW_HEADER - GAP * box.columns) / box.columns);
  const cell = Math.max(MIN_CELL, Math.min(MAX_CELL, Number.isFinite(fitted) ? fitted : MIN_CELL));

  const rows: BoxSlot[][] = [];
  for (const slot of box.slots) (rows[slot.row - 1] ??= []).push(slot);

  return (
    <View onLayout={(event) => setWidth(event.nativeEvent.layout.width)} testID={`${testIDPrefix}-grid`}>
      <ScrollView horizontal showsHorizontalScrollIndicator contentContainerStyle={styles.scroll}>
        <View style={styles.grid} accessibilityLabel={`Slots of ${box.name}`}>
          <View style={styles.line}>
            <View style={{ width: ROW_HEADER }} />
            {Array.from({ length: box.columns }, (_, index) => (
              <View key={index} style={[styles.columnHeader, { width: cell }]}>
                <Text variant="caption" tone="muted" style={styles.axis}>
                  {axisLabel(index + 1, box.columnLabels)}
                </Text>
              </View>
            ))}
          </View>
          {rows.map((slots, rowIndex) => (
            <View key={rowIndex} style={styles.line}>
              <View style={[styles.rowHeader, { width: ROW_HEADER, height: cell }]}>
                <Text variant="caption" tone="muted" style={styles.axis}>
                  {axisLabel(rowIndex + 1, box.rowLabels)}
                </Text>
              </View>
              {slots.map((slot) => {
                const sample = slot.sample;
                const selected = slot.slot === selectedSlot;
                const unavailable = mode === 'pick' && sample !== null;
                return (
                  <Pressable
                    key={slot.slot}
                    accessibilityRole="button"
                    accessibilityLabel={
                      sample
                        ? `Slot ${slot.slot}, ${sample.code}, ${SAMPLE_KIND_LABELS[sample.kind]}, ${sample.material}`
                        : `Slot ${slot.slot}, free`
                    }
                    accessibilityState={{ selected, disabled: unavailable }}
                    disabled={unavailable}
                    onPress={() => onSelect(slot)}
                    testID={`${testIDPrefix}-${slot.slot}`}
                    style={({ pressed }) => [
                      styles.cell,
                      { width: cell, height: cell },
                      sample
                        ? { backgroundColor: pressed ? colors.hairline : colors.primarySoft, borderColor: colors.primarySoft }
                        : {
                            backgroundColor: pressed ? colors.sunken : colors.surface,
                            borderColor: colors.outline,
                            borderStyle: 'dashed',
                          },
                      selected && { borderColor: colors.primary, borderWidth: sizes.focusRing, borderStyle: 'solid' },
                      unavailable && styles.dimmed,
                    ]}
                  >
                    <Text variant="caption" style={[styles.slotName, { color: sample ? colors.onPrimarySoft : colors.inkMuted }]}>
                      {slot.slot}
                    </Text>
                    {sample ? (
                      <>
                        <Text variant="code" numberOfLines={1} style={{ color: colors.onPrimarySoft }}>
                          {cellCode(sample.code, cell)}
                        </Text>
                        <Text variant="caption" numberOfLines={1} style={{ color: colors.onPrimarySoft }}>
                          {sample.material}
                        </Text>
                      </>
                    ) : (
                      <Text variant="caption" tone="muted">
                        Free
                      </Text>
                    )}
                  </Pressable>
                );
              })}
            </View>
          ))}
        </View>
      </ScrollView>
    </View>
  );
}

const styles = StyleSheet.create({
  scroll: { flexGrow: 1 },
  grid: { gap: GAP, paddingBottom: space.xs },
  line: { flexDirection: 'row', gap: GAP },
  columnHeader: { alignItems: 'center', paddingBottom: space.xxs },
  rowHeader: { alignItems: 'center', justifyContent: 'center' },
  axis: { fontFamily: fontFaces.sansSemiBold },
  cell: {
    borderRadius: radii.md,
    borderWidth: sizes.outline,
    padding: space.xs + space.xxs,
    justifyContent: 'space-between',
    overflow: 'hidden',
  },
  slotName: { fontFamily: fontFaces.sansSemiBold },
  dimmed: { opacity: 0.45 },
});
