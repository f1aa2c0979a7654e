import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { MEASUREMENT_AXES, MEASUREMENT_KINDS, MEASUREMENT_ROWS_MAX, type MeasurementKind } from '@/shared/schemas/device';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { errorsFromRequest, partitionErrors, type PathErrors } from '@/components/ui/field-errors';
import { FormProblem } from '@/components/ui/form-problem';
import { Heading, Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { useAddMeasurementMutation } from '@/hooks/use-devices';
import { BLANK_ROW, blankMeasurement, parseMeasurementForm, type MeasurementFormValues } from './measurement-form-values';

const KIND_SHORT: Record<MeasurementKind, string> = {
  focal_length_vs_wavelength: 'Focal length vs wavelength',
  focal_length_vs_gate_voltage: 'Focal length vs gate voltage',
  efficiency_vs_gate_voltage: 'Efficiency vs gate voltage',
};
const KIND_CHOICES = MEASUREMENT_KINDS.map((value) => ({ value, label: KIND_SHORT[value] }));

/** Rows of one measurement as typed on the bench: x and y in the units the headings give. */
export function MeasurementForm({ code, onDone }: { code: string; onDone: () => void }) {
  const add = useAddMeasurementMutation(code);
  const [values, setValues] = useState<MeasurementFormValues>(() => blankMeasurement(new Date()));
  const [errors, setErrors] = useState<PathErrors>({});
  const axes = MEASUREMENT_AXES[values.kind];

  const change = (patch: Partial<MeasurementFormValues>) => {
    setValues((current) => ({ ...current, ...patch }));
    setErrors({});
  };
  const setRow = (index: number, patch: Partial<MeasurementFormValues['rows'][number]>) =>
    change({ rows: values.rows.map((row, at) => (at === index ? { ...row, ...patch } : row)) });

  const save = () => {
    const parsed = parseMeasurementForm(values);
    if (!parsed.ok) {
      setErrors(parsed.errors);
      return;
    }
    add.mutate(parsed.input, { onSuccess: onDone, onError: (error) => setErrors(errorsFromRequest(error)) });
  };

  const { rest } = partitionErrors(errors, (key) => /^rows\.\d+\.(x|y)$/.test(key) || key === 'measuredAt');

  return (
    <View style={styles.stack} testID="measurement-form">
      <Heading level={3}>Add a measurement</Heading>
      <ChoiceChips
        label="What was measured"
        choices={KIND_CHOICES}
        value={values.kind}
        onChange={(kind) => change({ kind })}
        testID="measurement-kind"
      />
      <Text variant="caption" tone="muted">
        {`One row per ${axes.x.label.toLowerCase()}: ${axes.x.label.toLowerCase()} in ${axes.x.unit}, ${axes.y.label.toLowerCase()} in ${axes.y.unit}.`}
      </Text>
      {values.rows.map((row, index) => (
        <View key={index} style={styles.row} testID={`measurement-row-${index}`}>
          <View style={styles.cell}>
            <TextField
              label={`${axes.x.label} (${axes.x.unit})`}
              value={row.x}
              onChangeText={(text) => setRow(index, { x: text })}
              errors={errors[`rows.${index}.x`]}
              inputMode="decimal"
              keyboardType="numbers-and-punctuation"
              testID={`measurement-row-${index}-x`}
            />
          </View>
          <View style={styles.cell}>
            <TextField
              label={`${axes.y.label} (${axes.y.unit})`}
              value={row.y}
              onChangeText={(text) => setRow(index, { y: text })}
              errors={errors[`rows.${index}.y`]}
              inputMode="decimal"
              keyboardType="decimal-pad"
              testID={`measurement-row-${index}-y`}
            />
          </View>
          {values.rows.length > 1 ? (
            <Button
              title="Remove"
              accessibilityLabel={`Remove row ${index + 1}`}
              variant="quiet"
              icon="close"
              onPress={() => change({ rows: values.rows.filter((_, at) => at !== index) })}
            />
          ) : null}
        </View>
      ))}
      <Button
        title="Add a row"
        icon="add"
        variant="secondary"
        disabled={values.rows.length >= MEASUREMENT_ROWS_MAX}
        onPress={() => change({ rows: [...values.rows, { ...BLANK_ROW }] })}
        testID="measurement-add-row"
      />
      <TextField
        label="Instrument (optional)"
        value={values.instrument}
        onChangeText={(instrument) => change({ instrument })}
        testID="measurement-instrument"
      />
      <View style={styles.row}>
        <View style={styles.cell}>
          <TextField
            label="Date (YYYY-MM-DD)"
            value={values.date}
            onChangeText={(date) => change({ date })}
            errors={errors.measuredAt}
            testID="measurement-date"
          />
        </View>
        <View style={styles.cell}>
          <TextField
            label="Time (HH:MM)"
            value={values.time}
            onChangeText={(time) => change({ time })}
            testID="measurement-time"
          />
        </View>
      </View>
      <TextField
        label="Note (optional)"
        value={values.note}
        onChangeText={(note) => change({ note })}
        multiline
        testID="measurement-note"
      />
      <FormProblem title="Could not save the measurement" error={add.error} formErrors={rest} />
      <View style={styles.actions}>
        <Button title="Save measurement" icon="save-outline" onPress={save} loading={add.isPending} testID="measurement-save" />
        <Button title="Cancel" variant="quiet" onPress={onDone} />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.md },
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, alignItems: 'flex-end' },
  cell: { flexGrow: 1, flexBasis: 140 },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
