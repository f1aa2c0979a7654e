import { StyleSheet, View } from 'react-native';
import {
  COMMON_MATERIALS,
  EDITABLE_STATUSES,
  SAMPLE_KIND_LABELS,
  SAMPLE_KINDS,
  SAMPLE_STATUS_LABELS,
  type SampleKind,
} from '@/shared/samples';
import { MATERIAL_MAX_LENGTH, SAMPLE_NAME_MAX_LENGTH, SAMPLE_NOTE_MAX_LENGTH } from '@/shared/schemas/sample';
import { space } from '@/components/theme';
import { ChoiceChips } from '@/components/ui/choice-chips';
import type { Choice } from '@/components/ui/choice-group';
import { DetailRow } from '@/components/ui/detail-row';
import type { PathErrors } from '@/components/ui/field-errors';
import { Heading } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { fieldLabelWithUnit, PROPERTY_FIELDS, SUBSTRATE_CHOICES, type PropertyField } from './property-fields';
import type { EditableStatus, SampleFormValues } from './sample-form-values';

const KIND_CHOICES: readonly Choice<SampleKind>[] = SAMPLE_KINDS.map((value) => ({ value, label: SAMPLE_KIND_LABELS[value] }));
const MATERIAL_CHOICES: readonly Choice<string>[] = COMMON_MATERIALS.map((value) => ({ value, label: value }));
const STATUS_CHOICES: readonly Choice<EditableStatus>[] = EDITABLE_STATUSES.map((value) => ({
  value,
  label: SAMPLE_STATUS_LABELS[value],
}));

/** Keys (dotted paths) of the messages this form shows beside a field, for a given kind. */
export function sampleFieldKeys(kind: SampleKind | null): string[] {
  return [
    'kind',
    'material',
    'name',
    'note',
    'status',
    ...(kind ? PROPERTY_FIELDS[kind].map((field) => `properties.${field.name}`) : []),
  ];
}

export interface SampleFieldsProps {
  mode: 'create' | 'edit';
  values: SampleFormValues;
  onChange: (values: SampleFormValues) => void;
  errors: PathErrors;
}

/** The inputs of a sample record: kind, material, name, status (edits only), the kind's facts and a note. */
export function SampleFields({ mode, values, onChange, errors }: SampleFieldsProps) {
  const set = <K extends keyof SampleFormValues>(name: K, value: SampleFormValues[K]) => onChange({ ...values, [name]: value });
  const fields = values.kind ? PROPERTY_FIELDS[values.kind] : [];
  const quickMaterial = COMMON_MATERIALS.find((material) => material === values.material.trim()) ?? null;

  return (
    <View style={styles.fields}>
      {mode === 'create' ? (
        <ChoiceChips
          label="Kind"
          choices={KIND_CHOICES}
          value={values.kind}
          onChange={(kind) => set('kind', kind)}
          errors={errors.kind}
          testID="sample-kind"
        />
      ) : (
        <DetailRow label="Kind">{values.kind ? SAMPLE_KIND_LABELS[values.kind] : '—'}</DetailRow>
      )}

      <View style={styles.material}>
        <TextField
          label="Material"
          hint="Tap a common one or type any other."
          value={values.material}
          onChangeText={(material) => set('material', material)}
          errors={errors.material}
          maxLength={MATERIAL_MAX_LENGTH}
          autoCapitalize="none"
          autoCorrect={false}
          autoComplete="off"
          testID="sample-material"
        />
        <ChoiceChips
          label="Common materials"
          hideLabel
          choices={MATERIAL_CHOICES}
          value={quickMaterial}
          onChange={(material) => set('material', material)}
          testID="sample-material-quick"
        />
      </View>

      <TextField
        label="Name (optional)"
        hint="Words people at the bench recognise it by."
        value={values.name}
        onChangeText={(name) => set('name', name)}
        errors={errors.name}
        maxLength={SAMPLE_NAME_MAX_LENGTH}
        autoComplete="off"
        testID="sample-name"
      />

      {mode === 'edit' ? (
        <ChoiceChips
          label="Status"
          choices={STATUS_CHOICES}
          value={values.status}
          onChange={(status) => set('status', status)}
          errors={errors.status}
          testID="sample-status"
        />
      ) : null}

      {fields.length ? (
        <View style={styles.properties} testID="sample-property-fields">
          <Heading level={3}>{values.kind ? `${SAMPLE_KIND_LABELS[values.kind]} details (optional)` : 'Details'}</Heading>
          {fields.map((field) => (
            <PropertyInput
              key={field.name}
              field={field}
              value={values.properties[field.name] ?? ''}
              onChange={(text) => set('properties', { ...values.properties, [field.name]: text })}
              errors={errors[`properties.${field.name}`]}
            />
          ))}
        </View>
      ) : null}

      <TextField
        label="Note (optional)"
        value={values.note}
        onChangeText={(note) => set('note', note)}
        errors={errors.note}
        maxLength={SAMPLE_NOTE_MAX_LENGTH}
        multiline
        numberOfLines={3}
        testID="sample-note"
      />
    </View>
  );
}

interface PropertyInputProps {
  field: PropertyField;
  value: string;
  onChange: (text: string) => void;
  errors?: readonly string[];
}

function PropertyInput({ field, value, onChange, errors }: PropertyInputProps) {
  if (field.control === 'substrate') {
    return (
      <ChoiceChips
        label={field.label}
        choices={SUBSTRATE_CHOICES}
        value={SUBSTRATE_CHOICES.find((choice) => choice.value === value)?.value ?? null}
        onChange={(substrate) => onChange(substrate === value ? '' : substrate)}
        errors={errors}
        testID={`sample-property-${field.name}`}
      />
    );
  }
  const numeric = field.control === 'number';
  return (
    <TextField
      label={fieldLabelWithUnit(field)}
      value={value}
      onChangeText={onChange}
      errors={errors}
      inputMode={numeric ? 'decimal' : 'text'}
      keyboardType={numeric ? 'decimal-pad' : 'default'}
      autoComplete="off"
      testID={`sample-property-${field.name}`}
    />
  );
}

const styles = StyleSheet.create({
  fields: { gap: space.xl },
  material: { gap: space.sm },
  properties: { gap: space.lg },
});
