import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { FLAKE_MATERIAL_IDS, FLAKE_MATERIALS } from '@/shared/optics/materials';
import type { EvidenceKind } from '@/shared/schemas/evidence';
import { space } from '@/components/theme';
import { ChoiceChips } from '@/components/ui/choice-chips';
import type { PathErrors } from '@/components/ui/field-errors';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { TextLink } from '@/components/ui/text-link';
import { useCalibrationsQuery } from '@/hooks/use-calibrations';
import { LASER_PRESETS_NM, OXIDE_PRESETS_NM, type EvidenceFormValues, type SubstrateKind } from './evidence-form-values';
import { LaserCaution } from './laser-caution';
import { formatNumber } from './number-text';

export interface MetadataFieldsProps {
  kind: EvidenceKind;
  values: EvidenceFormValues;
  errors: PathErrors;
  onChange: (patch: Partial<EvidenceFormValues>) => void;
}

const MATERIAL_CHOICES = FLAKE_MATERIAL_IDS.map((value) => ({ value, label: FLAKE_MATERIALS[value].displayName }));
const SUBSTRATE_CHOICES: { value: SubstrateKind; label: string }[] = [
  { value: 'oxide-on-silicon', label: 'Si with SiO₂' },
  { value: 'sapphire', label: 'Sapphire' },
  { value: 'quartz', label: 'Quartz' },
];
const OTHER = 'other';

/** What the researcher says about the file, field by field for its kind. */
export function EvidenceMetadataFields({ kind, values, errors, onChange }: MetadataFieldsProps) {
  return (
    <View style={styles.fields}>
      <ChoiceChips
        label="Material"
        choices={MATERIAL_CHOICES}
        value={values.material}
        onChange={(material) => onChange({ material })}
        errors={errors.material}
        testID="evidence-material"
      />
      {kind === 'micrograph' ? <MicrographFields values={values} errors={errors} onChange={onChange} /> : null}
      {kind === 'raman' || kind === 'pl' ? (
        <SpectrumFields kind={kind} values={values} errors={errors} onChange={onChange} />
      ) : null}
      {kind === 'afm' ? (
        <TextField
          label="Offset (nm, optional)"
          hint="Adsorbed water and tip settings make the first step from the substrate look taller than the layers: literature reports a few ångström (0.2–1 nm). Leave blank for Flakeline’s default; steps between layers do not include it."
          value={values.offsetNm}
          onChangeText={(offsetNm) => onChange({ offsetNm })}
          errors={errors.offsetNm}
          inputMode="decimal"
          keyboardType="decimal-pad"
          testID="evidence-offset"
        />
      ) : null}
      <TextField
        label="Note (optional)"
        value={values.note}
        onChangeText={(note) => onChange({ note })}
        errors={errors.note}
        multiline
        numberOfLines={2}
        testID="evidence-note"
      />
    </View>
  );
}

function MicrographFields({ values, errors, onChange }: Omit<MetadataFieldsProps, 'kind'>) {
  const calibrations = useCalibrationsQuery();
  const [otherChosen, setOxideOther] = useState(false);
  // A thickness filled in from the chip may be one that is not among the presets.
  const oxideOther =
    otherChosen || (values.oxideThicknessNm !== '' && !OXIDE_PRESETS_NM.some((preset) => preset === values.oxideThicknessNm));
  const calibrationChoices = [
    { value: 'none', label: 'None' },
    ...(calibrations.data ?? []).map((calibration) => ({
      value: String(calibration.id),
      label: `${calibration.microscope} · ${formatNumber(calibration.objectiveMagnification)}× · ${formatNumber(calibration.umPerPixel, 3)} µm/px`,
    })),
  ];
  const oxideChoice = oxideOther ? OTHER : values.oxideThicknessNm || null;
  return (
    <>
      <View style={styles.group}>
        <ChoiceChips
          label="Microscope and objective"
          choices={calibrationChoices}
          value={values.calibrationId === null ? 'none' : String(values.calibrationId)}
          onChange={(choice) => onChange({ calibrationId: choice === 'none' ? null : Number(choice) })}
          errors={errors.calibrationId}
          testID="evidence-calibration"
        />
        <Text variant="caption" tone="muted">
          {calibrations.isError
            ? 'The calibrations could not be loaded; the micrograph can still be added without one.'
            : 'The calibration gives micrometres per pixel, needed for flake areas and the monolayer finder.'}
        </Text>
        <TextLink href="/calibrations" testID="evidence-calibrations">
          Add or check calibrations
        </TextLink>
      </View>
      <ChoiceChips
        label="Substrate"
        choices={SUBSTRATE_CHOICES}
        value={values.substrateKind}
        onChange={(substrateKind) => onChange({ substrateKind })}
        errors={errors.substrate}
        testID="evidence-substrate"
      />
      {values.substrateKind === 'oxide-on-silicon' ? (
        <>
          <ChoiceChips
            label="Oxide thickness"
            choices={[...OXIDE_PRESETS_NM.map((value) => ({ value, label: `${value} nm` })), { value: OTHER, label: 'Other' }]}
            value={oxideChoice}
            onChange={(choice) => {
              setOxideOther(choice === OTHER);
              onChange({ oxideThicknessNm: choice === OTHER ? '' : choice });
            }}
            errors={oxideOther ? undefined : errors['substrate.oxideThicknessNm']}
            testID="evidence-oxide"
          />
          {oxideOther ? (
            <TextField
              label="Oxide thickness (nm)"
              value={values.oxideThicknessNm}
              onChangeText={(oxideThicknessNm) => onChange({ oxideThicknessNm })}
              errors={errors['substrate.oxideThicknessNm']}
              inputMode="decimal"
              keyboardType="decimal-pad"
              testID="evidence-oxide-other"
            />
          ) : null}
        </>
      ) : null}
      <ChoiceChips
        label="Illumination"
        choices={[
          { value: 'white', label: 'White light' },
          { value: 'bandpass', label: 'Band-pass filter' },
        ]}
        value={values.illumination}
        onChange={(illumination) => onChange({ illumination })}
        errors={errors.illumination}
        testID="evidence-illumination"
      />
      {values.illumination === 'bandpass' ? (
        <TextField
          label="Filter centre (nm)"
          value={values.filterCentreNm}
          onChangeText={(filterCentreNm) => onChange({ filterCentreNm })}
          errors={errors['illumination.centreNm']}
          inputMode="decimal"
          keyboardType="decimal-pad"
          testID="evidence-filter"
        />
      ) : null}
      <TextField
        label="Exposure (ms, optional)"
        value={values.exposureMs}
        onChangeText={(exposureMs) => onChange({ exposureMs })}
        errors={errors.exposureMs}
        inputMode="decimal"
        keyboardType="decimal-pad"
        testID="evidence-exposure"
      />
      <ChoiceChips
        label="Pixel values"
        choices={[
          { value: 'as-recorded', label: 'Use as recorded' },
          { value: 'srgb', label: 'Undo sRGB gamma' },
        ]}
        value={values.pixelEncoding}
        onChange={(pixelEncoding) => onChange({ pixelEncoding })}
        errors={errors.pixelEncoding}
        testID="evidence-encoding"
      />
      <Text variant="caption" tone="muted">
        Most published contrasts were read from pixel values as saved. Choose “Undo sRGB gamma” for linear-light contrast from an
        ordinary JPEG or PNG; a raw or linear TIFF from a scientific camera is already linear.
      </Text>
    </>
  );
}

function SpectrumFields({ kind, values, errors, onChange }: MetadataFieldsProps) {
  const [otherChosen, setLaserOther] = useState(false);
  const laserOther = otherChosen || (values.laserNm !== '' && !LASER_PRESETS_NM.some((preset) => preset === values.laserNm));
  return (
    <>
      <LaserCaution />
      <ChoiceChips
        label="Laser line"
        choices={[...LASER_PRESETS_NM.map((value) => ({ value, label: `${value} nm` })), { value: OTHER, label: 'Other' }]}
        value={laserOther ? OTHER : values.laserNm || null}
        onChange={(choice) => {
          setLaserOther(choice === OTHER);
          onChange({ laserNm: choice === OTHER ? '' : choice });
        }}
        errors={laserOther ? undefined : errors.laserNm}
        testID="evidence-laser"
      />
      {laserOther ? (
        <TextField
          label="Laser wavelength (nm)"
          value={values.laserNm}
          onChangeText={(laserNm) => onChange({ laserNm })}
          errors={errors.laserNm}
          inputMode="decimal"
          keyboardType="decimal-pad"
          testID="evidence-laser-other"
        />
      ) : null}
      {kind === 'pl' ? (
        <>
          <ChoiceChips
            label="First column"
            choices={[
              { value: 'nm', label: 'Wavelength (nm)' },
              { value: 'eV', label: 'Energy (eV)' },
            ]}
            value={values.xUnit}
            onChange={(xUnit) => onChange({ xUnit })}
            errors={errors.xUnit}
            testID="evidence-x-unit"
          />
          <TextField
            label="Reference peak intensity (optional)"
            hint="The PL peak height of a reference flake measured with the same laser power and exposure, for a relative intensity."
            value={values.referenceIntensity}
            onChangeText={(referenceIntensity) => onChange({ referenceIntensity })}
            errors={errors.referenceIntensity}
            inputMode="decimal"
            keyboardType="decimal-pad"
            testID="evidence-reference"
          />
        </>
      ) : (
        <Text variant="caption" tone="muted">
          Two columns: Raman shift in cm⁻¹, then intensity. A header line and comment lines are fine.
        </Text>
      )}
      {kind === 'pl' ? (
        <Text variant="caption" tone="muted">
          Two columns: wavelength or energy, then intensity. A header line and comment lines are fine.
        </Text>
      ) : null}
    </>
  );
}

const styles = StyleSheet.create({
  fields: { gap: space.xl },
  group: { gap: space.xs },
});
