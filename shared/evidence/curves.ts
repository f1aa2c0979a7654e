/**
 * Fitted curves for plotting, recomputed from a stored analysis (curves themselves are not
 * stored): in each fitted window, the baseline plus the Lorentzians whose centres lie in it.
 */
import { type FittedPeak, type SpectrumWindowFit } from '../schemas/evidence-analysis';
import { baselineAt } from './baseline';
import { lorentzian } from './lorentzian-fit';

export interface CurvePoint {
  readonly x: number;
  readonly y: number;
}

function peaksIn(window: SpectrumWindowFit, peaks: readonly FittedPeak[]): FittedPeak[] {
  return peaks.filter((peak) => peak.centre >= window.fromX && peak.centre <= window.toX);
}

/** The fitted curve of one window at `samples` evenly spaced points across it. */
export function windowCurve(window: SpectrumWindowFit, peaks: readonly FittedPeak[], samples = 400): CurvePoint[] {
  const own = peaksIn(window, peaks);
  const count = Math.max(2, Math.floor(samples));
  return Array.from({ length: count }, (_, i) => {
    const x = window.fromX + ((window.toX - window.fromX) * i) / (count - 1);
    let y = baselineAt(window.baseline, x);
    for (const peak of own) y += lorentzian(x, peak.centre, peak.fwhm, peak.height);
    return { x, y };
  });
}

/** The baseline of one window alone, for drawing under the peaks. */
export function baselineCurve(window: SpectrumWindowFit, samples = 100): CurvePoint[] {
  const count = Math.max(2, Math.floor(samples));
  return Array.from({ length: count }, (_, i) => {
    const x = window.fromX + ((window.toX - window.fromX) * i) / (count - 1);
    return { x, y: baselineAt(window.baseline, x) };
  });
}

/** One peak drawn on the baseline of its window, for shading it. */
export function peakCurve(window: SpectrumWindowFit, peak: FittedPeak, samples = 120): CurvePoint[] {
  const count = Math.max(2, Math.floor(samples));
  const from = Math.max(window.fromX, peak.centre - 4 * peak.fwhm);
  const to = Math.min(window.toX, peak.centre + 4 * peak.fwhm);
  return Array.from({ length: count }, (_, i) => {
    const x = from + ((to - from) * i) / (count - 1);
    return { x, y: baselineAt(window.baseline, x) + lorentzian(x, peak.centre, peak.fwhm, peak.height) };
  });
}
