import { StepCreateInput, type StepCreate } from '@/shared/schemas/step';

/** What the quick growth form holds; typed numbers stay text until submit. */
export interface GrowthValues {
  precursors: readonly string[];
  substrates: readonly string[];
  zones: readonly [string, string, string];
  rampRateCPerMin: string;
  holdTimeMin: string;
  carrierGas: string;
  carrierFlowSccm: string;
  hydrogenFlowSccm: string;
  pressureTorr: string;
  outcome: string;
  filmCount: number;
  notes: string;
}

export const EMPTY_GROWTH: GrowthValues = {
  precursors: [],
  substrates: [],
  zones: ['', '', ''],
  rampRateCPerMin: '',
  holdTimeMin: '',
  carrierGas: 'Ar',
  carrierFlowSccm: '',
  hydrogenFlowSccm: '',
  pressureTorr: '',
  outcome: '',
  filmCount: 1,
  notes: '',
};

const num = (text: string) => (text.trim() === '' ? undefined : Number(text.trim().replace(',', '.')));

/**
 * One request: the run, the precursor lots and substrate chips it used, and the films it made.
 * Precursor lots are recorded both as inputs (lineage) and by code in the parameters.
 */
export function parseGrowth(values: GrowthValues, now: Date) {
  const zones = values.zones.map(num).filter((value): value is number => value !== undefined);
  return StepCreateInput.safeParse({
    type: 'cvd_growth',
    startedAt: now.toISOString(),
    notes: values.notes.trim() || undefined,
    inputs: [...values.precursors, ...values.substrates].map((code) => ({ code, consumed: false })),
    outputs: [{ kind: 'film', count: values.filmCount }],
    parameters: {
      precursors: [...values.precursors],
      zoneTemperaturesC: zones,
      rampRateCPerMin: num(values.rampRateCPerMin),
      holdTimeMin: num(values.holdTimeMin),
      carrierGas: values.carrierGas.trim() || undefined,
      carrierFlowSccm: num(values.carrierFlowSccm),
      hydrogenFlowSccm: num(values.hydrogenFlowSccm),
      pressureTorr: num(values.pressureTorr),
      outcome: values.outcome.trim() || undefined,
    },
  });
}

const text = (value: unknown) => (typeof value === 'number' ? String(value) : typeof value === 'string' ? value : '');

/** A queued run back into the form, to correct it. */
export function growthFromBody(body: StepCreate): GrowthValues {
  const p = body.parameters;
  const precursors =
    'precursors' in p && Array.isArray(p.precursors) ? p.precursors.filter((item) => typeof item === 'string') : [];
  const zoneList = 'zoneTemperaturesC' in p && Array.isArray(p.zoneTemperaturesC) ? p.zoneTemperaturesC : [];
  const field = (name: string) => text(Object.entries(p).find(([key]) => key === name)?.[1]);
  return {
    precursors,
    substrates: body.inputs.map((input) => input.code).filter((code) => !precursors.includes(code)),
    zones: [text(zoneList[0]), text(zoneList[1]), text(zoneList[2])],
    rampRateCPerMin: field('rampRateCPerMin'),
    holdTimeMin: field('holdTimeMin'),
    carrierGas: field('carrierGas'),
    carrierFlowSccm: field('carrierFlowSccm'),
    hydrogenFlowSccm: field('hydrogenFlowSccm'),
    pressureTorr: field('pressureTorr'),
    outcome: field('outcome'),
    filmCount: body.outputs[0]?.count ?? 1,
    notes: body.notes ?? '',
  };
}
