/**
 * The path from a raw stretch of spectrum to fitted peaks, shared by Raman and PL: a sigma-clipped
 * polynomial baseline as the first guess of the background, noise from point-to-point scatter,
 * peak finding on the spectrum minus that baseline, then one Levenberg–Marquardt fit of all the
 * Lorentzians and the background polynomial together, and up to two rounds of adding a peak where
 * the residual still shows one (a shoulder the first search merged into its neighbour).
 */
import { type SpectrumWindowFit } from '../schemas/evidence-analysis';
import { baselineAt, fitBaseline } from './baseline';
import {
  type FittedLorentzian,
  fitLorentzians,
  type LorentzianFitResult,
  lorentzian,
  type PeakParameters,
} from './lorentzian-fit';
import { DEFAULT_MAX_PEAKS, DEFAULT_MIN_SIGNAL_TO_NOISE, findPeaks } from './peak-find';
import { noiseFromSecondDifferences } from './robust-stats';

export interface WindowFitOptions {
  readonly fromX: number;
  readonly toX: number;
  readonly baselineDegree?: number;
  readonly minFwhm: number;
  readonly maxFwhm: number;
  readonly maxPeaks?: number;
  readonly minSignalToNoise?: number;
}

export interface WindowFitResult {
  readonly window: SpectrumWindowFit;
  /** Peaks with centres inside the window, tallest first. */
  readonly peaks: FittedLorentzian[];
}

/** Quadratic backgrounds suit the narrow windows fitted (common practice, no source). */
export const DEFAULT_WINDOW_BASELINE_DEGREE = 2;
/** Fewest points a window must hold to be fitted. */
export const MIN_WINDOW_POINTS = 15;
/** A residual bump must stand this many σ out before another peak is added for it (stricter than the first search). */
const RESIDUAL_SIGNAL_TO_NOISE = 5;
const RESIDUAL_ROUNDS = 2;

function modelAt(x: number, fit: LorentzianFitResult): number {
  let value = baselineAt(fit.background, x);
  for (const peak of fit.peaks) value += lorentzian(x, peak.centre, peak.fwhm, peak.height);
  return value;
}

/** Fits the part of (x, y) between fromX and toX (x ascending); null when it holds too few points. */
export function fitSpectrumWindow(x: readonly number[], y: readonly number[], options: WindowFitOptions): WindowFitResult | null {
  let start = 0;
  while (start < x.length && x[start] < options.fromX) start += 1;
  let end = start;
  while (end < x.length && x[end] <= options.toX) end += 1;
  if (end - start < MIN_WINDOW_POINTS) return null;
  const xs = x.slice(start, end);
  const ys = y.slice(start, end);

  const degree = Math.min(options.baselineDegree ?? DEFAULT_WINDOW_BASELINE_DEGREE, xs.length - 2);
  const baseline = fitBaseline(xs, ys, degree);
  const corrected = ys.map((value, i) => value - baselineAt(baseline, xs[i]));
  const noise = noiseFromSecondDifferences(ys);
  const maxPeaks = options.maxPeaks ?? DEFAULT_MAX_PEAKS;
  const minSignalToNoise = options.minSignalToNoise ?? DEFAULT_MIN_SIGNAL_TO_NOISE;
  const bounded = (peak: PeakParameters): PeakParameters => ({
    centre: peak.centre,
    height: peak.height,
    fwhm: Math.min(options.maxFwhm, Math.max(options.minFwhm, peak.fwhm)),
  });
  const fitFrom = (guesses: readonly PeakParameters[], background: LorentzianFitResult['background']) =>
    fitLorentzians(xs, ys, guesses.map(bounded), { minFwhm: options.minFwhm, maxFwhm: options.maxFwhm, background });

  const found = findPeaks(xs, corrected, { noise, maxPeaks, minSignalToNoise });
  let fit = found.length > 0 ? fitFrom(found, baseline) : null;

  for (let round = 0; fit && round < RESIDUAL_ROUNDS && fit.peaks.length < maxPeaks; round += 1) {
    const current = fit;
    const residual = ys.map((value, i) => value - modelAt(xs[i], current));
    const [extra] = findPeaks(xs, residual, { noise, maxPeaks: 1, minSignalToNoise: RESIDUAL_SIGNAL_TO_NOISE });
    if (!extra) break;
    fit = fitFrom([...current.peaks, extra], current.background);
  }

  // A peak the fit shrank into the noise is not evidence of anything: drop it and refit.
  if (fit) {
    const kept = fit.peaks.filter((peak) => peak.height > 2 * noise);
    if (kept.length < fit.peaks.length) fit = kept.length > 0 ? fitFrom(kept, fit.background) : null;
  }

  const background = fit ? fit.background : baseline;
  const rmsResidual = fit
    ? fit.rmsResidual
    : Math.sqrt(corrected.reduce((sum, value) => sum + value * value, 0) / corrected.length);
  return {
    window: {
      fromX: xs[0],
      toX: xs[xs.length - 1],
      baseline: { ...baseline, coefficients: [...background.coefficients] },
      rmsResidual,
      noise,
      iterations: fit ? fit.iterations : 0,
      converged: fit ? fit.converged : true,
    },
    peaks: fit ? [...fit.peaks].sort((a, b) => b.height - a.height) : [],
  };
}
