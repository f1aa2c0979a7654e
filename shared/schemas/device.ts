/**
 * Devices: the lab's lithography setting, the zone-plate lens design kept with a device (newest is
 * current, older ones stay), and measurements taken on the finished device beside the design's
 * prediction. The optics come from shared/zone-plate/; these are the API shapes.
 */
import { z } from 'zod';
import { ETCHED_ZONE_CHOICES, MAX_MIN_FEATURE_NM } from '../zone-plate/limits';
import { PersonRef } from './sample';
import { ZonePlateDesignSummary, ZonePlateWarning } from './zone-plate';

// ---------------------------------------------------------------------------------------------
// Lab settings
// ---------------------------------------------------------------------------------------------

export const LabSettings = z
  .object({
    /** The smallest line the lab's e-beam + etch writes, nm; lens designs are warned against it. */
    minFeatureNm: z.number(),
    /** True until a manager has set it: the value is then Flakeline's default. */
    isDefault: z.boolean(),
    updatedAt: z.iso.datetime().nullable(),
    updatedBy: PersonRef.nullable(),
  })
  .meta({ id: 'LabSettings' });
export type LabSettings = z.infer<typeof LabSettings>;

export const LabSettingsEnvelope = z.object({ settings: LabSettings }).meta({ id: 'LabSettingsEnvelope' });
export type LabSettingsEnvelope = z.infer<typeof LabSettingsEnvelope>;

export const LabSettingsUpdateInput = z
  .object({
    minFeatureNm: z
      .number({ error: 'The smallest feature must be a number of nanometres.' })
      .positive('The smallest feature your lithography writes must be above zero.')
      .max(MAX_MIN_FEATURE_NM, `The smallest feature can be at most ${MAX_MIN_FEATURE_NM / 1000} µm.`),
  })
  .meta({ id: 'LabSettingsUpdateInput' });
export type LabSettingsUpdateInput = z.input<typeof LabSettingsUpdateInput>;

// ---------------------------------------------------------------------------------------------
// Lens designs (PUT body: ZonePlateDesignInput from ./zone-plate; the lab setting replaces its
// minFeatureNm, since the lab's process, not the form, decides what can be written)
// ---------------------------------------------------------------------------------------------

/** The inputs as stored with the design. */
export const LensDesignInputRecord = z
  .object({
    wavelengthNm: z.number(),
    focalLengthUm: z.number(),
    apertureDiameterUm: z.number().nullable(),
    zoneCount: z.number().int().nullable(),
    minFeatureNm: z.number(),
    etchedZones: z.enum(ETCHED_ZONE_CHOICES),
  })
  .meta({ id: 'LensDesignInputRecord' });
export type LensDesignInputRecord = z.infer<typeof LensDesignInputRecord>;

export const LensDesign = z
  .object({
    id: z.number(),
    deviceCode: z.string(),
    /** The lithography step that made the device, when there is one; the design belongs to it too. */
    lithographyStepId: z.number().nullable(),
    input: LensDesignInputRecord,
    /** As computed when the design was saved (its warnings used the lab setting of that moment). */
    summary: ZonePlateDesignSummary,
    /** Warnings recomputed now, against the lab's current setting. */
    warnings: z.array(ZonePlateWarning),
    labMinFeatureNm: z.number(),
    createdBy: PersonRef,
    createdAt: z.iso.datetime(),
  })
  .meta({ id: 'LensDesign' });
export type LensDesign = z.infer<typeof LensDesign>;

/** An earlier design of the same device, kept for the record. */
export const LensDesignVersion = z
  .object({
    id: z.number(),
    wavelengthNm: z.number(),
    focalLengthUm: z.number(),
    zoneCount: z.number().int(),
    lensDiameterUm: z.number(),
    createdBy: PersonRef,
    createdAt: z.iso.datetime(),
  })
  .meta({ id: 'LensDesignVersion' });
export type LensDesignVersion = z.infer<typeof LensDesignVersion>;

export const LensDesignEnvelope = z
  .object({ design: LensDesign.nullable(), earlier: z.array(LensDesignVersion) })
  .meta({ id: 'LensDesignEnvelope' });
export type LensDesignEnvelope = z.infer<typeof LensDesignEnvelope>;

// ---------------------------------------------------------------------------------------------
// Measurements
// ---------------------------------------------------------------------------------------------

export const MEASUREMENT_KINDS = [
  'focal_length_vs_wavelength',
  'focal_length_vs_gate_voltage',
  'efficiency_vs_gate_voltage',
] as const;
export type MeasurementKind = (typeof MEASUREMENT_KINDS)[number];

/** Axes of each kind; units are part of the data (x and y are stored in these units). */
export const MEASUREMENT_AXES: Record<
  MeasurementKind,
  { title: string; x: { label: string; unit: string }; y: { label: string; unit: string } }
> = {
  focal_length_vs_wavelength: {
    title: 'Focal length at each test wavelength',
    x: { label: 'Wavelength', unit: 'nm' },
    y: { label: 'Focal length', unit: 'µm' },
  },
  focal_length_vs_gate_voltage: {
    title: 'Focal length against gate voltage',
    x: { label: 'Gate voltage', unit: 'V' },
    y: { label: 'Focal length', unit: 'µm' },
  },
  efficiency_vs_gate_voltage: {
    title: 'First-order efficiency against gate voltage',
    x: { label: 'Gate voltage', unit: 'V' },
    y: { label: 'Efficiency', unit: '%' },
  },
};

export const MEASUREMENT_ROWS_MAX = 500;
export const MEASUREMENT_NOTE_MAX_LENGTH = 2000;
/** Gate voltages beyond ±1 kV would break any gate dielectric on a chip (common practice, no source). */
export const GATE_VOLTAGE_MAX_ABS_V = 1000;

const finite = (label: string) =>
  z.number({ error: `${label} must be a number.` }).refine(Number.isFinite, `${label} must be a number.`);

export const MeasurementRow = z
  .object({
    x: finite('x'),
    y: finite('y'),
    note: z.string().trim().max(200, 'A row note has at most 200 characters.').optional(),
  })
  .meta({ id: 'MeasurementRow' });
export type MeasurementRow = z.infer<typeof MeasurementRow>;

export const MeasurementCreateInput = z
  .object({
    kind: z.enum(MEASUREMENT_KINDS, { error: 'Choose what was measured.' }),
    rows: z
      .array(MeasurementRow)
      .min(1, 'Enter at least one row.')
      .max(MEASUREMENT_ROWS_MAX, `At most ${MEASUREMENT_ROWS_MAX} rows in one measurement.`),
    instrument: z.string().trim().max(120, 'The instrument name has at most 120 characters.').optional(),
    measuredAt: z.iso.datetime({ offset: true, error: 'Give the time of the measurement as an ISO date-time.' }),
    note: z.string().trim().max(MEASUREMENT_NOTE_MAX_LENGTH).optional(),
  })
  .superRefine((input, context) => {
    input.rows.forEach((row, index) => {
      const at = (field: 'x' | 'y', message: string) =>
        context.addIssue({ code: 'custom', path: ['rows', index, field], message });
      if (input.kind === 'focal_length_vs_wavelength') {
        if (row.x <= 0) at('x', 'The wavelength must be above zero.');
      } else if (Math.abs(row.x) > GATE_VOLTAGE_MAX_ABS_V) {
        at('x', `The gate voltage must be within ±${GATE_VOLTAGE_MAX_ABS_V} V.`);
      }
      if (input.kind === 'efficiency_vs_gate_voltage') {
        if (row.y < 0 || row.y > 100) at('y', 'An efficiency is between 0 and 100 %.');
      } else if (row.y <= 0) {
        at('y', 'The focal length must be above zero.');
      }
    });
  })
  .meta({ id: 'MeasurementCreateInput' });
export type MeasurementCreateInput = z.input<typeof MeasurementCreateInput>;

/**
 * What the current design predicts for a measurement: a curve (focal length f·λ₀/λ at the
 * measured wavelengths and between them) and/or reference levels (the design focal length, the
 * ideal amplitude and phase plate efficiencies). Null when the device has no design.
 */
export const MeasurementPrediction = z
  .object({
    basis: z.string(),
    curve: z.array(z.object({ x: z.number(), y: z.number() })),
    levels: z.array(z.object({ label: z.string(), y: z.number() })),
  })
  .meta({ id: 'MeasurementPrediction' });
export type MeasurementPrediction = z.infer<typeof MeasurementPrediction>;

export const DeviceMeasurement = z
  .object({
    id: z.number(),
    deviceCode: z.string(),
    kind: z.enum(MEASUREMENT_KINDS),
    rows: z.array(MeasurementRow),
    instrument: z.string().nullable(),
    note: z.string().nullable(),
    measuredAt: z.iso.datetime(),
    measuredBy: PersonRef,
    createdAt: z.iso.datetime(),
    prediction: MeasurementPrediction.nullable(),
  })
  .meta({ id: 'DeviceMeasurement' });
export type DeviceMeasurement = z.infer<typeof DeviceMeasurement>;

export const DeviceMeasurementEnvelope = z.object({ measurement: DeviceMeasurement }).meta({ id: 'DeviceMeasurementEnvelope' });
export type DeviceMeasurementEnvelope = z.infer<typeof DeviceMeasurementEnvelope>;

export const DeviceMeasurementList = z.object({ measurements: z.array(DeviceMeasurement) }).meta({ id: 'DeviceMeasurementList' });
export type DeviceMeasurementList = z.infer<typeof DeviceMeasurementList>;
