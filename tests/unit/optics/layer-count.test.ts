import { type FlakeMaterialId } from '../../../shared/optics/materials';
import { RGB_BANDS, rgbContrast, type Substrate } from '../../../shared/optics/contrast';
import { type ContrastMeasurement, DEFAULT_MAX_LAYERS, matchLayerCount } from '../../../shared/optics/layer-count';
import { channelMeasurements } from '../../../shared/optics/micrograph';
import { seededRandom, uniform } from './seeded-random';

const onOxide = (oxideThicknessNm: number): Substrate => ({ kind: 'oxide-on-silicon', oxideThicknessNm });

describe('layer count round trip', () => {
  // Self-consistency: contrast predicted for N layers, perturbed by noise well inside the stated
  // uncertainty (±0.003 against σ = 0.01), must come back as N with a clear call.
  it.each([
    ['graphene', 285],
    ['graphene', 90],
    ['MoS2', 90],
    ['MoS2', 285],
    ['WSe2', 285],
    ['WS2', 270],
    ['MoSe2', 90],
  ] as const)('recovers 1–5 layers of %s on %i nm oxide with clear confidence', (material, oxideThicknessNm) => {
    const random = seededRandom(oxideThicknessNm * 7 + material.length);
    const substrate = onOxide(oxideThicknessNm);
    for (let layers = 1; layers <= 5; layers += 1) {
      const predicted = rgbContrast({ material, layers, substrate });
      const noisy = {
        red: predicted.red + uniform(random, -0.003, 0.003),
        green: predicted.green + uniform(random, -0.003, 0.003),
        blue: predicted.blue + uniform(random, -0.003, 0.003),
      };
      const match = matchLayerCount({ material, substrate, measurements: channelMeasurements(noisy, 0.01) });
      expect(match.best.layers).toBe(layers);
      expect(match.confidence).toBe('clear');
      expect(match.isPoorFit).toBe(false);
      expect(match.runnerUp.layers).not.toBe(layers);
      expect(match.margin).toBeGreaterThanOrEqual(9);
    }
  });

  it('reports every candidate 1…10 and the datasets it used', () => {
    const substrate = onOxide(285);
    const match = matchLayerCount({
      material: 'MoS2',
      substrate,
      measurements: channelMeasurements(rgbContrast({ material: 'MoS2', layers: 2, substrate })),
    });
    expect(match.candidates.map((candidate) => candidate.layers)).toEqual(
      Array.from({ length: DEFAULT_MAX_LAYERS }, (_, i) => i + 1),
    );
    expect(match.best.chiSquared).toBeCloseTo(0, 20);
    expect(match.datasets.map((dataset) => dataset.id)).toContain('MoS2-Hsu-2019-1L');
    expect(match.summary).toMatch(/^Best match 2 layers/);
  });

  it('works from a single filter measurement', () => {
    const substrate = onOxide(90);
    const measurement: ContrastMeasurement = {
      illumination: { kind: 'wavelength', wavelengthNm: 550 },
      contrast: 0.252,
    };
    const match = matchLayerCount({ material: 'graphene', substrate, measurements: [measurement] });
    expect(match.best.layers).toBe(2);
  });
});

describe('ambiguous and poor matches', () => {
  // Halfway between the predictions for 2 and 3 layers, both are equally likely.
  it('calls a measurement halfway between two layer counts ambiguous', () => {
    const substrate = onOxide(285);
    const two = rgbContrast({ material: 'graphene', layers: 2, substrate });
    const three = rgbContrast({ material: 'graphene', layers: 3, substrate });
    const halfway = { red: (two.red + three.red) / 2, green: (two.green + three.green) / 2, blue: (two.blue + three.blue) / 2 };
    const match = matchLayerCount({ material: 'graphene', substrate, measurements: channelMeasurements(halfway, 0.03) });
    expect([match.best.layers, match.runnerUp.layers].sort()).toEqual([2, 3]);
    expect(match.confidence).toBe('ambiguous');
    expect(match.summary).toMatch(/cannot tell them apart/);
  });

  // hBN layers differ by only ~1–2 % contrast on standard oxide (Gorbachev et al., Small 7, 465,
  // 2011, from memory), so a realistic uncertainty cannot separate neighbouring counts.
  it('cannot separate hBN layer counts on 285 nm oxide at σ = 0.02', () => {
    const substrate = onOxide(285);
    const predicted = rgbContrast({ material: 'hBN', layers: 3, substrate });
    const match = matchLayerCount({ material: 'hBN', substrate, measurements: channelMeasurements(predicted, 0.02) });
    expect(match.best.layers).toBe(3);
    expect(match.confidence).toBe('ambiguous');
  });

  it('is marginal between 2σ and 3σ separation', () => {
    const substrate = onOxide(285);
    const predicted = rgbContrast({ material: 'hBN', layers: 3, substrate });
    const match = matchLayerCount({ material: 'hBN', substrate, measurements: channelMeasurements(predicted, 0.01) });
    expect(match.margin).toBeGreaterThanOrEqual(4);
    expect(match.margin).toBeLessThan(9);
    expect(match.confidence).toBe('marginal');
  });

  it('flags a measurement no layer count explains and never calls it clear', () => {
    const substrate = onOxide(285);
    const match = matchLayerCount({
      material: 'graphene',
      substrate,
      measurements: channelMeasurements({ red: 0.05, green: 0.09, blue: 0.3 }),
    });
    expect(match.isPoorFit).toBe(true);
    expect(match.confidence).not.toBe('clear');
    expect(match.summary).toMatch(/check the material, substrate and oxide thickness/);
  });
});

describe('input checks', () => {
  const query = (measurements: ContrastMeasurement[], material: FlakeMaterialId = 'graphene') => ({
    material,
    substrate: onOxide(285),
    measurements,
  });

  it('needs at least one measurement, positive uncertainties and at least two candidates', () => {
    expect(() => matchLayerCount(query([]))).toThrow(RangeError);
    expect(() => matchLayerCount(query([{ illumination: RGB_BANDS.green, contrast: 0.1, uncertainty: 0 }]))).toThrow(RangeError);
    expect(() => matchLayerCount(query([{ illumination: RGB_BANDS.green, contrast: Number.NaN }]))).toThrow(RangeError);
    expect(() => matchLayerCount({ ...query([{ illumination: RGB_BANDS.green, contrast: 0.1 }]), maxLayers: 1 })).toThrow(
      RangeError,
    );
  });
});
