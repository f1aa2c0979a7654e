import { StyleSheet, View } from 'react-native';
import type { StepType } from '@/shared/steps';
import { space } from '@/components/theme';
import { ChoiceChips } from '@/components/ui/choice-chips';
import type { PathErrors } from '@/components/ui/field-errors';
import { TextField } from '@/components/ui/text-field';
import { fieldLabel, isOptionalParameter, stepFields, type StepField } from './step-fields';
import { errorsUnder } from './step-form-values';

export interface StepParameterFieldsProps {
  type: StepType;
  values: Record<string, string>;
  onChange: (name: string, text: string) => void;
  errors: PathErrors;
}

/** The typed parameters of one step type, drawn from the field table (one form for every type). */
export function StepParameterFields({ type, values, onChange, errors }: StepParameterFieldsProps) {
  return (
    <View style={styles.fields} testID={`step-parameters-${type}`}>
      {stepFields(type).map((field) => (
        <ParameterInput
          key={field.name}
          field={field}
          optional={isOptionalParameter(type, field.name)}
          value={values[field.name] ?? ''}
          onChange={(text) => onChange(field.name, text)}
          errors={errorsUnder(errors, `parameters.${field.name}`)}
        />
      ))}
    </View>
  );
}

interface ParameterInputProps {
  field: StepField;
  optional: boolean;
  value: string;
  onChange: (text: string) => void;
  errors: string[];
}

function ParameterInput({ field, optional, value, onChange, errors }: ParameterInputProps) {
  const label = `${fieldLabel(field)}${optional ? ' (optional)' : ''}`;
  const testID = `step-param-${field.name}`;

  if (field.control === 'choice') {
    const choices = field.choices ?? [];
    return (
      <ChoiceChips
        label={label}
        choices={choices}
        value={choices.some((choice) => choice.value === value) ? value : null}
        // An optional choice can be taken back by tapping it again.
        onChange={(next) => onChange(optional && next === value ? '' : next)}
        errors={errors}
        testID={testID}
      />
    );
  }

  const numeric = field.control === 'number' || field.control === 'integer';
  return (
    <TextField
      label={label}
      hint={field.hint}
      value={value}
      onChangeText={onChange}
      errors={errors}
      inputMode={field.control === 'integer' ? 'numeric' : numeric ? 'decimal' : 'text'}
      keyboardType={
        field.control === 'integer'
          ? 'number-pad'
          : numeric
            ? 'decimal-pad'
            : field.control === 'numberList'
              ? 'numbers-and-punctuation'
              : 'default'
      }
      autoComplete="off"
      autoCorrect={false}
      testID={testID}
    />
  );
}

const styles = StyleSheet.create({
  fields: { gap: space.xl },
});
