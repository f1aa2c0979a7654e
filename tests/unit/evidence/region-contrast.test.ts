import { analyzeRegionContrast } from '../../../shared/evidence/region-contrast';
import { rgbContrast } from '../../../shared/optics/contrast';
import { ContrastAnalysis, type Region } from '../../../shared/schemas/evidence-analysis';
import { bandReflectance, paintMicrograph } from './micrograph-painter';

const substrate = { kind: 'oxide-on-silicon', oxideThicknessNm: 285 } as const;
const WIDTH = 400;
const HEIGHT = 300;
// Exposure chosen so the bare substrate sits around 150–220 of 255.
const gain = { red: 600, green: 900, blue: 500 };

function image(srgb = false) {
  return paintMicrograph({
    width: WIDTH,
    height: HEIGHT,
    material: 'MoS2',
    substrate,
    gain,
    noise: 3,
    seed: 21,
    srgb,
    patches: [
      { layers: 1, x: 20, y: 20, width: 80, height: 60 },
      { layers: 2, x: 150, y: 20, width: 80, height: 60 },
      { layers: 3, x: 280, y: 20, width: 80, height: 60 },
    ],
  });
}

const bare = { shape: 'box', x: 20, y: 180, width: 200, height: 80 } as const;

describe('analyzeRegionContrast on a micrograph painted with predicted reflectances', () => {
  it('paints a sensible substrate', () => {
    const r = bandReflectance('MoS2', 0, substrate);
    expect(r.green * gain.green).toBeGreaterThan(100);
    expect(r.green * gain.green).toBeLessThan(255);
  });

  const cases: [number, Region][] = [
    [1, { shape: 'box', x: 30, y: 30, width: 60, height: 40 }],
    [
      2,
      {
        shape: 'points',
        points: [
          { x: 170, y: 40 },
          { x: 200, y: 55 },
        ],
        radiusPx: 12,
      },
    ],
    [3, { shape: 'box', x: 290, y: 25, width: 60, height: 50 }],
  ];
  it.each(cases)('finds %i layer(s) clearly, with the measured contrast on the prediction', (layers, flakeRegion) => {
    const analysis = analyzeRegionContrast({
      rgba: image(),
      width: WIDTH,
      height: HEIGHT,
      flakeRegion,
      substrateRegion: bare,
      material: 'MoS2',
      substrate,
    });
    expect(ContrastAnalysis.parse(JSON.parse(JSON.stringify(analysis)))).toEqual(analysis);
    const predicted = rgbContrast({ material: 'MoS2', layers, substrate });
    expect(Math.abs(analysis.measured.red - predicted.red)).toBeLessThan(0.01);
    expect(Math.abs(analysis.measured.green - predicted.green)).toBeLessThan(0.01);
    expect(Math.abs(analysis.measured.blue - predicted.blue)).toBeLessThan(0.01);
    expect(analysis).toMatchObject({ bestLayers: layers, confidence: 'clear', isPoorFit: false });
    expect(analysis.estimate).toMatchObject({ layers, uncertainty: 0, method: 'optical_contrast' });
    expect(analysis.predictions).toHaveLength(10);
    expect(analysis.datasets.map((dataset) => dataset.id)).toEqual(['MoS2-Hsu-2019-1L', 'SiO2-Malitson-1965', 'Si-Green-2008']);
  });

  it('linearises sRGB-encoded images when asked, and says when it did not', () => {
    const encoded = image(true);
    const flakeRegion = { shape: 'box', x: 30, y: 30, width: 60, height: 40 } as const;
    const decoded = analyzeRegionContrast({
      rgba: encoded,
      width: WIDTH,
      height: HEIGHT,
      flakeRegion,
      substrateRegion: bare,
      material: 'MoS2',
      substrate,
      encoding: 'srgb',
    });
    expect(decoded.bestLayers).toBe(1);
    expect(Math.abs(decoded.measured.red - rgbContrast({ material: 'MoS2', layers: 1, substrate }).red)).toBeLessThan(0.015);
    expect(decoded.notes).toEqual([]);
    const raw = analyzeRegionContrast({
      rgba: encoded,
      width: WIDTH,
      height: HEIGHT,
      flakeRegion,
      substrateRegion: bare,
      material: 'MoS2',
      substrate,
    });
    expect(raw.measured.red).toBeLessThan(decoded.measured.red - 0.05); // the gamma curve flattens contrast
    expect(raw.notes.join(' ')).toMatch(/used as recorded/);
  });

  it('refuses regions outside the image and a buffer of the wrong size', () => {
    const rgba = image();
    const outside = { shape: 'box', x: 1000, y: 10, width: 5, height: 5 } as const;
    expect(() =>
      analyzeRegionContrast({
        rgba,
        width: WIDTH,
        height: HEIGHT,
        flakeRegion: outside,
        substrateRegion: bare,
        material: 'MoS2',
        substrate,
      }),
    ).toThrow('The flake region lies outside the image.');
    const tiny = { shape: 'box', x: 30, y: 30, width: 2, height: 2 } as const;
    expect(() =>
      analyzeRegionContrast({
        rgba,
        width: WIDTH,
        height: HEIGHT,
        flakeRegion: tiny,
        substrateRegion: bare,
        material: 'MoS2',
        substrate,
      }),
    ).toThrow(/covers 4 pixels/);
    expect(() =>
      analyzeRegionContrast({
        rgba,
        width: WIDTH + 1,
        height: HEIGHT,
        flakeRegion: tiny,
        substrateRegion: bare,
        material: 'MoS2',
        substrate,
      }),
    ).toThrow(/buffer holds/);
  });

  it('notes overlapping regions', () => {
    const analysis = analyzeRegionContrast({
      rgba: image(),
      width: WIDTH,
      height: HEIGHT,
      flakeRegion: { shape: 'box', x: 30, y: 30, width: 60, height: 40 },
      substrateRegion: { shape: 'box', x: 80, y: 60, width: 100, height: 100 },
      material: 'MoS2',
      substrate,
    });
    expect(analysis.notes.join(' ')).toMatch(/overlap/);
  });
});
