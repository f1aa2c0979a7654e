import { z } from 'zod';
import { SAMPLE_KINDS } from '../samples';
import { STEP_TYPES } from '../steps';
import { MaterialField, PersonRef, SampleProperties, SampleSummary, SUBSTRATES } from './sample';

export const STEP_NOTES_MAX_LENGTH = 4000;
export const STEP_OUTPUT_COUNT_MAX = 200;
export const STEP_INPUTS_MAX = 50;
/** Absolute zero in °C (CODATA / SI definition of the kelvin: 0 K = −273.15 °C). */
export const ABSOLUTE_ZERO_C = -273.15;

const label = (name: string) => ({ error: `${name} must be a number.` });
const temperatureC = (name: string) =>
  z.number(label(name)).min(ABSOLUTE_ZERO_C, `${name} cannot be below absolute zero (−273.15 °C).`);
const nonNegative = (name: string) => z.number(label(name)).min(0, `${name} cannot be negative.`);
const positive = (name: string) => z.number(label(name)).positive(`${name} must be above zero.`);
const shortText = (name: string, max = 80) => z.string().trim().min(1, `Enter the ${name}.`).max(max);

export const EXFOLIATION_METHODS = ['adhesive_tape', 'gold_assisted', 'thermal_release_tape', 'other'] as const;
export const PRETREATMENTS = ['none', 'o2_plasma', 'solvent_clean', 'other'] as const;

export const ExfoliationParameters = z
  .object({
    method: z.enum(EXFOLIATION_METHODS, { error: 'Choose the exfoliation method.' }),
    tapeType: shortText('tape type').optional(),
    peelCycles: z.number(label('Peel cycles')).int('Peel cycles is a whole number.').min(1, 'At least one peel.').max(1000),
    substrate: z.enum(SUBSTRATES, { error: 'Choose the substrate.' }),
    oxideThicknessNm: positive('Oxide thickness').max(10_000).optional(),
    pretreatment: z.enum(PRETREATMENTS).default('none'),
    transferTemperatureC: temperatureC('Transfer temperature').max(1000).optional(),
  })
  .strict();

export const CvdGrowthParameters = z
  .object({
    precursors: z.array(shortText('precursor', 120)).min(1, 'Name at least one precursor.').max(10),
    zoneTemperaturesC: z.array(temperatureC('Zone temperature').max(2000)).min(1, 'Give at least one zone temperature.').max(6),
    rampRateCPerMin: positive('Ramp rate').max(1000).optional(),
    holdTimeMin: nonNegative('Hold time').max(10_000),
    carrierGas: shortText('carrier gas', 40),
    carrierFlowSccm: nonNegative('Carrier flow').max(100_000),
    hydrogenFlowSccm: nonNegative('Hydrogen flow').max(100_000).default(0),
    pressureTorr: nonNegative('Pressure').max(2000),
    outcome: z.string().trim().max(500).optional(),
  })
  .strict();

export const TransferParameters = z
  .object({
    method: z.enum(['dry', 'wet'], { error: 'Choose dry or wet transfer.' }),
    stampPolymer: shortText('stamp polymer', 40).optional(),
    temperatureC: temperatureC('Temperature').max(1000).optional(),
  })
  .strict();

export const StackingParameters = z
  .object({
    stampPolymer: shortText('stamp polymer', 40).optional(),
    temperatureC: temperatureC('Temperature').max(1000).optional(),
  })
  .strict();

export const LithographyParameters = z
  .object({
    resist: shortText('resist', 60),
    doseUCPerCm2: positive('Dose').max(100_000),
    acceleratingVoltageKV: positive('Accelerating voltage').max(200),
    patternReference: shortText('pattern reference', 200).optional(),
  })
  .strict();

export const EtchingParameters = z
  .object({
    gas: shortText('etch gas', 40),
    powerW: nonNegative('Power').max(10_000),
    pressureMTorr: nonNegative('Pressure').max(760_000),
    durationS: positive('Etch time').max(100_000),
  })
  .strict();

export const AnnealingParameters = z
  .object({
    atmosphere: shortText('atmosphere', 40),
    temperatureC: temperatureC('Temperature').max(2000),
    durationMin: positive('Anneal time').max(100_000),
  })
  .strict();

export const EncapsulationParameters = z
  .object({
    material: shortText('encapsulating material', 40),
    method: shortText('method', 80).optional(),
  })
  .strict();

export const MetalDepositionParameters = z
  .object({
    metal: shortText('metal', 40),
    thicknessNm: positive('Thickness').max(100_000),
    method: shortText('method', 80).optional(),
  })
  .strict();

export const CleavingParameters = z.object({ method: shortText('method', 80).optional() }).strict();

/** Looking for flakes on a chip under the microscope; the micrograph it came from may be named. */
export const FlakeSearchParameters = z
  .object({
    microscope: shortText('microscope', 80).optional(),
    objectiveMagnification: positive('Objective magnification').max(1000).optional(),
    evidenceId: z.number(label('Evidence id')).int().positive().optional(),
  })
  .strict();

/** One new sample (or `count` alike) produced by a step. */
export const StepOutputInput = z.object({
  kind: z.enum(SAMPLE_KINDS, { error: 'Choose the kind of output.' }),
  material: MaterialField.optional(),
  count: z
    .number()
    .int()
    .min(1, 'Make at least one.')
    .max(STEP_OUTPUT_COUNT_MAX, `At most ${STEP_OUTPUT_COUNT_MAX} at once.`)
    .default(1),
  name: z.string().trim().max(120).optional(),
  properties: SampleProperties.optional(),
});
export type StepOutputInput = z.input<typeof StepOutputInput>;

const StepCommon = z.object({
  operatorId: z.number().int().positive().optional(),
  startedAt: z.iso.datetime({ offset: true, error: 'Give the start as an ISO date-time.' }),
  endedAt: z.iso.datetime({ offset: true, error: 'Give the end as an ISO date-time.' }).optional(),
  instrument: z.string().trim().max(120).optional(),
  notes: z.string().trim().max(STEP_NOTES_MAX_LENGTH).optional(),
  /** Samples the step used; `consumed` marks them used up. Order matters for stacking (bottom first). */
  inputs: z
    .array(z.object({ code: z.string().trim().min(1), consumed: z.boolean().default(false) }))
    .max(STEP_INPUTS_MAX)
    .default([]),
  /** Samples processed in place (e.g. a flake annealed): no new record, the step is in their history. */
  treated: z.array(z.string().trim().min(1)).max(STEP_INPUTS_MAX).default([]),
  outputs: z.array(StepOutputInput).max(20).default([]),
  /** Existing samples that this step made from the inputs (e.g. a device record made earlier). */
  existingOutputs: z.array(z.string().trim().min(1)).max(STEP_INPUTS_MAX).default([]),
});

const withParameters = <T extends (typeof STEP_TYPES)[number], P extends z.ZodType>(type: T, parameters: P) =>
  StepCommon.extend({ type: z.literal(type), parameters });

export const StepCreateInput = z
  .discriminatedUnion(
    'type',
    [
      withParameters('exfoliation', ExfoliationParameters),
      withParameters('cvd_growth', CvdGrowthParameters),
      withParameters('transfer', TransferParameters),
      withParameters('stacking', StackingParameters),
      withParameters('lithography', LithographyParameters),
      withParameters('etching', EtchingParameters),
      withParameters('annealing', AnnealingParameters),
      withParameters('encapsulation', EncapsulationParameters),
      withParameters('metal_deposition', MetalDepositionParameters),
      withParameters('cleaving', CleavingParameters),
      withParameters('flake_search', FlakeSearchParameters),
    ],
    { error: 'Choose a step type.' },
  )
  .superRefine((step, context) => {
    if (step.endedAt && Date.parse(step.endedAt) < Date.parse(step.startedAt)) {
      context.addIssue({ code: 'custom', path: ['endedAt'], message: 'The step cannot end before it starts.' });
    }
    if (step.inputs.length + step.treated.length + step.outputs.length + step.existingOutputs.length === 0) {
      context.addIssue({ code: 'custom', path: ['inputs'], message: 'A step uses, treats or makes at least one sample.' });
    }
  })
  .meta({ id: 'StepCreateInput' });
export type StepCreateInput = z.input<typeof StepCreateInput>;
export type StepCreate = z.output<typeof StepCreateInput>;

export const Step = z
  .object({
    id: z.number(),
    type: z.enum(STEP_TYPES),
    operator: PersonRef.nullable(),
    startedAt: z.iso.datetime().nullable(),
    endedAt: z.iso.datetime().nullable(),
    instrument: z.string().nullable(),
    notes: z.string().nullable(),
    parameters: z.record(z.string(), z.unknown()),
    inputs: z.array(SampleSummary.extend({ consumed: z.boolean() })),
    treated: z.array(SampleSummary),
    outputs: z.array(SampleSummary),
    createdAt: z.iso.datetime(),
  })
  .meta({ id: 'Step' });
export type Step = z.infer<typeof Step>;

export const StepWarning = z.object({ path: z.string(), message: z.string() }).meta({ id: 'StepWarning' });

/** A step, and values in it that are allowed but unusual (see shared/step-warnings.ts). */
export const StepEnvelope = z.object({ step: Step, warnings: z.array(StepWarning) }).meta({ id: 'StepEnvelope' });

/** The parameters schema of each step type (templates reuse them). */
export const STEP_PARAMETER_SCHEMAS = {
  exfoliation: ExfoliationParameters,
  cvd_growth: CvdGrowthParameters,
  transfer: TransferParameters,
  stacking: StackingParameters,
  lithography: LithographyParameters,
  etching: EtchingParameters,
  annealing: AnnealingParameters,
  encapsulation: EncapsulationParameters,
  metal_deposition: MetalDepositionParameters,
  cleaving: CleavingParameters,
  flake_search: FlakeSearchParameters,
} as const satisfies Record<(typeof STEP_TYPES)[number], z.ZodObject>;

export const IDEMPOTENCY_KEY_MIN_LENGTH = 8;
export const IDEMPOTENCY_KEY_MAX_LENGTH = 100;

/** The optional `Idempotency-Key` header of POST /api/steps: the client's id for one submission. */
export const IdempotencyKey = z
  .string()
  .min(IDEMPOTENCY_KEY_MIN_LENGTH, `An idempotency key has at least ${IDEMPOTENCY_KEY_MIN_LENGTH} characters.`)
  .max(IDEMPOTENCY_KEY_MAX_LENGTH, `An idempotency key has at most ${IDEMPOTENCY_KEY_MAX_LENGTH} characters.`)
  .regex(/^[A-Za-z0-9_-]+$/, 'An idempotency key uses only letters, digits, "-" and "_".');

export const RECENT_STEPS_LIMIT_MAX = 50;

export const StepListQuery = z
  .object({
    /** Only steps the caller logged or ran. */
    mine: z
      .enum(['true', 'false'], { error: 'mine is true or false.' })
      .transform((value) => value === 'true')
      .optional(),
    type: z.enum(STEP_TYPES, { error: 'Unknown step type.' }).optional(),
    limit: z
      .string()
      .regex(/^\d+$/, 'limit is a whole number.')
      .transform(Number)
      .pipe(z.number().int().min(1).max(RECENT_STEPS_LIMIT_MAX, `At most ${RECENT_STEPS_LIMIT_MAX} steps at once.`))
      .default(10),
  })
  .meta({ id: 'StepListQuery' });
export type StepListQuery = z.input<typeof StepListQuery>;
export type StepListFilters = z.output<typeof StepListQuery>;

export const StepList = z.object({ steps: z.array(Step) }).meta({ id: 'StepList' });
export type StepList = z.infer<typeof StepList>;
