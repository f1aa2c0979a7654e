import { analyzeAfmProfile, DEFAULT_OFFSET_NM, interlayerSpacingNm } from '../../../shared/evidence/afm';
import { AfmAnalysis } from '../../../shared/schemas/evidence-analysis';
import { evenGrid, gaussianNoise } from './synthetic';

/** A line profile across terraces: [start µm, height nm] pairs, a tilt, Gaussian noise and optional spikes. */
function profile(
  terraces: [number, number][],
  options: { tiltNmPerUm: number; noiseNm: number; seed: number; spikes?: number[] },
) {
  const x = evenGrid(0, 10, 600);
  const noise = gaussianNoise(options.seed);
  const y = x.map((position, i) => {
    let height = 0;
    for (const [from, level] of terraces) if (position >= from) height = level;
    const spike = options.spikes?.includes(i) ? 6 : 0;
    return 12 + options.tiltNmPerUm * position + height + spike + options.noiseNm * noise();
  });
  return { x, y };
}

function analyse(...args: Parameters<typeof analyzeAfmProfile>) {
  const analysis = analyzeAfmProfile(...args);
  expect(AfmAnalysis.parse(JSON.parse(JSON.stringify(analysis)))).toEqual(analysis);
  return analysis;
}

describe('interlayer spacings', () => {
  // c/2 of the bulk crystals (from memory, as recorded beside the optics constants).
  it('uses the layer thicknesses of the optics data', () => {
    expect(interlayerSpacingNm('MoS2').spacingNm).toBe(0.615);
    expect(interlayerSpacingNm('graphene').spacingNm).toBe(0.335);
    expect(interlayerSpacingNm('hBN').spacingNm).toBe(0.333);
    expect(interlayerSpacingNm('WSe2').source).toMatch(/from memory/);
  });
});

describe('analyzeAfmProfile', () => {
  it('fits two levels through noise, tilt and dust spikes, where max − min would fail', () => {
    const data = profile(
      [
        [0, 0],
        [4.2, 0.8],
      ],
      { tiltNmPerUm: 0.15, noiseNm: 0.08, seed: 1, spikes: [100, 101, 450] },
    );
    const analysis = analyse(data, { material: 'MoS2' });
    expect(analysis.slopeNmPerUm).toBeCloseTo(0.15, 2);
    expect(analysis.levels).toHaveLength(2);
    expect(analysis.steps[0]).toMatchObject({ kind: 'substrate', layers: 1 });
    expect(Math.abs(analysis.steps[0].heightNm - 0.8)).toBeLessThan(0.03);
    expect(analysis.levels[1].fromUm).toBeGreaterThan(4.1);
    expect(analysis.noiseNm).toBeCloseTo(0.08, 1);
    expect(analysis.estimate).toMatchObject({ method: 'afm', layers: 1, uncertainty: 0 });
    // The naive reading: spikes and tilt make max − min about 8 nm, a dozen "layers".
    expect(Math.max(...data.y) - Math.min(...data.y)).toBeGreaterThan(6);
  });

  it('counts terrace-to-terrace steps without the offset, and says so in the basis', () => {
    // Graphene: first step 0.70 nm (0.335 nm plus adsorbates), then one more layer of 0.335 nm.
    const analysis = analyse(
      profile(
        [
          [0, 0],
          [3, 0.7],
          [6.5, 1.035],
        ],
        { tiltNmPerUm: -0.08, noiseNm: 0.04, seed: 2 },
      ),
      { material: 'graphene' },
    );
    expect(analysis.levels.map((level) => level.layers)).toEqual([0, 1, 2]);
    expect(analysis.steps.map((step) => step.kind)).toEqual(['substrate', 'layer']);
    expect(Math.abs(analysis.steps[1].heightNm - 0.335)).toBeLessThan(0.02);
    expect(analysis.steps[1].layers).toBe(1);
    // With the default ±0.3 nm offset range a 0.335 nm layer cannot be pinned from the first step alone.
    expect(analysis.estimate).toMatchObject({ layers: 1, uncertainty: 1 });
    expect(analysis.estimate!.basis).toMatch(/terrace-to-terrace steps \(no offset, firmer\): 0\.3\d nm \(1 layer\)/);
  });

  it('counts a thicker terrace and takes the offset as a parameter', () => {
    // MoS2 bilayer then trilayer: first step 1.5 nm, then 0.615 nm.
    const data = profile(
      [
        [0, 0],
        [2.5, 1.5],
        [7, 2.115],
      ],
      { tiltNmPerUm: 0.05, noiseNm: 0.05, seed: 3 },
    );
    const analysis = analyse(data, { material: 'MoS2' });
    expect(analysis.offsetNm).toBe(DEFAULT_OFFSET_NM);
    expect(analysis.levels.map((level) => level.layers)).toEqual([0, 2, 3]);
    expect(analysis.estimate).toMatchObject({ layers: 2 });
    // A measured offset of 0.9 nm (a wet, adsorbate-covered chip) makes the same step one layer.
    const wet = analyse(data, { material: 'MoS2', offsetNm: 0.9 });
    expect(wet.offsetUncertaintyNm).toBe(0.1);
    expect(wet.estimate).toMatchObject({ layers: 1, uncertainty: 0 });
  });

  it('separates a monolayer step from noise of a sixth of its height, whatever the noise draw', () => {
    for (let seed = 10; seed < 30; seed += 1) {
      const analysis = analyse(
        profile(
          [
            [0, 0],
            [6, 0.8],
          ],
          { tiltNmPerUm: 0.3, noiseNm: 0.12, seed },
        ),
        { material: 'MoS2' },
      );
      expect(analysis.levels.map((level) => level.layers)).toEqual([0, 1]);
      expect(Math.abs(analysis.steps[0].heightNm - 0.8)).toBeLessThan(0.1);
    }
  });

  it('gives no call for a profile with a single level', () => {
    const analysis = analyse(profile([[0, 0]], { tiltNmPerUm: 0.3, noiseNm: 0.1, seed: 4 }), { material: 'WS2' });
    expect(analysis.levels).toHaveLength(1);
    expect(analysis.estimate).toBeNull();
    expect(analysis.notes[0]).toMatch(/one flat level/);
  });

  it('refuses unsorted points', () => {
    const x = evenGrid(0, 1, 30);
    x[5] = 0.01;
    expect(() => analyzeAfmProfile({ x, y: x.map(() => 1) }, { material: 'MoS2' })).toThrow(/must rise strictly/);
  });
});
