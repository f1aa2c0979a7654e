import { findLayerCandidates, WORKING_MAX_PIXELS } from '../../../shared/evidence/candidates';
import { rgbContrast } from '../../../shared/optics/contrast';
import { CandidateAnalysis } from '../../../shared/schemas/evidence-analysis';
import { paintMicrograph, type Patch } from './micrograph-painter';

const substrate = { kind: 'oxide-on-silicon', oxideThicknessNm: 285 } as const;
const gain = { red: 600, green: 900, blue: 500 };
const UM_PER_PIXEL = 0.25;

// A 3 MP chip image: a monolayer and a bilayer patch of known size, a thick (8-layer) flake whose
// edges must not turn into candidates, and a 12 % illumination fall-off towards the corners.
const WIDTH = 2000;
const HEIGHT = 1500;
const MONOLAYER: Patch = { layers: 1, x: 301, y: 250, width: 300, height: 200 };
const BILAYER: Patch = { layers: 2, x: 1200, y: 900, width: 150, height: 400 };
const THICK: Patch = { layers: 8, x: 1400, y: 200, width: 350, height: 300 };

const CHIP = paintMicrograph({
  width: WIDTH,
  height: HEIGHT,
  material: 'MoS2',
  substrate,
  gain,
  noise: 4,
  seed: 77,
  patches: [MONOLAYER, BILAYER, THICK],
  illumination: (x, y) => 1 - (0.12 * (((x - WIDTH / 2) / (WIDTH / 2)) ** 2 + ((y - HEIGHT / 2) / (HEIGHT / 2)) ** 2)) / 2,
});

const areaUm2 = (patch: Patch) => patch.width * patch.height * UM_PER_PIXEL ** 2;

describe('findLayerCandidates', () => {
  const analysis = findLayerCandidates({
    rgba: CHIP,
    width: WIDTH,
    height: HEIGHT,
    umPerPixel: UM_PER_PIXEL,
    material: 'MoS2',
    substrate,
  });

  it('returns JSON the shared schema accepts', () => {
    expect(CandidateAnalysis.parse(JSON.parse(JSON.stringify(analysis)))).toEqual(analysis);
  });

  it('finds exactly the monolayer and the bilayer, with their areas, positions and contrast', () => {
    expect(analysis.candidates.map((candidate) => candidate.layers)).toEqual([1, 2]);
    const [monolayer, bilayer] = analysis.candidates;
    // Edges are uncertain by half a working pixel: 1 image pixel here, ≈ 2 % of these areas.
    expect(Math.abs(monolayer.areaUm2 / areaUm2(MONOLAYER) - 1)).toBeLessThan(0.03);
    expect(Math.abs(bilayer.areaUm2 / areaUm2(BILAYER) - 1)).toBeLessThan(0.03);
    expect(monolayer.centroidPx.x).toBeCloseTo(MONOLAYER.x + MONOLAYER.width / 2, -1);
    expect(monolayer.centroidPx.y).toBeCloseTo(MONOLAYER.y + MONOLAYER.height / 2, -1);
    expect(Math.abs(bilayer.boxPx.x - BILAYER.x)).toBeLessThanOrEqual(analysis.blockSize);
    expect(Math.abs(bilayer.boxPx.height - BILAYER.height)).toBeLessThanOrEqual(2 * analysis.blockSize);
    const predicted = rgbContrast({ material: 'MoS2', layers: 1, substrate });
    expect(Math.abs(monolayer.meanContrast.red - predicted.red)).toBeLessThan(0.02);
    expect(analysis.totalFound).toBe(2);
  });

  it('works on a block-averaged grid and reports the area resolution', () => {
    expect(analysis.blockSize).toBe(2);
    expect(analysis.workingWidth * analysis.workingHeight).toBeLessThanOrEqual(WORKING_MAX_PIXELS);
    expect(analysis.workingPixelAreaUm2).toBeCloseTo((2 * UM_PER_PIXEL) ** 2, 12);
    expect(analysis.notes[0]).toMatch(/2 × 2 image pixels \(0\.50 µm a side\)/);
  });

  it('uses windows around the predicted 1- and 2-layer contrast that do not overlap', () => {
    const [one, two] = analysis.windows;
    expect(one.predicted).toEqual(rgbContrast({ material: 'MoS2', layers: 1, substrate }));
    for (const channel of ['red', 'green', 'blue'] as const) {
      const gap = Math.abs(two.predicted[channel] - one.predicted[channel]);
      expect(one.tolerance[channel]).toBeGreaterThanOrEqual(0.02);
      if (gap > 0.04) expect(one.tolerance[channel] + two.tolerance[channel]).toBeLessThanOrEqual(gap + 1e-12);
    }
  });

  it('keeps the largest first and cuts the list at maxCandidates', () => {
    const limited = findLayerCandidates({
      rgba: CHIP,
      width: WIDTH,
      height: HEIGHT,
      umPerPixel: UM_PER_PIXEL,
      material: 'MoS2',
      substrate,
      maxCandidates: 1,
    });
    expect(limited.candidates).toHaveLength(1);
    expect(limited.totalFound).toBe(2);
  });

  it('finds nothing on bare substrate, and refuses a missing calibration', () => {
    const bare = paintMicrograph({ width: 600, height: 400, material: 'MoS2', substrate, gain, noise: 4, seed: 3, patches: [] });
    expect(
      findLayerCandidates({ rgba: bare, width: 600, height: 400, umPerPixel: 1, material: 'MoS2', substrate }).candidates,
    ).toEqual([]);
    expect(() =>
      findLayerCandidates({ rgba: bare, width: 600, height: 400, umPerPixel: 0, material: 'MoS2', substrate }),
    ).toThrow(/positive µm per pixel/);
  });

  it('handles a 12-megapixel image on a grid of at most 1.5 MP', () => {
    const width = 4000;
    const height = 3000;
    const big = paintMicrograph({
      width,
      height,
      material: 'graphene',
      substrate,
      gain,
      noise: 0,
      seed: 1,
      patches: [{ layers: 1, x: 1000, y: 1000, width: 600, height: 450 }],
    });
    const began = performance.now();
    const result = findLayerCandidates({ rgba: big, width, height, umPerPixel: 0.1, material: 'graphene', substrate });
    const elapsed = performance.now() - began;
    expect(result.blockSize).toBe(3);
    expect(result.candidates).toHaveLength(1);
    expect(Math.abs(result.candidates[0].areaUm2 / (600 * 450 * 0.01) - 1)).toBeLessThan(0.03);
    // Well under a second on an idle 2-core machine (see the closing note); generous here for shared CI.
    expect(elapsed).toBeLessThan(5000);
  });
});
