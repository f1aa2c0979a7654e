import { useState } from 'react';
import { ActivityIndicator, Pressable, StyleSheet, View } from 'react-native';
import type { SampleListRow } from '@/shared/schemas/sample';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { SampleStatusPill } from '@/components/samples/sample-status-pill';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { useDebouncedValue } from '@/components/ui/use-debounced-value';
import { describeError } from '@/hooks/api-client';
import { useKindSearchQuery } from '@/hooks/use-bench';

/** Samples in these states cannot be used in a step; the server refuses them too. */
const UNUSABLE = new Set<SampleListRow['status']>(['used_up', 'discarded', 'retired', 'missing']);

export interface KindPickerProps {
  kind: string;
  label: string;
  onPick: (sample: SampleListRow) => void;
  /** Codes already chosen, shown as such. */
  chosen: readonly string[];
  testID: string;
}

/** Recent samples of one kind, narrowed by what is typed; one tap picks one. */
export function KindPicker({ kind, label, onPick, chosen, testID }: KindPickerProps) {
  const { colors } = useTheme();
  const [text, setText] = useState('');
  const settled = useDebouncedValue(text);
  const search = useKindSearchQuery(kind, settled);
  return (
    <View style={styles.picker}>
      <TextField
        label={label}
        hint="Type part of the code, material or name; the newest are listed first."
        value={text}
        onChangeText={setText}
        autoCorrect={false}
        autoComplete="off"
        inputMode="search"
        testID={`${testID}-search`}
      />
      {search.isError ? (
        <Text tone="danger">{describeError(search.error)}</Text>
      ) : !search.data ? (
        <View style={styles.row}>
          <ActivityIndicator color={colors.primary} />
          <Text tone="muted">Looking…</Text>
        </View>
      ) : search.data.length === 0 ? (
        <Text tone="muted">{settled.trim() ? `Nothing matches “${settled.trim()}”.` : 'None registered yet.'}</Text>
      ) : (
        <View style={styles.results} role="list" testID={`${testID}-results`}>
          {search.data.map((sample) => {
            const unusable = UNUSABLE.has(sample.status);
            const isChosen = chosen.includes(sample.code);
            return (
              <Pressable
                key={sample.code}
                role="listitem"
                accessibilityRole="button"
                accessibilityLabel={`Use ${sample.code}`}
                accessibilityState={{ disabled: unusable, selected: isChosen }}
                disabled={unusable}
                onPress={() => onPick(sample)}
                testID={`${testID}-result-${sample.code}`}
                style={({ pressed }) => [
                  styles.result,
                  {
                    borderColor: isChosen ? colors.primary : colors.hairline,
                    backgroundColor: isChosen ? colors.primarySoft : pressed ? colors.sunken : colors.surface,
                  },
                  unusable && styles.dimmed,
                ]}
              >
                <View style={styles.text}>
                  <Text variant="code" tone="primary">
                    {sample.code}
                  </Text>
                  <Text variant="caption" tone="muted" numberOfLines={1}>
                    {[sample.material, sample.name].filter(Boolean).join(' · ')}
                  </Text>
                </View>
                {unusable ? <SampleStatusPill status={sample.status} /> : null}
              </Pressable>
            );
          })}
        </View>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  picker: { gap: space.sm },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  results: { gap: space.xs },
  result: {
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
  dimmed: { opacity: 0.6 },
});
