import { StepCreateInput, type StepCreate } from '../../shared/schemas/step';
import { unusualParameterValues, unusualStepValues, UNUSUAL_STEP_LIMITS } from '../../shared/step-warnings';
import type { StepType } from '../../shared/steps';
import { STEP_PARAMETERS, stepBody } from '../helpers/sample-factories';

/** A parsed step of `type` with typical parameters, some replaced. */
function step(type: StepType, parameters: Record<string, unknown> = {}): StepCreate {
  const body = stepBody(type, { outputs: [{ kind: 'chip', material: 'MoS2' }] });
  return StepCreateInput.parse({ ...body, parameters: { ...STEP_PARAMETERS[type], ...parameters } });
}

const paths = (input: StepCreate) => unusualStepValues(input).map((warning) => warning.path);

describe('unusualStepValues', () => {
  it.each(Object.keys(STEP_PARAMETERS) as StepType[])('finds nothing unusual in a typical %s', (type) => {
    expect(unusualStepValues(step(type))).toEqual([]);
  });

  it.each<[string, StepType, Record<string, unknown>, string]>([
    ['31 peel cycles', 'exfoliation', { peelCycles: 31 }, 'parameters.peelCycles'],
    ['a 250 °C exfoliation transfer', 'exfoliation', { transferTemperatureC: 250 }, 'parameters.transferTemperatureC'],
    ['a 210 °C dry transfer', 'transfer', { temperatureC: 210 }, 'parameters.temperatureC'],
    ['a 1150 °C furnace zone', 'cvd_growth', { zoneTemperaturesC: [1150, 180] }, 'parameters.zoneTemperaturesC.0'],
    ['a growth zone at 250 °C', 'cvd_growth', { zoneTemperaturesC: [180, 250] }, 'parameters.zoneTemperaturesC.1'],
    ['a 12 h hold', 'cvd_growth', { holdTimeMin: 720 }, 'parameters.holdTimeMin'],
    ['2000 sccm carrier flow', 'cvd_growth', { carrierFlowSccm: 2000 }, 'parameters.carrierFlowSccm'],
    ['900 Torr', 'cvd_growth', { pressureTorr: 900 }, 'parameters.pressureTorr'],
    ['a 700 °C anneal', 'annealing', { temperatureC: 700 }, 'parameters.temperatureC'],
    ['a 25 h anneal', 'annealing', { durationMin: 25 * 60 }, 'parameters.durationMin'],
    ['600 W etch power', 'etching', { powerW: 600 }, 'parameters.powerW'],
    ['a 31 min etch', 'etching', { durationS: 31 * 60 }, 'parameters.durationS'],
    ['a dose of 20 µC/cm²', 'lithography', { doseUCPerCm2: 20 }, 'parameters.doseUCPerCm2'],
    ['a dose of 8000 µC/cm²', 'lithography', { doseUCPerCm2: 8000 }, 'parameters.doseUCPerCm2'],
    ['2 kV', 'lithography', { acceleratingVoltageKV: 2 }, 'parameters.acceleratingVoltageKV'],
    ['150 kV', 'lithography', { acceleratingVoltageKV: 150 }, 'parameters.acceleratingVoltageKV'],
    ['1 µm of metal', 'metal_deposition', { thicknessNm: 1000 }, 'parameters.thicknessNm'],
  ])('warns about %s', (_case, type, parameters, path) => {
    const warnings = unusualStepValues(step(type, parameters));
    expect(warnings.map((warning) => warning.path)).toEqual([path]);
    expect(warnings[0].message).toMatch(/usual/);
  });

  it('does not warn about a sulfur zone at 180 °C beside a hot growth zone', () => {
    expect(paths(step('cvd_growth', { zoneTemperaturesC: [750, 180] }))).toEqual([]);
  });

  it('does not warn at the limits themselves', () => {
    const L = UNUSUAL_STEP_LIMITS;
    expect(paths(step('exfoliation', { peelCycles: L.peelCyclesMax, transferTemperatureC: L.transferTemperatureCMax }))).toEqual(
      [],
    );
    expect(
      paths(step('lithography', { doseUCPerCm2: L.ebeamDoseUCPerCm2Min, acceleratingVoltageKV: L.acceleratingVoltageKVMax })),
    ).toEqual([]);
  });

  it('names every unusual value when there are several', () => {
    expect(paths(step('annealing', { temperatureC: 900, durationMin: 3000 }))).toEqual([
      'parameters.temperatureC',
      'parameters.durationMin',
    ]);
  });

  it('gives the same warnings for stored parameters, ignoring values that are not numbers', () => {
    expect(unusualParameterValues('etching', { powerW: 750, durationS: '45' })).toEqual([
      { path: 'parameters.powerW', message: expect.stringContaining('750 W') },
    ]);
  });
});
