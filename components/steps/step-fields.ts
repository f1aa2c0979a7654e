import type { z } from 'zod';
import type { SampleKind } from '@/shared/samples';
import { SUBSTRATE_LABELS, SUBSTRATES } from '@/shared/schemas/sample';
import {
  AnnealingParameters,
  CleavingParameters,
  CvdGrowthParameters,
  EncapsulationParameters,
  EtchingParameters,
  EXFOLIATION_METHODS,
  ExfoliationParameters,
  FlakeSearchParameters,
  LithographyParameters,
  MetalDepositionParameters,
  PRETREATMENTS,
  StackingParameters,
  TransferParameters,
} from '@/shared/schemas/step';
import { STEP_TYPE_LABELS, STEP_TYPES, type StepType } from '@/shared/steps';
import type { Choice } from '@/components/ui/choice-group';

/** The shared parameter schema of each step type: the single truth for what is required. */
export const PARAMETER_SCHEMAS = {
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
} as const satisfies Record<StepType, z.ZodObject>;

type ParameterName<T extends StepType> = Extract<keyof z.input<(typeof PARAMETER_SCHEMAS)[T]>, string>;

/**
 * How a parameter is entered. text / number: one value; choice: chips; textList / numberList:
 * several values separated by commas (precursors, zone temperatures).
 */
export type StepFieldControl = 'text' | 'number' | 'integer' | 'choice' | 'textList' | 'numberList';

export interface StepField<N extends string = string> {
  name: N;
  /** Without the unit; forms show "Label (unit)". */
  label: string;
  unit?: string;
  control: StepFieldControl;
  choices?: readonly Choice<string>[];
  hint?: string;
}

const choicesOf = <V extends string>(values: readonly V[], labels: Record<V, string>): Choice<V>[] =>
  values.map((value) => ({ value, label: labels[value] }));

const SUBSTRATE_CHOICES = choicesOf(SUBSTRATES, SUBSTRATE_LABELS);

const EXFOLIATION_METHOD_CHOICES = choicesOf(EXFOLIATION_METHODS, {
  adhesive_tape: 'Adhesive tape',
  gold_assisted: 'Gold-assisted',
  thermal_release_tape: 'Thermal-release tape',
  other: 'Other',
});

const PRETREATMENT_CHOICES = choicesOf(PRETREATMENTS, {
  none: 'None',
  o2_plasma: 'O2 plasma',
  solvent_clean: 'Solvent clean',
  other: 'Other',
});

const TRANSFER_METHOD_CHOICES = choicesOf(['dry', 'wet'] as const, { dry: 'Dry (stamp)', wet: 'Wet' });

const LIST_HINT = 'Separate several with commas.';

/**
 * The parameter form of every step type, in the order people fill them in at the bench. The
 * form, the step view and the history all read this one table; names are checked against the
 * shared schemas by the compiler.
 */
export const STEP_FIELDS: { [T in StepType]: readonly StepField<ParameterName<T>>[] } = {
  exfoliation: [
    { name: 'method', label: 'Method', control: 'choice', choices: EXFOLIATION_METHOD_CHOICES },
    { name: 'tapeType', label: 'Tape type', control: 'text' },
    { name: 'peelCycles', label: 'Peel cycles', control: 'integer' },
    { name: 'substrate', label: 'Substrate', control: 'choice', choices: SUBSTRATE_CHOICES },
    { name: 'oxideThicknessNm', label: 'Oxide thickness', unit: 'nm', control: 'number' },
    { name: 'pretreatment', label: 'Substrate pretreatment', control: 'choice', choices: PRETREATMENT_CHOICES },
    { name: 'transferTemperatureC', label: 'Transfer temperature', unit: '°C', control: 'number' },
  ],
  cvd_growth: [
    { name: 'precursors', label: 'Precursors', control: 'textList', hint: LIST_HINT },
    {
      name: 'zoneTemperaturesC',
      label: 'Zone temperatures',
      unit: '°C',
      control: 'numberList',
      hint: 'One per furnace zone, upstream first, separated by commas.',
    },
    { name: 'rampRateCPerMin', label: 'Ramp rate', unit: '°C/min', control: 'number' },
    { name: 'holdTimeMin', label: 'Hold time', unit: 'min', control: 'number' },
    { name: 'carrierGas', label: 'Carrier gas', control: 'text' },
    { name: 'carrierFlowSccm', label: 'Carrier flow', unit: 'sccm', control: 'number' },
    { name: 'hydrogenFlowSccm', label: 'H2 flow', unit: 'sccm', control: 'number' },
    { name: 'pressureTorr', label: 'Pressure', unit: 'Torr', control: 'number' },
    { name: 'outcome', label: 'Outcome', control: 'text' },
  ],
  transfer: [
    { name: 'method', label: 'Method', control: 'choice', choices: TRANSFER_METHOD_CHOICES },
    { name: 'stampPolymer', label: 'Stamp polymer', control: 'text' },
    { name: 'temperatureC', label: 'Temperature', unit: '°C', control: 'number' },
  ],
  stacking: [
    { name: 'stampPolymer', label: 'Stamp polymer', control: 'text' },
    { name: 'temperatureC', label: 'Temperature', unit: '°C', control: 'number' },
  ],
  lithography: [
    { name: 'resist', label: 'Resist', control: 'text' },
    { name: 'doseUCPerCm2', label: 'Dose', unit: 'µC/cm²', control: 'number' },
    { name: 'acceleratingVoltageKV', label: 'Accelerating voltage', unit: 'kV', control: 'number' },
    { name: 'patternReference', label: 'Pattern file or reference', control: 'text' },
  ],
  etching: [
    { name: 'gas', label: 'Etch gas', control: 'text' },
    { name: 'powerW', label: 'Power', unit: 'W', control: 'number' },
    { name: 'pressureMTorr', label: 'Pressure', unit: 'mTorr', control: 'number' },
    { name: 'durationS', label: 'Etch time', unit: 's', control: 'number' },
  ],
  annealing: [
    { name: 'atmosphere', label: 'Atmosphere', control: 'text' },
    { name: 'temperatureC', label: 'Temperature', unit: '°C', control: 'number' },
    { name: 'durationMin', label: 'Anneal time', unit: 'min', control: 'number' },
  ],
  encapsulation: [
    { name: 'material', label: 'Encapsulating material', control: 'text' },
    { name: 'method', label: 'Method', control: 'text' },
  ],
  metal_deposition: [
    { name: 'metal', label: 'Metal', control: 'text' },
    { name: 'thicknessNm', label: 'Thickness', unit: 'nm', control: 'number' },
    { name: 'method', label: 'Method', control: 'text' },
  ],
  cleaving: [{ name: 'method', label: 'Method', control: 'text' }],
  flake_search: [
    { name: 'microscope', label: 'Microscope', control: 'text' },
    { name: 'objectiveMagnification', label: 'Objective magnification', unit: '×', control: 'number' },
  ],
};

export const STEP_TYPE_CHOICES: readonly Choice<StepType>[] = STEP_TYPES.map((value) => ({
  value,
  label: STEP_TYPE_LABELS[value],
}));

/**
 * What a step of each type usually makes, offered as its first output row. Annealing and etching
 * usually work on samples in place, so they start with no output.
 */
export const USUAL_OUTPUT: Partial<Record<StepType, SampleKind>> = {
  exfoliation: 'chip',
  cvd_growth: 'film',
  transfer: 'flake',
  stacking: 'stack',
  lithography: 'device',
  encapsulation: 'stack',
  metal_deposition: 'device',
  cleaving: 'chip',
  flake_search: 'flake',
};

export function stepFields(type: StepType): readonly StepField[] {
  return STEP_FIELDS[type];
}

/** Whether the shared schema accepts the parameter left out (optional, or it has a default). */
export function isOptionalParameter(type: StepType, name: string): boolean {
  const shape: Record<string, z.ZodType> = PARAMETER_SCHEMAS[type].shape;
  const field = shape[name];
  return field ? field.safeParse(undefined).success : true;
}

/** The default the schema fills in when a parameter is left out (e.g. pretreatment "none"). */
export function parameterDefault(type: StepType, name: string): unknown {
  const shape: Record<string, z.ZodType> = PARAMETER_SCHEMAS[type].shape;
  const parsed = shape[name]?.safeParse(undefined);
  return parsed?.success ? parsed.data : undefined;
}

export function fieldLabel(field: StepField): string {
  return field.unit ? `${field.label} (${field.unit})` : field.label;
}

export function isStepType(value: string): value is StepType {
  return STEP_TYPES.some((type) => type === value);
}

/** A parameter's value for reading: choice labels, lists joined, the unit after numbers. */
export function formatParameter(field: StepField | undefined, value: unknown): string {
  if (value === null || value === undefined || value === '') return '—';
  const one = (item: unknown): string => {
    if (field?.choices && typeof item === 'string') return field.choices.find((choice) => choice.value === item)?.label ?? item;
    if (typeof item === 'number') return item.toLocaleString();
    return typeof item === 'string' ? item : JSON.stringify(item);
  };
  const text = Array.isArray(value) ? value.map(one).join(', ') : one(value);
  return field?.unit ? `${text} ${field.unit}` : text;
}
