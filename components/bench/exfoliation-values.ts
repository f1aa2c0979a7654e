import { z } from 'zod';
import { SUBSTRATES } from '@/shared/schemas/sample';
import { EXFOLIATION_METHODS, PRETREATMENTS, StepCreateInput, type StepCreate } from '@/shared/schemas/step';

export type ExfoliationMethod = (typeof EXFOLIATION_METHODS)[number];
export type Substrate = (typeof SUBSTRATES)[number];
export type Pretreatment = (typeof PRETREATMENTS)[number];

/** What the quick form holds; numbers the person types stay text until submit. */
export interface ExfoliationValues {
  crystal: string;
  method: ExfoliationMethod | null;
  tapeType: string;
  peelCycles: number;
  substrate: Substrate | null;
  oxideThicknessNm: string;
  pretreatment: Pretreatment;
  transferTemperatureC: string;
  chipCount: number;
  notes: string;
}

/** Common thermal-oxide thicknesses for graphene/TMD contrast (90 and 285–300 nm; common practice, no source). */
export const OXIDE_PRESETS = ['90', '285', '300'] as const;

export const EMPTY_EXFOLIATION: ExfoliationValues = {
  crystal: '',
  method: null,
  tapeType: '',
  peelCycles: 5,
  substrate: null,
  oxideThicknessNm: '',
  pretreatment: 'none',
  transferTemperatureC: '',
  chipCount: 4,
  notes: '',
};

const Remembered = z
  .object({
    method: z.enum(EXFOLIATION_METHODS).nullable(),
    tapeType: z.string(),
    peelCycles: z.number().int().min(1),
    substrate: z.enum(SUBSTRATES).nullable(),
    oxideThicknessNm: z.string(),
    pretreatment: z.enum(PRETREATMENTS),
    transferTemperatureC: z.string(),
    chipCount: z.number().int().min(1),
  })
  .partial();

/** Everything but the crystal and the note: those change every run. */
export function rememberedPart(values: ExfoliationValues): Record<string, unknown> {
  const { crystal: _crystal, notes: _notes, ...rest } = values;
  return rest;
}

export function withRemembered(base: ExfoliationValues, remembered: unknown): ExfoliationValues {
  const parsed = Remembered.safeParse(remembered);
  if (!parsed.success) return base;
  const kept = Object.fromEntries(Object.entries(parsed.data).filter(([, value]) => value !== undefined));
  return { ...base, ...kept };
}

const numberText = (value: unknown) => (typeof value === 'number' ? String(value) : '');

/** A logged or queued exfoliation back into the form: "Repeat my last run", templates, corrections. */
export function valuesFromStep(
  parameters: Record<string, unknown>,
  extra: { crystal?: string; chipCount?: number; notes?: string },
  base: ExfoliationValues,
): ExfoliationValues {
  const pick = <T extends string>(list: readonly T[], value: unknown): T | null => list.find((item) => item === value) ?? null;
  return {
    ...base,
    crystal: extra.crystal ?? base.crystal,
    method: pick(EXFOLIATION_METHODS, parameters.method) ?? base.method,
    tapeType: typeof parameters.tapeType === 'string' ? parameters.tapeType : '',
    peelCycles: typeof parameters.peelCycles === 'number' ? parameters.peelCycles : base.peelCycles,
    substrate: pick(SUBSTRATES, parameters.substrate) ?? base.substrate,
    oxideThicknessNm: numberText(parameters.oxideThicknessNm),
    pretreatment: pick(PRETREATMENTS, parameters.pretreatment) ?? 'none',
    transferTemperatureC: numberText(parameters.transferTemperatureC),
    chipCount: extra.chipCount ?? base.chipCount,
    notes: extra.notes ?? base.notes,
  };
}

/** "" stays out; anything else becomes a number (or NaN, which the schema names). */
const optionalNumber = (text: string) => (text.trim() === '' ? undefined : Number(text.trim().replace(',', '.')));

export function exfoliationParameters(values: ExfoliationValues): Record<string, unknown> {
  const siO2 = values.substrate === 'si_sio2';
  return {
    method: values.method ?? undefined,
    tapeType: values.tapeType.trim() || undefined,
    peelCycles: values.peelCycles,
    substrate: values.substrate ?? undefined,
    oxideThicknessNm: siO2 ? optionalNumber(values.oxideThicknessNm) : undefined,
    pretreatment: values.pretreatment,
    transferTemperatureC: optionalNumber(values.transferTemperatureC),
  };
}

/** The one request: the step, the crystal it used and the chips it made (with their substrate). */
export function exfoliationCandidate(values: ExfoliationValues, now: Date): unknown {
  const parameters = exfoliationParameters(values);
  const properties = {
    ...(values.substrate ? { substrate: values.substrate } : {}),
    ...(typeof parameters.oxideThicknessNm === 'number' ? { oxideThicknessNm: parameters.oxideThicknessNm } : {}),
  };
  return {
    type: 'exfoliation',
    startedAt: now.toISOString(),
    notes: values.notes.trim() || undefined,
    inputs: values.crystal ? [{ code: values.crystal, consumed: false }] : [],
    outputs: [{ kind: 'chip', count: values.chipCount, ...(Object.keys(properties).length ? { properties } : {}) }],
    parameters,
  };
}

export function parseExfoliation(values: ExfoliationValues, now: Date) {
  return StepCreateInput.safeParse(exfoliationCandidate(values, now));
}

/** The queued form of a run back into values, to correct a refused one. */
export function valuesFromBody(body: StepCreate, base: ExfoliationValues): ExfoliationValues {
  return valuesFromStep(
    body.parameters,
    {
      crystal: body.inputs[0]?.code ?? '',
      chipCount: body.outputs[0]?.count ?? base.chipCount,
      notes: body.notes ?? '',
    },
    base,
  );
}
