import { complex, refractiveIndex } from '../../../shared/optics/complex';
import {
  bandSamples,
  contrastAt,
  contrastFromReflectances,
  contrastSpectrum,
  contrastUnder,
  type FlakeOnSubstrate,
  predictionDatasets,
  reflectances,
  RGB_BANDS,
  rgbContrast,
  type Substrate,
  substrateStack,
} from '../../../shared/optics/contrast';
import { FLAKE_MATERIALS, FUSED_SILICA } from '../../../shared/optics/materials';
import { stackResponse, stackReflectance } from '../../../shared/optics/thin-film';

const onOxide = (oxideThicknessNm: number): Substrate => ({ kind: 'oxide-on-silicon', oxideThicknessNm });
const monolayer = (material: FlakeOnSubstrate['material'], substrate: Substrate): FlakeOnSubstrate => ({
  material,
  layers: 1,
  substrate,
});
const range = (fromNm: number, toNm: number, stepNm = 5): number[] =>
  Array.from({ length: Math.floor((toNm - fromNm) / stepNm) + 1 }, (_, i) => fromNm + i * stepNm);

/** Contrast of a film of given index and thickness on a substrate, straight from the thin-film module. */
function contrastOfFilm(
  index: ReturnType<typeof refractiveIndex>,
  thicknessNm: number,
  substrate: Substrate,
  wavelengthNm: number,
) {
  const { layers, substrateIndex } = substrateStack(substrate, wavelengthNm);
  return contrastFromReflectances(
    stackReflectance(wavelengthNm, layers, substrateIndex),
    stackReflectance(wavelengthNm, [{ index, thicknessNm }, ...layers], substrateIndex),
  );
}

describe('sign convention', () => {
  // C = (R_substrate − R_flake) / R_substrate, as Blake et al. (2007) define it.
  it('is positive when the flake is darker than the substrate', () => {
    expect(contrastFromReflectances(0.4, 0.3)).toBeCloseTo(0.25, 15);
    expect(contrastFromReflectances(0.4, 0.5)).toBeCloseTo(-0.25, 15);
    expect(() => contrastFromReflectances(0, 0.1)).toThrow(RangeError);
  });

  it('is zero for zero layers', () => {
    expect(contrastAt({ material: 'graphene', layers: 0, substrate: onOxide(285) }, 550)).toBe(0);
  });
});

describe('graphene on SiO2/Si (Blake et al., Appl. Phys. Lett. 91, 063124, 2007)', () => {
  // Computed from published inputs — Blake's graphene index n = 2.6 − 1.3i and thickness 0.34 nm,
  // Malitson's SiO2, Green's Si — qualitative comparison with Blake et al. Fig. 2/3: on ~300 nm
  // oxide the contrast peaks at roughly 10 % in the 550–600 nm range (flake darker).
  it("with Blake's own index, peaks at about 0.1 near 550–625 nm on 300 nm oxide", () => {
    const blakeIndex = refractiveIndex(2.6, 1.3);
    const spectrum = range(400, 750).map((wavelengthNm) => ({
      wavelengthNm,
      contrast: contrastOfFilm(blakeIndex, 0.34, onOxide(300), wavelengthNm),
    }));
    const peak = spectrum.reduce((best, point) => (point.contrast > best.contrast ? point : best));
    expect(peak.wavelengthNm).toBeGreaterThanOrEqual(550);
    expect(peak.wavelengthNm).toBeLessThanOrEqual(625);
    expect(peak.contrast).toBeGreaterThan(0.08);
    expect(peak.contrast).toBeLessThan(0.18);
  });

  // Same comparison with the product's graphene dataset (Weber et al. 2010).
  it('with the Weber 2010 dataset, peaks at about 0.1 near 550–625 nm on 300 nm oxide', () => {
    const spectrum = contrastSpectrum(monolayer('graphene', onOxide(300)));
    const peak = spectrum.reduce((best, point) => (point.contrast > best.contrast ? point : best));
    expect(peak.wavelengthNm).toBeGreaterThanOrEqual(550);
    expect(peak.wavelengthNm).toBeLessThanOrEqual(625);
    expect(peak.contrast).toBeGreaterThan(0.08);
    expect(peak.contrast).toBeLessThan(0.18);
  });

  // Blake et al.: on ~200 nm oxide graphene nearly disappears in green light.
  it('nearly vanishes on 200 nm oxide in green light', () => {
    for (const wavelengthNm of range(530, 600, 10)) {
      expect(Math.abs(contrastAt(monolayer('graphene', onOxide(200)), wavelengthNm))).toBeLessThan(0.02);
      expect(Math.abs(contrastOfFilm(refractiveIndex(2.6, 1.3), 0.34, onOxide(200), wavelengthNm))).toBeLessThan(0.02);
    }
    expect(Math.abs(contrastUnder(monolayer('graphene', onOxide(200)), RGB_BANDS.green))).toBeLessThan(0.02);
  });

  // Blake et al.: ~90–100 nm oxide also makes graphene clearly visible (their abstract names
  // ≈100 nm as especially suitable).
  it('is clearly visible on 90 nm oxide in green light', () => {
    for (const wavelengthNm of range(520, 600, 10)) {
      expect(contrastAt(monolayer('graphene', onOxide(90)), wavelengthNm)).toBeGreaterThan(0.08);
    }
    expect(contrastUnder(monolayer('graphene', onOxide(90)), RGB_BANDS.green)).toBeGreaterThan(0.1);
  });

  // Few-layer graphene gets steadily darker with each added layer on standard oxide in green light
  // (Blake et al.; Ni et al., Nano Lett. 7, 2758, 2007, from memory).
  it('darkens with every added layer in green light on 285 nm oxide', () => {
    const contrasts = [1, 2, 3, 4, 5].map((layers) =>
      contrastUnder({ material: 'graphene', layers, substrate: onOxide(285) }, RGB_BANDS.green),
    );
    for (let i = 1; i < contrasts.length; i += 1) expect(contrasts[i]).toBeGreaterThan(contrasts[i - 1] + 0.03);
  });
});

describe('graphene dataset against the universal optical conductance', () => {
  // Free-standing graphene absorbs πα ≈ 2.3 % of visible light (Nair et al., Science 320, 1308,
  // 2008). Weber's ellipsometric constants give slightly more toward the blue, so the band is loose.
  it('absorbs about 2.3 % when free-standing', () => {
    for (const wavelengthNm of [500, 550, 600, 650]) {
      const film = {
        index: FLAKE_MATERIALS.graphene.index(wavelengthNm),
        thicknessNm: FLAKE_MATERIALS.graphene.layerThicknessNm,
      };
      const response = stackResponse(wavelengthNm, [film], complex(1));
      const absorbed = 1 - response.reflectance - response.transmittance;
      expect(absorbed).toBeGreaterThan(0.02);
      expect(absorbed).toBeLessThan(0.03);
    }
  });

  // A conducting sheet of sheet admittance πα (in free-space units) on a substrate of index n_s
  // reflects r = (1 − n_s − πα)/(1 + n_s + πα) (thin-sheet limit; Nair et al. 2008 for πα). On
  // fused quartz this makes graphene about 8 % brighter than bare substrate.
  it('makes graphene on quartz about 8 % brighter than the bare quartz', () => {
    const wavelengthNm = 550;
    const substrateIndex = FUSED_SILICA.index(wavelengthNm).re;
    const piAlpha = Math.PI / 137.036;
    const sheet = ((substrateIndex - 1 + piAlpha) / (substrateIndex + 1 + piAlpha)) ** 2;
    const bare = ((substrateIndex - 1) / (substrateIndex + 1)) ** 2;
    const thinSheetContrast = (bare - sheet) / bare;
    expect(thinSheetContrast).toBeCloseTo(-0.082, 2);
    const predicted = contrastAt(monolayer('graphene', { kind: 'quartz' }), wavelengthNm);
    expect(predicted).toBeLessThan(0);
    expect(Math.abs(predicted - thinSheetContrast)).toBeLessThan(0.02);
  });
});

describe('MoS2 monolayer on SiO2/Si (Benameur et al., Nanotechnology 22, 125706, 2011)', () => {
  // Benameur et al. found single layers visible on both 90 nm and 270 nm oxide, the flake darker
  // than the substrate in green–orange light. They quote such contrast as negative (their sign is
  // flake minus substrate, from memory); here darker is positive. Magnitudes of a few tenths are
  // computed from Hsu et al. 2019 constants; the bounds are loose on purpose.
  it.each([90, 270])('is darker than the substrate at 560–620 nm on %i nm oxide', (oxideThicknessNm) => {
    for (const wavelengthNm of range(560, 620, 10)) {
      const contrast = contrastAt(monolayer('MoS2', onOxide(oxideThicknessNm)), wavelengthNm);
      expect(contrast).toBeGreaterThan(0.1);
      expect(contrast).toBeLessThan(0.7);
    }
  });

  // Benameur et al. imaged with broadband green illumination / the camera's green channel.
  it.each([90, 270])('has clear positive contrast in the green channel on %i nm oxide', (oxideThicknessNm) => {
    const green = contrastUnder(monolayer('MoS2', onOxide(oxideThicknessNm)), RGB_BANDS.green);
    expect(green).toBeGreaterThan(0.1);
    expect(green).toBeLessThan(0.6);
  });
});

describe('hBN monolayer (Gorbachev et al., Small 7, 465, 2011)', () => {
  // Monolayer hBN is nearly invisible on standard oxide: contrast of a few percent at best
  // (Gorbachev et al. 2011, from memory).
  it('has at most a few percent contrast on 285 nm oxide', () => {
    for (const point of contrastSpectrum(monolayer('hBN', onOxide(285)))) {
      expect(Math.abs(point.contrast)).toBeLessThan(0.04);
    }
  });
});

describe('substrates', () => {
  // Normal-incidence Fresnel reflectance of a transparent half-space, ((n−1)/(n+1))² (Hecht).
  it('models quartz as semi-infinite fused silica and sapphire as its ordinary index', () => {
    const n = FUSED_SILICA.index(550).re;
    const { bareSubstrate } = reflectances(monolayer('graphene', { kind: 'quartz' }), 550);
    expect(bareSubstrate).toBeCloseTo(((n - 1) / (n + 1)) ** 2, 14);
    expect(substrateStack({ kind: 'sapphire' }, 550).layers).toHaveLength(0);
  });

  it('with no oxide, is bare silicon', () => {
    const stack = substrateStack(onOxide(0), 600);
    expect(stackReflectance(600, stack.layers, stack.substrateIndex)).toBeCloseTo(
      stackReflectance(600, [], stack.substrateIndex),
      14,
    );
  });

  it('lists the datasets a prediction uses', () => {
    expect(predictionDatasets('MoS2', onOxide(90)).map((dataset) => dataset.id)).toEqual([
      'MoS2-Hsu-2019-1L',
      'SiO2-Malitson-1965',
      'Si-Green-2008',
    ]);
    expect(predictionDatasets('graphene', { kind: 'sapphire' }).map((dataset) => dataset.id)).toEqual([
      'C-Weber-2010',
      'Al2O3-Malitson-Dodge-1972-o',
    ]);
  });
});

describe('illumination bands', () => {
  it('averages reflectances (not contrasts) over a flat band by the trapezoid rule', () => {
    const flake = monolayer('graphene', onOxide(285));
    const wavelengths = range(500, 600);
    const weights = wavelengths.map((_, i) => (i === 0 || i === wavelengths.length - 1 ? 0.5 : 1) / (wavelengths.length - 1));
    let bare = 0;
    let covered = 0;
    wavelengths.forEach((wavelengthNm, i) => {
      const pair = reflectances(flake, wavelengthNm);
      bare += weights[i] * pair.bareSubstrate;
      covered += weights[i] * pair.withFlake;
    });
    expect(contrastUnder(flake, RGB_BANDS.green)).toBeCloseTo((bare - covered) / bare, 14);
  });

  it('reduces to a single wavelength for a zero-width band or a filter line', () => {
    const flake = monolayer('WS2', onOxide(285));
    expect(contrastUnder(flake, { kind: 'band', fromNm: 532, toNm: 532 })).toBeCloseTo(contrastAt(flake, 532), 14);
    expect(contrastUnder(flake, { kind: 'wavelength', wavelengthNm: 532 })).toBe(contrastAt(flake, 532));
  });

  it('samples every 5 nm or finer with weights summing to 1', () => {
    const { wavelengthsNm, weights } = bandSamples(600, 700);
    expect(wavelengthsNm).toHaveLength(21);
    expect(weights.reduce((sum, weight) => sum + weight, 0)).toBeCloseTo(1, 14);
    expect(bandSamples(512, 547).wavelengthsNm).toHaveLength(8);
  });

  it('gives red, green and blue from the flat thirds of the visible', () => {
    const flake = monolayer('WSe2', onOxide(90));
    const rgb = rgbContrast(flake);
    expect(rgb.red).toBe(contrastUnder(flake, { kind: 'band', fromNm: 600, toNm: 700 }));
    expect(rgb.green).toBe(contrastUnder(flake, { kind: 'band', fromNm: 500, toNm: 600 }));
    expect(rgb.blue).toBe(contrastUnder(flake, { kind: 'band', fromNm: 400, toNm: 500 }));
  });

  it('covers 400–750 nm every 5 nm by default', () => {
    const spectrum = contrastSpectrum(monolayer('MoSe2', onOxide(285)));
    expect(spectrum).toHaveLength(71);
    expect(spectrum[0].wavelengthNm).toBe(400);
    expect(spectrum[70].wavelengthNm).toBe(750);
  });
});

describe('input checks', () => {
  it('refuses impossible layer counts, oxides and wavelengths', () => {
    expect(() => contrastAt({ material: 'MoS2', layers: 1.5, substrate: onOxide(90) }, 550)).toThrow(RangeError);
    expect(() => contrastAt({ material: 'MoS2', layers: -1, substrate: onOxide(90) }, 550)).toThrow(RangeError);
    expect(() => contrastAt(monolayer('MoS2', onOxide(-5)), 550)).toThrow(RangeError);
    expect(() => contrastAt(monolayer('MoS2', onOxide(90)), 800)).toThrow(RangeError);
    expect(() => contrastUnder(monolayer('MoS2', onOxide(90)), { kind: 'band', fromNm: 350, toNm: 450 })).toThrow(RangeError);
  });
});
