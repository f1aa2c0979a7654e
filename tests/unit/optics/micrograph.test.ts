import { rgbContrast } from '../../../shared/optics/contrast';
import { matchLayerCount } from '../../../shared/optics/layer-count';
import { channelMeasurements, regionContrast, srgbToLinear } from '../../../shared/optics/micrograph';

describe('region contrast from mean RGB', () => {
  it('uses the same sign as the optics: a darker flake is positive', () => {
    const contrast = regionContrast({ red: 150, green: 90, blue: 120 }, { red: 200, green: 100, blue: 100 });
    expect(contrast.red).toBeCloseTo(0.25, 15);
    expect(contrast.green).toBeCloseTo(0.1, 15);
    expect(contrast.blue).toBeCloseTo(-0.2, 15);
  });

  // sRGB transfer function, IEC 61966-2-1:1999: linear segment V/12.92 below 0.04045, power
  // segment ((V + 0.055)/1.055)^2.4 above; the two meet at linear 0.0031308, the standard's constant.
  it('decodes sRGB with the published transfer function', () => {
    expect(srgbToLinear(0)).toBe(0);
    expect(srgbToLinear(1)).toBeCloseTo(1, 15);
    expect(srgbToLinear(0.04045)).toBeCloseTo(0.0031308, 7);
    expect(((0.04045 + 0.055) / 1.055) ** 2.4).toBeCloseTo(0.0031308, 7);
    // 8-bit mid grey 128 is about 21.6 % linear light (from the formula; commonly quoted).
    expect(srgbToLinear(128 / 255)).toBeCloseTo(0.2159, 4);
  });

  it('linearises sRGB pixel values before taking the ratio when asked', () => {
    const flake = { red: 128, green: 128, blue: 128 };
    const substrate = { red: 255, green: 255, blue: 255 };
    expect(regionContrast(flake, substrate).green).toBeCloseTo(1 - 128 / 255, 15);
    expect(regionContrast(flake, substrate, { encoding: 'srgb' }).green).toBeCloseTo(1 - srgbToLinear(128 / 255), 15);
    expect(
      regionContrast(
        { red: 0, green: 0, blue: 0 },
        { red: 65535, green: 65535, blue: 65535 },
        { encoding: 'srgb', fullScale: 65535 },
      ).red,
    ).toBe(1);
  });

  it('refuses a black substrate and out-of-range pixels', () => {
    const grey = { red: 100, green: 100, blue: 100 };
    expect(() => regionContrast(grey, { red: 100, green: 0, blue: 100 })).toThrow(RangeError);
    expect(() => regionContrast({ red: -1, green: 100, blue: 100 }, grey)).toThrow(RangeError);
    expect(() => regionContrast({ red: 300, green: 100, blue: 100 }, grey, { encoding: 'srgb' })).toThrow(RangeError);
  });

  // Round trip from a synthetic micrograph: substrate intensities times (1 − C) for a predicted
  // 3-layer WSe2 flake, back through region contrast and matching.
  it('feeds the layer-count match', () => {
    const substrate = { kind: 'oxide-on-silicon', oxideThicknessNm: 285 } as const;
    const predicted = rgbContrast({ material: 'WSe2', layers: 3, substrate });
    const bare = { red: 180, green: 150, blue: 120 };
    const flake = {
      red: bare.red * (1 - predicted.red),
      green: bare.green * (1 - predicted.green),
      blue: bare.blue * (1 - predicted.blue),
    };
    const measured = regionContrast(flake, bare);
    const match = matchLayerCount({ material: 'WSe2', substrate, measurements: channelMeasurements(measured) });
    expect(match.best.layers).toBe(3);
    expect(match.confidence).toBe('clear');
  });
});
