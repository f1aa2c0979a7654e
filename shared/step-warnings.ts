import type { StepCreate } from './schemas/step';
import type { StepType } from './steps';

/** A value that is allowed but unusual enough that the person should look at it twice. */
export interface StepWarning {
  path: string;
  message: string;
}

/**
 * Where ordinary bench values end. These are soft limits: a step outside them is still logged,
 * the person is only asked to check for a slipped digit or a wrong unit. Hard limits (below
 * absolute zero, negative times…) stay in the zod schema in shared/schemas/step.ts.
 * All values: common practice, no source.
 */
export const UNUSUAL_STEP_LIMITS = {
  peelCyclesMax: 30,
  transferTemperatureCMax: 200,
  cvdGrowthZoneTemperatureCMin: 300,
  cvdZoneTemperatureCMax: 1100,
  cvdHoldTimeMinMax: 600,
  cvdCarrierFlowSccmMax: 1000,
  cvdPressureTorrMax: 800,
  annealTemperatureCMax: 600,
  annealDurationMinMax: 24 * 60,
  etchPowerWMax: 500,
  etchDurationSMax: 30 * 60,
  ebeamDoseUCPerCm2Min: 50,
  ebeamDoseUCPerCm2Max: 5000,
  acceleratingVoltageKVMin: 5,
  acceleratingVoltageKVMax: 125,
  metalThicknessNmMax: 500,
} as const;

const L = UNUSUAL_STEP_LIMITS;

interface RangeRule {
  field: string;
  what: string;
  unit: string;
  min?: number;
  max?: number;
}

/** One row per checked parameter; the CVD zones are handled separately below. */
const RANGE_RULES: Partial<Record<StepType, readonly RangeRule[]>> = {
  exfoliation: [
    { field: 'peelCycles', what: 'Peel cycles', unit: '', max: L.peelCyclesMax },
    { field: 'transferTemperatureC', what: 'Transfer temperature', unit: '°C', max: L.transferTemperatureCMax },
  ],
  transfer: [{ field: 'temperatureC', what: 'Transfer temperature', unit: '°C', max: L.transferTemperatureCMax }],
  stacking: [{ field: 'temperatureC', what: 'Stacking temperature', unit: '°C', max: L.transferTemperatureCMax }],
  cvd_growth: [
    { field: 'holdTimeMin', what: 'Hold time', unit: 'min', max: L.cvdHoldTimeMinMax },
    { field: 'carrierFlowSccm', what: 'Carrier flow', unit: 'sccm', max: L.cvdCarrierFlowSccmMax },
    { field: 'pressureTorr', what: 'Pressure', unit: 'Torr', max: L.cvdPressureTorrMax },
  ],
  annealing: [
    { field: 'temperatureC', what: 'Anneal temperature', unit: '°C', max: L.annealTemperatureCMax },
    { field: 'durationMin', what: 'Anneal time', unit: 'min', max: L.annealDurationMinMax },
  ],
  etching: [
    { field: 'powerW', what: 'Etch power', unit: 'W', max: L.etchPowerWMax },
    { field: 'durationS', what: 'Etch time', unit: 's', max: L.etchDurationSMax },
  ],
  lithography: [
    { field: 'doseUCPerCm2', what: 'Dose', unit: 'µC/cm²', min: L.ebeamDoseUCPerCm2Min, max: L.ebeamDoseUCPerCm2Max },
    {
      field: 'acceleratingVoltageKV',
      what: 'Accelerating voltage',
      unit: 'kV',
      min: L.acceleratingVoltageKVMin,
      max: L.acceleratingVoltageKVMax,
    },
  ],
  metal_deposition: [{ field: 'thicknessNm', what: 'Metal thickness', unit: 'nm', max: L.metalThicknessNmMax }],
};

const withUnit = (value: number, unit: string) => (unit ? `${value} ${unit}` : `${value}`);

function checkRange(rule: RangeRule, value: number, path: string): StepWarning | null {
  if (rule.max !== undefined && value > rule.max) {
    return {
      path,
      message: `${rule.what} of ${withUnit(value, rule.unit)} is above the usual ${withUnit(rule.max, rule.unit)}. Check the value and its unit.`,
    };
  }
  if (rule.min !== undefined && value < rule.min) {
    return {
      path,
      message: `${rule.what} of ${withUnit(value, rule.unit)} is below the usual ${withUnit(rule.min, rule.unit)}. Check the value and its unit.`,
    };
  }
  return null;
}

const isNumber = (value: unknown): value is number => typeof value === 'number' && Number.isFinite(value);

/**
 * Unusual values among a step's parameters. Works on stored parameters as well as on parsed
 * input, so a step read back later shows the same warnings it was logged with.
 */
export function unusualParameterValues(type: StepType, parameters: Readonly<Record<string, unknown>>): StepWarning[] {
  const warnings: StepWarning[] = [];
  for (const rule of RANGE_RULES[type] ?? []) {
    const value = parameters[rule.field];
    if (!isNumber(value)) continue;
    const warning = checkRange(rule, value, `parameters.${rule.field}`);
    if (warning) warnings.push(warning);
  }
  if (type === 'cvd_growth' && Array.isArray(parameters.zoneTemperaturesC)) {
    const zones: unknown[] = parameters.zoneTemperaturesC;
    for (const [index, value] of zones.entries()) {
      if (!isNumber(value)) continue;
      const warning = checkRange(
        { field: 'zoneTemperaturesC', what: `Zone ${index + 1} temperature`, unit: '°C', max: L.cvdZoneTemperatureCMax },
        value,
        `parameters.zoneTemperaturesC.${index}`,
      );
      if (warning) warnings.push(warning);
    }
    // Only the hottest (growth) zone has a lower bound: a chalcogen zone at 150–250 °C is normal.
    const numeric = zones.filter(isNumber);
    if (numeric.length) {
      const hottest = Math.max(...numeric);
      if (hottest < L.cvdGrowthZoneTemperatureCMin) {
        warnings.push({
          path: `parameters.zoneTemperaturesC.${zones.indexOf(hottest)}`,
          message: `The hottest zone is at ${hottest} °C, below the usual ${L.cvdGrowthZoneTemperatureCMin} °C for growth. Check the value and its unit.`,
        });
      }
    }
  }
  return warnings;
}

/** Unusual values in a step about to be logged; an empty list when everything looks ordinary. */
export function unusualStepValues(input: StepCreate): StepWarning[] {
  return unusualParameterValues(input.type, input.parameters as Readonly<Record<string, unknown>>);
}
