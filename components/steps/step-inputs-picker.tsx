import Ionicons from '@expo/vector-icons/Ionicons';
import { useState } from 'react';
import { ActivityIndicator, Pressable, StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS } from '@/shared/samples';
import type { SampleListRow, SampleSummary } from '@/shared/schemas/sample';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { SampleStatusPill } from '@/components/samples/sample-status-pill';
import { Button } from '@/components/ui/button';
import { CheckToggle } from '@/components/ui/check-toggle';
import type { PathErrors } from '@/components/ui/field-errors';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { useDebouncedValue } from '@/components/ui/use-debounced-value';
import { describeError } from '@/hooks/api-client';
import { SEARCH_MIN_LENGTH, useSampleQuery, useSampleSearchQuery } from '@/hooks/use-samples';
import { errorsUnder, type StepInputItem } from './step-form-values';

/** Samples in these states cannot be used in a step; the server refuses them too. */
const UNUSABLE = new Set<SampleSummary['status']>(['used_up', 'discarded', 'retired', 'missing']);

export interface StepInputsPickerProps {
  items: StepInputItem[];
  onChange: (items: StepInputItem[]) => void;
  errors: PathErrors;
}

/** The samples a step used: found by code or name, each with a "used up" toggle. */
export function StepInputsPicker({ items, onChange, errors }: StepInputsPickerProps) {
  const [text, setText] = useState('');
  const settled = useDebouncedValue(text);
  const search = useSampleSearchQuery(settled);
  const added = new Set(items.map((item) => item.code));

  const add = (sample: SampleListRow) => {
    onChange([...items, { code: sample.code, consumed: false, summary: sample }]);
    setText('');
  };

  return (
    <View style={styles.picker}>
      {items.length ? (
        <View style={styles.items} testID="step-inputs">
          {items.map((item, index) => (
            <InputItem
              key={item.code}
              item={item}
              errors={errorsUnder(errors, `inputs.${index}`)}
              onToggle={(consumed) => onChange(items.map((other) => (other === item ? { ...other, consumed } : other)))}
              onRemove={() => onChange(items.filter((other) => other !== item))}
            />
          ))}
        </View>
      ) : null}
      {(errors.inputs ?? []).map((message) => (
        <Text key={message} variant="caption" tone="danger">
          {message}
        </Text>
      ))}
      <TextField
        label="Find a sample to add"
        hint="Type part of its code or name."
        value={text}
        onChangeText={setText}
        autoCapitalize="characters"
        autoCorrect={false}
        autoComplete="off"
        inputMode="search"
        testID="step-input-search"
      />
      <SearchResults text={settled} query={search} added={added} onAdd={add} />
    </View>
  );
}

interface SearchResultsProps {
  text: string;
  query: ReturnType<typeof useSampleSearchQuery>;
  added: Set<string>;
  onAdd: (sample: SampleListRow) => void;
}

function SearchResults({ text, query, added, onAdd }: SearchResultsProps) {
  const { colors } = useTheme();
  if (text.trim().length < SEARCH_MIN_LENGTH) return null;
  if (query.isError) return <Text tone="danger">{describeError(query.error)}</Text>;
  if (!query.data) {
    return (
      <View style={styles.row}>
        <ActivityIndicator color={colors.primary} />
        <Text tone="muted">Searching…</Text>
      </View>
    );
  }
  if (query.data.length === 0) return <Text tone="muted">{`No sample matches “${text.trim()}”.`}</Text>;
  return (
    <View style={styles.results} role="list" accessibilityLabel="Matching samples" testID="step-input-results">
      {query.data.map((sample) => {
        const isAdded = added.has(sample.code);
        const unusable = UNUSABLE.has(sample.status);
        return (
          <Pressable
            key={sample.code}
            role="listitem"
            accessibilityRole="button"
            accessibilityLabel={`Add ${sample.code}`}
            accessibilityState={{ disabled: isAdded || unusable }}
            disabled={isAdded || unusable}
            onPress={() => onAdd(sample)}
            testID={`step-input-result-${sample.code}`}
            style={({ pressed }) => [
              styles.result,
              { borderColor: colors.hairline, backgroundColor: pressed ? colors.sunken : colors.surface },
              (isAdded || unusable) && styles.dimmed,
            ]}
          >
            <View style={styles.resultText}>
              <Text variant="code" tone="primary">
                {sample.code}
              </Text>
              <Text variant="caption" tone="muted" numberOfLines={1}>
                {[SAMPLE_KIND_LABELS[sample.kind], sample.material, sample.name].filter(Boolean).join(' · ')}
              </Text>
            </View>
            {unusable ? (
              <SampleStatusPill status={sample.status} />
            ) : (
              <View style={styles.row}>
                <Ionicons name={isAdded ? 'checkmark' : 'add'} size={sizes.icon} color={colors.primary} />
                <Text variant="label" tone="primary">
                  {isAdded ? 'Added' : 'Add'}
                </Text>
              </View>
            )}
          </Pressable>
        );
      })}
    </View>
  );
}

interface InputItemProps {
  item: StepInputItem;
  errors: string[];
  onToggle: (consumed: boolean) => void;
  onRemove: () => void;
}

function InputItem({ item, errors, onToggle, onRemove }: InputItemProps) {
  const { colors } = useTheme();
  // Added from a link ("Log a step from this sample"): look the sample up to show what it is.
  const lookup = useSampleQuery(item.code, { enabled: item.summary === null });
  const summary = item.summary ?? lookup.data ?? null;
  return (
    <View
      style={[styles.item, { borderColor: errors.length ? colors.danger : colors.outline, backgroundColor: colors.surface }]}
      testID={`step-input-${item.code}`}
    >
      <View style={styles.itemTop}>
        <View style={styles.resultText}>
          <Text variant="code" tone="primary">
            {summary?.code ?? item.code}
          </Text>
          <Text variant="caption" tone="muted" numberOfLines={1}>
            {summary
              ? [SAMPLE_KIND_LABELS[summary.kind], summary.material, summary.name].filter(Boolean).join(' · ')
              : lookup.isError
                ? describeError(lookup.error)
                : 'Looking it up…'}
          </Text>
        </View>
        <Button title="Remove" variant="quiet" icon="close" onPress={onRemove} testID={`step-input-remove-${item.code}`} />
      </View>
      <CheckToggle
        label="Used up by this step"
        checked={item.consumed}
        onChange={onToggle}
        testID={`step-input-consumed-${item.code}`}
      />
      {errors.map((message) => (
        <Text key={message} variant="caption" tone="danger">
          {message}
        </Text>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  picker: { gap: space.md },
  items: { gap: space.sm },
  item: { borderWidth: sizes.hairline, borderRadius: radii.md, padding: space.md, gap: space.xs },
  itemTop: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
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
  resultText: { flex: 1, minWidth: 0, gap: space.xxs },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  dimmed: { opacity: 0.6 },
});
