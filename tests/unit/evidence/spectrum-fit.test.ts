import { baselineAt, fitBaseline } from '../../../shared/evidence/baseline';
import { baselineCurve, peakCurve, windowCurve } from '../../../shared/evidence/curves';
import { findPeaks } from '../../../shared/evidence/peak-find';
import { median, noiseFromFirstDifferences, noiseFromSecondDifferences } from '../../../shared/evidence/robust-stats';
import { fitSpectrumWindow } from '../../../shared/evidence/spectrum-fit';
import { evenGrid, gaussianNoise, syntheticSpectrum } from './synthetic';

describe('robust statistics', () => {
  it('estimates Gaussian noise from point-to-point scatter despite peaks and steps', () => {
    const noise = gaussianNoise(4);
    const x = evenGrid(0, 100, 5000);
    const spectrum = x.map((v) => 1000 / (1 + ((v - 50) / 3) ** 2) + 2 * noise());
    expect(noiseFromSecondDifferences(spectrum)).toBeCloseTo(2, 0);
    const terraces = x.map((v) => (v > 40 ? 5 : 0) + 0.1 * noise());
    expect(noiseFromFirstDifferences(terraces)).toBeCloseTo(0.1, 1);
    expect(median([3, 1, 2])).toBe(2);
    expect(median([4, 1, 3, 2])).toBe(2.5);
  });
});

describe('baseline', () => {
  it('follows a curved background under peaks, ignoring the peaks', () => {
    const { x, y } = syntheticSpectrum({
      from: 300,
      to: 460,
      points: 800,
      peaks: [{ centre: 380, fwhm: 5, height: 900 }],
      noise: 5,
      seed: 2,
      background: [500, 300, -200],
    });
    const baseline = fitBaseline(x, y, 2);
    for (const at of [300, 340, 420, 460]) {
      const t = (at - 300) / 160;
      expect(Math.abs(baselineAt(baseline, at) - (500 + 300 * t - 200 * t * t))).toBeLessThan(15);
    }
  });
});

describe('peak finding', () => {
  it('finds peaks above four noise σ, most prominent first, and no noise peaks', () => {
    const { x, y } = syntheticSpectrum({
      from: 0,
      to: 200,
      points: 1000,
      peaks: [
        { centre: 50, fwhm: 4, height: 100 },
        { centre: 120, fwhm: 6, height: 30 },
        { centre: 170, fwhm: 5, height: 5 }, // below 4σ of σ = 2: not a peak
      ],
      noise: 2,
      seed: 6,
      background: [0, 0, 0],
    });
    const peaks = findPeaks(x, y, { noise: 2 });
    expect(peaks.map((peak) => Math.round(peak.centre))).toEqual([50, 120]);
    expect(peaks[0].fwhm).toBeCloseTo(4, 0);
  });
});

describe('fitSpectrumWindow', () => {
  it('separates a shoulder the first search merged into its neighbour', () => {
    // WS2-like 2LA(M) band with the E¹2g shoulder 6 cm⁻¹ above it.
    const { x, y } = syntheticSpectrum({
      from: 300,
      to: 460,
      points: 1200,
      peaks: [
        { centre: 350.5, fwhm: 9, height: 2000 },
        { centre: 356.5, fwhm: 4, height: 600 },
        { centre: 417.7, fwhm: 4.5, height: 900 },
      ],
      noise: 8,
      seed: 12,
      background: [1500, 200, -100],
    });
    const fitted = fitSpectrumWindow(x, y, { fromX: 300, toX: 460, minFwhm: 1, maxFwhm: 30 })!;
    const centres = fitted.peaks.map((peak) => peak.centre).sort((a, b) => a - b);
    expect(centres).toHaveLength(3);
    expect(centres[1]).toBeCloseTo(356.5, 0);
    expect(fitted.window.rmsResidual).toBeLessThan(1.3 * fitted.window.noise);
  });

  it('returns null for a window the data do not cover', () => {
    const { x, y } = syntheticSpectrum({ from: 100, to: 200, points: 100, peaks: [], noise: 1, seed: 1 });
    expect(fitSpectrumWindow(x, y, { fromX: 300, toX: 400, minFwhm: 1, maxFwhm: 10 })).toBeNull();
  });

  it('stores enough to redraw the fitted curve', () => {
    const truth = { centre: 403.4, fwhm: 4.6, height: 950 };
    const { x, y } = syntheticSpectrum({
      from: 330,
      to: 450,
      points: 500,
      peaks: [truth],
      noise: 0,
      seed: 1,
      background: [300, -60, 40],
    });
    const fitted = fitSpectrumWindow(x, y, { fromX: 330, toX: 450, minFwhm: 1, maxFwhm: 20 })!;
    const peaks = fitted.peaks.map((peak) => ({ label: null, ...peak }));
    const curve = windowCurve(fitted.window, peaks, 121);
    expect(curve).toHaveLength(121);
    curve.forEach((point) => {
      const t = (point.x - 330) / 120;
      const expected = 300 - 60 * t + 40 * t * t + truth.height / (1 + ((2 * (point.x - truth.centre)) / truth.fwhm) ** 2);
      expect(point.y).toBeCloseTo(expected, 3);
    });
    expect(baselineCurve(fitted.window, 10)[0].y).toBeCloseTo(300, 3);
    const top = peakCurve(fitted.window, peaks[0], 3)[1];
    expect(top.x).toBeCloseTo(403.4, 6);
  });
});
