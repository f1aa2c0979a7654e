import { analyzeRaman } from '../../../shared/evidence/raman';
import { GRAPHENE_TURBOSTRATIC_NOTE } from '../../../shared/evidence/raman-rules';
import { RamanAnalysis } from '../../../shared/schemas/evidence-analysis';
import { type FlakeMaterialId } from '../../../shared/optics/materials';
import { syntheticSpectrum, type TruePeak } from './synthetic';

const SI: TruePeak = { centre: 520.7, fwhm: 3.5, height: 3000 };

interface Case {
  readonly material: FlakeMaterialId;
  readonly peaks: readonly TruePeak[];
  readonly range?: readonly [number, number];
  readonly laserNm?: number;
  readonly seed?: number;
}

function analyse({ material, peaks, range = [100, 600], laserNm, seed = 5 }: Case) {
  // Fluorescence-like background: strong, sloped and curved under the peaks; Gaussian noise σ = 8.
  const spectrum = syntheticSpectrum({
    from: range[0],
    to: range[1],
    points: 2000,
    peaks,
    noise: 8,
    seed,
    background: [2000, 900, -600],
  });
  const analysis = analyzeRaman(spectrum, { material, laserNm });
  // Every result is what the API stores and sends: it must survive JSON and match the shared schema.
  expect(RamanAnalysis.parse(JSON.parse(JSON.stringify(analysis)))).toEqual(analysis);
  return analysis;
}

function expectRecovered(analysis: ReturnType<typeof analyzeRaman>, label: string, truth: TruePeak) {
  const peak = analysis.peaks.find((candidate) => candidate.label === label);
  expect(peak).toBeDefined();
  expect(Math.abs(peak!.centre - truth.centre)).toBeLessThan(0.25);
  expect(Math.abs(peak!.fwhm / truth.fwhm - 1)).toBeLessThan(0.12);
  expect(Math.abs(peak!.height / truth.height - 1)).toBeLessThan(0.08);
}

function quantity(analysis: ReturnType<typeof analyzeRaman>, key: string): number {
  const found = analysis.quantities.find((q) => q.key === key);
  if (!found) throw new Error(`no quantity ${key}`);
  return found.value;
}

// Mode positions for 1–3 layers and bulk-like MoS2 chosen to give the separations reported by
// Lee et al., ACS Nano 4, 2695 (2010): ≈18.7, 21.4, 23.1, 25.3 cm⁻¹ (values as recalled, from memory).
describe('MoS2: A1g − E¹2g separation (Lee et al. 2010)', () => {
  const cases: [string, number, number, object][] = [
    ['monolayer', 384.9, 403.6, { layers: 1, uncertainty: 0 }],
    ['bilayer', 383.6, 405.0, { layers: 2, uncertainty: 0 }],
    ['trilayer (within 0.5 cm⁻¹ of both neighbours, so ±1)', 383.1, 406.2, { layers: 3, uncertainty: 1 }],
    ['bulk-like', 382.5, 407.8, { layers: 4, isLowerBound: true }],
  ];
  it.each(cases)('%s', (_, e2g, a1g, expected) => {
    const e: TruePeak = { centre: e2g, fwhm: 2.8, height: 700 };
    const a: TruePeak = { centre: a1g, fwhm: 4.2, height: 950 };
    const analysis = analyse({ material: 'MoS2', peaks: [e, a, SI] });
    expectRecovered(analysis, 'E¹2g', e);
    expectRecovered(analysis, 'A1g', a);
    expect(quantity(analysis, 'separation')).toBeCloseTo(a1g - e2g, 1);
    expect(analysis.estimate).toMatchObject({ method: 'raman', ...expected });
    expect(analysis.references[0].source).toMatch(/Lee et al\., ACS Nano 4, 2695/);
  });

  it('gives no call without both modes', () => {
    const analysis = analyse({ material: 'MoS2', peaks: [{ centre: 403.6, fwhm: 4.2, height: 950 }] });
    expect(analysis.estimate).toBeNull();
    expect(analysis.notes[0]).toMatch(/No E¹2g peak/);
  });
});

// Ferrari et al., PRL 97, 187401 (2006): monolayer 2D a single sharp Lorentzian (FWHM ≈ 24–30 cm⁻¹),
// several times taller than G; bilayer 2D broader, made of several components (from memory).
describe('graphene: 2D band and I(2D)/I(G) (Ferrari et al. 2006)', () => {
  const G: TruePeak = { centre: 1582, fwhm: 14, height: 500 };
  const range = [1100, 3000] as const;

  it('calls a monolayer from a single sharp 2D band over twice G, with the turbostratic caveat', () => {
    const band2D: TruePeak = { centre: 2679, fwhm: 27, height: 1500 };
    const analysis = analyse({ material: 'graphene', peaks: [G, band2D], range });
    expectRecovered(analysis, 'G', G);
    expectRecovered(analysis, '2D', band2D);
    expect(quantity(analysis, 'ratio_2d_g')).toBeCloseTo(3, 0);
    expect(analysis.estimate).toMatchObject({ layers: 1, uncertainty: 0 });
    expect(analysis.notes).toContain(GRAPHENE_TURBOSTRATIC_NOTE);
  });

  it('calls two or more from a bilayer-like 2D built of several components', () => {
    const components: TruePeak[] = [
      { centre: 2662, fwhm: 24, height: 200 },
      { centre: 2687, fwhm: 24, height: 600 },
      { centre: 2702, fwhm: 24, height: 380 },
    ];
    const analysis = analyse({ material: 'graphene', peaks: [{ ...G, height: 900 }, ...components], range });
    expect(quantity(analysis, 'fwhm_2d')).toBeGreaterThan(35);
    expect(analysis.estimate).toMatchObject({ layers: 2, isLowerBound: true });
  });

  it('hedges a narrow 2D band that is weaker than a monolayer’s, and notes a D peak', () => {
    const analysis = analyse({
      material: 'graphene',
      peaks: [{ centre: 1345, fwhm: 30, height: 150 }, G, { centre: 2685, fwhm: 28, height: 700 }],
      range,
    });
    expect(analysis.estimate).toMatchObject({ layers: 1, uncertainty: 1 });
    expect(analysis.peaks.some((peak) => peak.label === 'D')).toBe(true);
    expect(analysis.notes.join(' ')).toMatch(/D peak is present/);
  });
});

// Gorbachev et al., Small 7, 465 (2011): E2g ≈ 1366 cm⁻¹ in bulk, monolayer blue-shifted by up to ≈ 4 cm⁻¹ (from memory).
describe('hBN: E2g position (Gorbachev et al. 2011)', () => {
  const range = [400, 1600] as const;

  it('calls a weak, blue-shifted E2g a monolayer (±1: strain shifts it too)', () => {
    const e2g: TruePeak = { centre: 1369.8, fwhm: 12, height: 150 };
    const analysis = analyse({ material: 'hBN', peaks: [SI, e2g], range });
    expectRecovered(analysis, 'E2g', e2g);
    expect(analysis.estimate).toMatchObject({ layers: 1, uncertainty: 1 });
  });

  it('corrects the axis with the silicon line before applying the thresholds', () => {
    // Everything shifted +2 cm⁻¹ (a miscalibrated spectrometer): bulk E2g appears at 1367.8.
    const shifted = analyse({
      material: 'hBN',
      peaks: [
        { ...SI, centre: 522.7 },
        { centre: 1367.8, fwhm: 8, height: 2500 },
      ],
      range,
    });
    expect(quantity(shifted, 'position_e2g')).toBeCloseTo(1365.8, 1);
    expect(shifted.estimate).toMatchObject({ layers: 2, isLowerBound: true });
    // Without the Si line the thresholds widen and 1367.8 stays undecided.
    const uncalibrated = analyse({ material: 'hBN', peaks: [{ centre: 1367.8, fwhm: 8, height: 2500 }], range: [1000, 1600] });
    expect(uncalibrated.estimate).toBeNull();
    expect(uncalibrated.notes.join(' ')).toMatch(/No silicon line/);
  });
});

// Berkdemir et al., Sci. Rep. 3, 1755 (2013): I(2LA)/I(A1g) ≈ 2.2 in a monolayer under green light,
// A1g ≈ 417.5 cm⁻¹ (1L) to ≈ 420.5 (bulk) (from memory).
describe('WS2: 2LA/A1g ratio and A1g position (Berkdemir et al. 2013)', () => {
  const monolayer: TruePeak[] = [
    { centre: 350.5, fwhm: 9, height: 2000 },
    { centre: 356.5, fwhm: 4, height: 600 },
    { centre: 417.7, fwhm: 4.5, height: 900 },
    SI,
  ];

  it('calls a monolayer when both signs agree under a 532 nm laser', () => {
    const analysis = analyse({ material: 'WS2', peaks: monolayer, laserNm: 532 });
    expectRecovered(analysis, 'A1g', monolayer[2]);
    expect(quantity(analysis, 'ratio_2la_a1g')).toBeGreaterThan(1.8);
    expect(analysis.estimate).toMatchObject({ layers: 1, uncertainty: 0 });
  });

  it('uses only the A1g position (±1) when the laser is not given', () => {
    const analysis = analyse({ material: 'WS2', peaks: monolayer });
    expect(analysis.estimate).toMatchObject({ layers: 1, uncertainty: 1 });
    expect(analysis.notes.join(' ')).toMatch(/510–535 nm lasers only/);
  });

  it('calls two or more for a weak 2LA band and a stiffer A1g', () => {
    const analysis = analyse({
      material: 'WS2',
      peaks: [
        { centre: 351, fwhm: 9, height: 700 },
        { centre: 356, fwhm: 4, height: 650 },
        { centre: 420.4, fwhm: 4, height: 1000 },
        SI,
      ],
      laserNm: 532,
    });
    expect(analysis.estimate).toMatchObject({ layers: 2, isLowerBound: true, uncertainty: 0 });
  });
});

// Tonndorf et al., Opt. Express 21, 4908 (2013): the interlayer B¹2g mode (≈308 cm⁻¹ WSe2,
// ≈353 cm⁻¹ MoSe2) is absent in monolayers (from memory).
describe('WSe2 and MoSe2: the interlayer B¹2g mode (Tonndorf et al. 2013)', () => {
  it('WSe2: no B¹2g with low noise is a monolayer; a B¹2g means two or more', () => {
    const main: TruePeak = { centre: 249.6, fwhm: 4, height: 1500 };
    const twoLA: TruePeak = { centre: 259, fwhm: 8, height: 450 };
    const single = analyse({ material: 'WSe2', peaks: [main, twoLA] });
    expectRecovered(single, 'E¹2g/A1g', main);
    expect(single.estimate).toMatchObject({ layers: 1, uncertainty: 0 });
    const b2g: TruePeak = { centre: 308.4, fwhm: 4, height: 110 };
    const bilayer = analyse({ material: 'WSe2', peaks: [main, twoLA, b2g] });
    expectRecovered(bilayer, 'B¹2g', b2g);
    expect(bilayer.estimate).toMatchObject({ layers: 2, isLowerBound: true });
  });

  it('MoSe2: the same rule at 353 cm⁻¹; a weak main peak leaves ±1', () => {
    const a1g: TruePeak = { centre: 240.8, fwhm: 4, height: 1500 };
    expect(analyse({ material: 'MoSe2', peaks: [a1g, { centre: 286.5, fwhm: 6, height: 120 }] }).estimate).toMatchObject({
      layers: 1,
      uncertainty: 0,
    });
    expect(
      analyse({
        material: 'MoSe2',
        peaks: [
          { ...a1g, centre: 241.8 },
          { centre: 352.6, fwhm: 4, height: 90 },
        ],
      }).estimate,
    ).toMatchObject({
      layers: 2,
      isLowerBound: true,
    });
    // Main peak only 20 σ tall: a B¹2g below 4σ (20 %) could hide in the noise.
    expect(analyse({ material: 'MoSe2', peaks: [{ ...a1g, height: 160 }] }).estimate).toMatchObject({
      layers: 1,
      uncertainty: 1,
    });
  });
});

describe('analyzeRaman input', () => {
  it('says when the spectrum does not reach the material’s modes', () => {
    const analysis = analyse({ material: 'graphene', peaks: [SI], range: [100, 700] });
    expect(analysis.estimate).toBeNull();
    expect(analysis.notes.join(' ')).toMatch(/does not cover 1250–1700 cm⁻¹/);
  });

  it('refuses mismatched or too short data', () => {
    expect(() => analyzeRaman({ x: [1, 2, 3], y: [1, 2] }, { material: 'MoS2' })).toThrow(/3 x values but 2 y values/);
    expect(() => analyzeRaman({ x: [1, 2, 3], y: [1, 2, 3] }, { material: 'MoS2' })).toThrow(/at least 20/);
  });
});
