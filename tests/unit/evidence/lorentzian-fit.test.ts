import { fitBaseline } from '../../../shared/evidence/baseline';
import { fitLorentzians, lorentzian, lorentzianArea } from '../../../shared/evidence/lorentzian-fit';
import { referenceFit } from './reference-fit';
import { evenGrid, gaussianNoise, syntheticSpectrum, type TruePeak } from './synthetic';

// MoS2-like pair of modes on a curved background (positions typical of a monolayer, from memory).
const TRUE_PEAKS: TruePeak[] = [
  { centre: 384.6, fwhm: 3.2, height: 700 },
  { centre: 403.4, fwhm: 4.6, height: 950 },
];

function window(seed: number, noise = 12) {
  const full = syntheticSpectrum({ from: 330, to: 450, points: 400, peaks: TRUE_PEAKS, noise, seed, background: [300, -60, 40] });
  return full;
}

function perturbedStart() {
  return TRUE_PEAKS.map((peak, k) => ({
    centre: peak.centre + (k ? -0.8 : 0.7),
    fwhm: peak.fwhm * 1.3,
    height: peak.height * 0.75,
  }));
}

describe('Lorentzian line shape', () => {
  it('has its stated height, half maximum at ± FWHM/2, and area πhw/2', () => {
    expect(lorentzian(400, 400, 6, 10)).toBe(10);
    expect(lorentzian(403, 400, 6, 10)).toBeCloseTo(5, 12);
    expect(lorentzian(397, 400, 6, 10)).toBeCloseTo(5, 12);
    // ∫ h/(1 + (2(x−x₀)/w)²) dx over ±L is (hw/2)·2·atan(2L/w): the textbook integral of 1/(1+u²).
    const half = 3000;
    const x = evenGrid(400 - half, 400 + half, 600_001);
    let trapezoid = 0;
    for (let i = 1; i < x.length; i += 1)
      trapezoid += ((lorentzian(x[i - 1], 400, 6, 10) + lorentzian(x[i], 400, 6, 10)) / 2) * (x[i] - x[i - 1]);
    expect(trapezoid).toBeCloseTo(((10 * 6) / 2) * 2 * Math.atan((2 * half) / 6), 4);
    expect(lorentzianArea(6, 10)).toBeCloseTo(Math.PI * 30, 12);
  });
});

describe('fitLorentzians', () => {
  it('recovers exact parameters from noise-free data', () => {
    const { x, y } = syntheticSpectrum({
      from: 330,
      to: 450,
      points: 400,
      peaks: TRUE_PEAKS,
      noise: 0,
      seed: 1,
      background: [300, -60, 40],
    });
    const background = fitBaseline(x, y, 2);
    const fit = fitLorentzians(x, y, perturbedStart(), { minFwhm: 0.5, maxFwhm: 30, background });
    expect(fit.converged).toBe(true);
    fit.peaks.forEach((peak, k) => {
      expect(peak.centre).toBeCloseTo(TRUE_PEAKS[k].centre, 6);
      expect(peak.fwhm).toBeCloseTo(TRUE_PEAKS[k].fwhm, 6);
      expect(peak.height).toBeCloseTo(TRUE_PEAKS[k].height, 4);
    });
    expect(fit.rmsResidual).toBeLessThan(1e-6);
  });

  // The general-purpose library minimises the same sum of squares with a finite-difference
  // Jacobian; both must land on the same minimum from the same start.
  it('agrees with ml-levenberg-marquardt on the same noisy data', () => {
    const { x, y } = window(42);
    const background = fitBaseline(x, y, 2);
    const start = perturbedStart();
    const ours = fitLorentzians(x, y, start, { minFwhm: 0.5, maxFwhm: 30, background });
    const reference = referenceFit({
      x,
      y,
      peakCount: 2,
      xCentre: background.xCentre,
      xHalfSpan: background.xHalfSpan,
      initialValues: [...start.flatMap((peak) => [peak.centre, peak.fwhm, peak.height]), ...background.coefficients],
    });
    const values = reference.parameterValues;
    ours.peaks.forEach((peak, k) => {
      expect(Math.abs(peak.centre - values[3 * k])).toBeLessThan(1e-5);
      expect(Math.abs(peak.fwhm / values[3 * k + 1] - 1)).toBeLessThan(1e-5);
      expect(Math.abs(peak.height / values[3 * k + 2] - 1)).toBeLessThan(1e-5);
    });
    ours.background.coefficients.forEach((coefficient, j) => expect(Math.abs(coefficient - values[6 + j])).toBeLessThan(1e-4));
    // Our minimum is at least as low as the library's (its error is the residual sum of squares).
    expect(ours.residualSumOfSquares).toBeLessThanOrEqual(reference.parameterError * (1 + 1e-6));
  });

  // Standard errors from s²(JᵀJ)⁻¹ should match the scatter of fitted centres over independent
  // noise draws (the textbook meaning of the covariance; statistical check, 40 draws).
  it('reports standard errors that match the scatter over repeated noise', () => {
    const centres: number[] = [];
    const reported: number[] = [];
    for (let seed = 1; seed <= 40; seed += 1) {
      const { x, y } = window(1000 + seed, 25);
      const fit = fitLorentzians(x, y, perturbedStart(), { minFwhm: 0.5, maxFwhm: 30, background: fitBaseline(x, y, 2) });
      centres.push(fit.peaks[0].centre);
      reported.push(fit.peaks[0].stdErr!.centre);
    }
    const mean = centres.reduce((a, b) => a + b, 0) / centres.length;
    const scatter = Math.sqrt(centres.reduce((sum, c) => sum + (c - mean) ** 2, 0) / (centres.length - 1));
    const typical = reported.reduce((a, b) => a + b, 0) / reported.length;
    expect(scatter / typical).toBeGreaterThan(0.65);
    expect(scatter / typical).toBeLessThan(1.5);
    expect(Math.abs(mean - TRUE_PEAKS[0].centre)).toBeLessThan(3 * (scatter / Math.sqrt(centres.length)) + 1e-3);
  });

  it('keeps widths inside the bounds and refuses too few points', () => {
    const { x, y } = window(3);
    const fit = fitLorentzians(x, y, [{ centre: 384, fwhm: 50, height: 700 }], { minFwhm: 1, maxFwhm: 8 });
    expect(fit.peaks[0].fwhm).toBeLessThanOrEqual(8);
    expect(() => fitLorentzians([1, 2, 3, 4], [1, 2, 1, 0], [{ centre: 2, fwhm: 1, height: 1 }])).toThrow(RangeError);
  });

  it('fits a 2,000-point spectrum with three peaks in milliseconds', () => {
    const noise = gaussianNoise(9);
    const x = evenGrid(100, 1000, 2000);
    const truth = [...TRUE_PEAKS, { centre: 520.7, fwhm: 3.5, height: 4000 }];
    const y = x.map((v) => 200 + truth.reduce((sum, p) => sum + lorentzian(v, p.centre, p.fwhm, p.height), 0) + 10 * noise());
    const start = truth.map((p) => ({ centre: p.centre + 0.5, fwhm: p.fwhm * 1.2, height: p.height * 0.9 }));
    fitLorentzians(x, y, start);
    const began = performance.now();
    const fit = fitLorentzians(x, y, start);
    const elapsed = performance.now() - began;
    expect(fit.peaks[2].centre).toBeCloseTo(520.7, 1);
    expect(elapsed).toBeLessThan(100); // generous for a shared 2-core machine; typically a few ms
  });
});
