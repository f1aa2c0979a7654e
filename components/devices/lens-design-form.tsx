import { StyleSheet, View } from 'react-native';
import { space } from '@/components/theme';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { TextField } from '@/components/ui/text-field';
import {
  LENGTH_UNIT_LABELS,
  type LengthUnit,
  type LensFormErrors,
  type LensFormValues,
  type LensSizeBy,
} from './lens-form-values';

const UNIT_CHOICES = (['um', 'mm'] as const).map((value) => ({ value, label: LENGTH_UNIT_LABELS[value] }));
const SIZE_BY_CHOICES: { value: LensSizeBy; label: string }[] = [
  { value: 'aperture', label: 'Aperture diameter' },
  { value: 'zones', label: 'Number of zones' },
];
const ETCHED_CHOICES: { value: LensFormValues['etchedZones']; label: string }[] = [
  { value: 'odd', label: 'Odd zones (centre etched)' },
  { value: 'even', label: 'Even zones (centre kept)' },
];

export interface LensDesignFormProps {
  values: LensFormValues;
  errors: LensFormErrors;
  onChange: (patch: Partial<LensFormValues>) => void;
  editable: boolean;
}

/** The designer's inputs; every change recomputes the lens at once, so there is no submit here. */
export function LensDesignForm({ values, errors, onChange, editable }: LensDesignFormProps) {
  return (
    <View style={styles.stack} testID="lens-form">
      <TextField
        label="Design wavelength (nm)"
        hint="The light the lens is made for, in nanometres, e.g. 632.8 for a helium–neon laser."
        placeholder="632.8"
        value={values.wavelengthNm}
        onChangeText={(text) => onChange({ wavelengthNm: text })}
        errors={errors.wavelengthNm}
        inputMode="decimal"
        keyboardType="decimal-pad"
        editable={editable}
        testID="lens-wavelength"
      />
      <LengthField
        label="Focal length"
        hint="First-order focus, measured from the lens."
        value={values.focalLength}
        unit={values.focalUnit}
        onChange={(text) => onChange({ focalLength: text })}
        onUnit={(unit) => onChange({ focalUnit: unit })}
        errors={errors.focalLength}
        editable={editable}
        testID="lens-focal"
      />
      <ChoiceChips
        label="Size the lens by"
        choices={SIZE_BY_CHOICES}
        value={values.sizeBy}
        onChange={(sizeBy) => onChange({ sizeBy })}
        disabled={!editable}
        testID="lens-size-by"
      />
      {values.sizeBy === 'aperture' ? (
        <LengthField
          label="Aperture diameter"
          hint="The room on the flake; Flakeline fits as many whole zones as it holds."
          value={values.aperture}
          unit={values.apertureUnit}
          onChange={(text) => onChange({ aperture: text })}
          onUnit={(unit) => onChange({ apertureUnit: unit })}
          errors={errors.aperture}
          editable={editable}
          testID="lens-aperture"
        />
      ) : (
        <TextField
          label="Number of zones"
          hint="Zones from the centre, the central disc being zone 1."
          value={values.zoneCount}
          onChangeText={(text) => onChange({ zoneCount: text })}
          errors={errors.zoneCount}
          inputMode="numeric"
          keyboardType="number-pad"
          editable={editable}
          testID="lens-zone-count-input"
        />
      )}
      <ChoiceChips
        label="Zones the etch removes"
        choices={ETCHED_CHOICES}
        value={values.etchedZones}
        onChange={(etchedZones) => onChange({ etchedZones })}
        disabled={!editable}
        testID="lens-etched"
      />
    </View>
  );
}

interface LengthFieldProps {
  label: string;
  hint: string;
  value: string;
  unit: LengthUnit;
  onChange: (text: string) => void;
  onUnit: (unit: LengthUnit) => void;
  errors?: readonly string[];
  editable: boolean;
  testID: string;
}

/** A length with its unit chosen beside it, so "1" is never ambiguous. The label names the unit too. */
function LengthField({ label, hint, value, unit, onChange, onUnit, errors, editable, testID }: LengthFieldProps) {
  return (
    <View style={styles.length}>
      <View style={styles.lengthInput}>
        <TextField
          label={`${label} (${LENGTH_UNIT_LABELS[unit]})`}
          hint={hint}
          value={value}
          onChangeText={onChange}
          errors={errors}
          inputMode="decimal"
          keyboardType="decimal-pad"
          editable={editable}
          testID={testID}
        />
      </View>
      <ChoiceChips
        label={`Unit of the ${label.toLowerCase()}`}
        hideLabel
        choices={UNIT_CHOICES}
        value={unit}
        onChange={onUnit}
        disabled={!editable}
        testID={`${testID}-unit`}
      />
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  length: { gap: space.sm },
  lengthInput: { alignSelf: 'stretch' },
});
