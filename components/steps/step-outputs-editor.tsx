import { StyleSheet, View } from 'react-native';
import { SAMPLE_KIND_LABELS, SAMPLE_KINDS, type SampleKind } from '@/shared/samples';
import { MATERIAL_MAX_LENGTH } from '@/shared/schemas/sample';
import { STEP_OUTPUT_COUNT_MAX } from '@/shared/schemas/step';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { ChoiceChips } from '@/components/ui/choice-chips';
import type { Choice } from '@/components/ui/choice-group';
import type { PathErrors } from '@/components/ui/field-errors';
import { Heading, Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { errorsUnder, type StepOutputRow } from './step-form-values';

const KIND_CHOICES: readonly Choice<SampleKind>[] = SAMPLE_KINDS.map((value) => ({ value, label: SAMPLE_KIND_LABELS[value] }));

export interface StepOutputsEditorProps {
  rows: StepOutputRow[];
  onChange: (rows: StepOutputRow[]) => void;
  /** Kind of a newly added row. */
  usualKind: SampleKind | null;
  errors: PathErrors;
}

/** The new samples a step made: a kind and how many of it, each getting its own code. */
export function StepOutputsEditor({ rows, onChange, usualKind, errors }: StepOutputsEditorProps) {
  const { colors } = useTheme();
  const update = (row: StepOutputRow, patch: Partial<StepOutputRow>) =>
    onChange(rows.map((other) => (other.key === row.key ? { ...other, ...patch } : other)));
  const nextKey = rows.reduce((max, row) => Math.max(max, row.key), 0) + 1;

  return (
    <View style={styles.editor}>
      {rows.map((row, index) => (
        <View
          key={row.key}
          style={[styles.row, { borderColor: colors.outline, backgroundColor: colors.surface }]}
          testID={`step-output-${index}`}
        >
          <View style={styles.rowHeader}>
            <Heading level={3}>{`Output ${index + 1}`}</Heading>
            <Button
              title="Remove"
              variant="quiet"
              icon="close"
              onPress={() => onChange(rows.filter((other) => other.key !== row.key))}
              testID={`step-output-${index}-remove`}
            />
          </View>
          <ChoiceChips
            label="Kind"
            choices={KIND_CHOICES}
            value={row.kind}
            onChange={(kind) => update(row, { kind })}
            errors={errorsUnder(errors, `outputs.${index}.kind`)}
            testID={`step-output-${index}-kind`}
          />
          <View style={styles.pair}>
            <View style={styles.count}>
              <TextField
                label="How many"
                value={row.count}
                onChangeText={(count) => update(row, { count })}
                errors={errorsUnder(errors, `outputs.${index}.count`)}
                inputMode="numeric"
                keyboardType="number-pad"
                maxLength={String(STEP_OUTPUT_COUNT_MAX).length}
                testID={`step-output-${index}-count`}
              />
            </View>
            <View style={styles.material}>
              <TextField
                label="Material (optional)"
                hint="Empty: the material the inputs share."
                value={row.material}
                onChangeText={(material) => update(row, { material })}
                errors={errorsUnder(errors, `outputs.${index}.material`)}
                maxLength={MATERIAL_MAX_LENGTH}
                autoCapitalize="none"
                autoCorrect={false}
                autoComplete="off"
                testID={`step-output-${index}-material`}
              />
            </View>
          </View>
          {(errors[`outputs.${index}`] ?? []).map((message) => (
            <Text key={message} variant="caption" tone="danger">
              {message}
            </Text>
          ))}
        </View>
      ))}
      {(errors.outputs ?? []).map((message) => (
        <Text key={message} variant="caption" tone="danger">
          {message}
        </Text>
      ))}
      <Button
        title={rows.length ? 'Add another output' : 'Add an output'}
        variant="secondary"
        icon="add"
        onPress={() => onChange([...rows, { key: nextKey, kind: usualKind, count: '1', material: '' }])}
        testID="step-add-output"
      />
    </View>
  );
}

const styles = StyleSheet.create({
  editor: { gap: space.md },
  row: { borderWidth: sizes.hairline, borderRadius: radii.md, padding: space.lg, gap: space.lg },
  rowHeader: { flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: space.sm },
  pair: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  count: { flexBasis: sizes.touchTarget * 2, flexGrow: 1 },
  material: { flexBasis: sizes.touchTarget * 4, flexGrow: 3 },
});
