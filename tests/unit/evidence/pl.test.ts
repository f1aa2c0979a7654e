import { analyzePl, evToNm, HC_EV_NM, nmToEv } from '../../../shared/evidence/pl';
import { PlAnalysis } from '../../../shared/schemas/evidence-analysis';
import { syntheticSpectrum, type TruePeak } from './synthetic';

describe('photon energy and wavelength', () => {
  // hc = 6.62607015e-34 J s × 2.99792458e8 m/s / 1.602176634e-19 J/eV = 1239.84198 eV nm
  // (exact SI values since 2019); E[eV] = 1239.84/λ[nm].
  it('uses hc = 1239.84 eV·nm, the CODATA value rounded', () => {
    const hc = (6.62607015e-34 * 2.99792458e8) / 1.602176634e-19 / 1e-9;
    expect(hc).toBeCloseTo(1239.84198, 4);
    expect(HC_EV_NM).toBeCloseTo(hc, 2);
  });

  it('converts 620 nm ↔ 1.9998 eV and round-trips', () => {
    expect(nmToEv(620)).toBeCloseTo(1.99974, 5);
    expect(evToNm(1.9997419)).toBeCloseTo(620, 4);
    expect(evToNm(nmToEv(532))).toBeCloseTo(532, 10);
    expect(() => nmToEv(0)).toThrow(RangeError);
    expect(() => evToNm(-1)).toThrow(RangeError);
  });
});

/** A PL spectrum recorded against wavelength, peaks given in eV with widths in meV. */
function wavelengthSpectrum(peaks: { energyEv: number; fwhmMeV: number; height: number }[], seed = 3) {
  const inNm: TruePeak[] = peaks.map((peak) => ({
    centre: evToNm(peak.energyEv),
    // Width in nm of a line of this energy width: Δλ ≈ λ² ΔE / hc.
    fwhm: (evToNm(peak.energyEv) ** 2 * peak.fwhmMeV) / 1000 / HC_EV_NM,
    height: peak.height,
  }));
  return syntheticSpectrum({ from: 550, to: 900, points: 1400, peaks: inNm, noise: 15, seed, background: [120, 40, -20] });
}

function analyse(...args: Parameters<typeof analyzePl>) {
  const analysis = analyzePl(...args);
  expect(PlAnalysis.parse(JSON.parse(JSON.stringify(analysis)))).toEqual(analysis);
  return analysis;
}

// Monolayer MoS2 A exciton ≈ 1.88–1.90 eV, B ≈ 2.03 eV, indirect-gap emission from two layers on
// (Mak et al., PRL 105, 136805, 2010; Splendiani et al., Nano Lett. 10, 1271, 2010; from memory).
describe('analyzePl: MoS2', () => {
  const A = { energyEv: 1.885, fwhmMeV: 55, height: 3000 };
  const B = { energyEv: 2.03, fwhmMeV: 90, height: 450 };

  it('finds the A exciton near the monolayer value, in eV and nm, and calls one layer against a reference', () => {
    const analysis = analyse(wavelengthSpectrum([A, B]), { material: 'MoS2', xUnit: 'nm', referenceIntensity: 3300 });
    expect(analysis.aExciton!.energyEv).toBeCloseTo(1.885, 2);
    expect(analysis.aExciton!.wavelengthNm).toBeCloseTo(evToNm(analysis.aExciton!.energyEv), 10);
    expect(analysis.aExciton!.fwhm * 1000).toBeGreaterThan(45);
    expect(analysis.aExciton!.fwhm * 1000).toBeLessThan(65);
    expect(analysis.shiftMeV).toBeCloseTo(5, -1);
    expect(analysis.relativeIntensity).toBeCloseTo(3000 / 3300, 1);
    expect(analysis.estimate).toMatchObject({ method: 'pl', layers: 1, uncertainty: 0 });
  });

  it('hedges (±1) without a reference, and calls two or more when far weaker than the reference', () => {
    expect(analyse(wavelengthSpectrum([A, B]), { material: 'MoS2', xUnit: 'nm' }).estimate).toMatchObject({
      layers: 1,
      uncertainty: 1,
    });
    expect(
      analyse(wavelengthSpectrum([A, B]), { material: 'MoS2', xUnit: 'nm', referenceIntensity: 30_000 }).estimate,
    ).toMatchObject({
      layers: 2,
      isLowerBound: true,
    });
  });

  it('reads indirect-gap emission as two or more layers', () => {
    const analysis = analyse(
      wavelengthSpectrum([
        { ...A, height: 900 },
        { energyEv: 1.55, fwhmMeV: 130, height: 300 },
      ]),
      {
        material: 'MoS2',
        xUnit: 'nm',
      },
    );
    expect(analysis.peaks.find((peak) => peak.label === 'indirect gap')!.energyEv).toBeCloseTo(1.55, 1);
    expect(analysis.estimate).toMatchObject({ layers: 2, isLowerBound: true });
  });

  it('gives no call when nothing sits near the monolayer A exciton', () => {
    const analysis = analyse(wavelengthSpectrum([{ energyEv: 1.7, fwhmMeV: 60, height: 2000 }]), {
      material: 'MoS2',
      xUnit: 'nm',
    });
    expect(analysis.estimate).toBeNull();
    expect(analysis.notes.join(' ')).toMatch(/strongest is at 1\.7\d* eV/);
  });
});

describe('analyzePl: other materials and units', () => {
  // WSe2 monolayer A exciton ≈ 1.65 eV (Tonndorf et al., Opt. Express 21, 4908, 2013; from memory),
  // here recorded directly against energy.
  it('reads an energy axis', () => {
    const spectrum = syntheticSpectrum({
      from: 1.4,
      to: 2.1,
      points: 700,
      peaks: [{ centre: 1.652, fwhm: 0.045, height: 5000 }],
      noise: 20,
      seed: 8,
      background: [100, 50, 0],
    });
    const analysis = analyse(spectrum, { material: 'WSe2', xUnit: 'eV' });
    expect(analysis.aExciton!.energyEv).toBeCloseTo(1.652, 3);
    expect(analysis.aExciton!.wavelengthNm).toBeCloseTo(HC_EV_NM / 1.652, 0);
    expect(analysis.monolayerAExcitonEv).toBe(1.65);
    expect(analysis.estimate).toMatchObject({ layers: 1, uncertainty: 1 });
  });

  it('gives no layer count for graphene or hBN, and says why', () => {
    const spectrum = wavelengthSpectrum([{ energyEv: 1.9, fwhmMeV: 60, height: 500 }]);
    expect(analyse(spectrum, { material: 'graphene', xUnit: 'nm' })).toMatchObject({ estimate: null, monolayerAExcitonEv: null });
    expect(analyse(spectrum, { material: 'graphene', xUnit: 'nm' }).notes.join(' ')).toMatch(/no band gap/);
    expect(analyse(spectrum, { material: 'hBN', xUnit: 'nm' }).notes.join(' ')).toMatch(/deep ultraviolet/);
  });
});
