/**
 * Baseline removal by iterative polynomial fitting with one-sided clipping: fit a polynomial,
 * leave out of the next fit every point lying more than `CLIP_SIGMAS` noise σ above it (peaks),
 * and repeat until the set of points left out stops changing. Points below the curve always stay
 * in, so the polynomial settles through the middle of the noise of the peak-free background.
 * (Sigma-clipped polynomial fitting is common practice, no source. Clipping points *to* the curve
 * instead, as some published schemes do, converged far too slowly on narrow windows here: after
 * 200 rounds the curve still bulged under the peaks.)
 *
 * Chosen over asymmetric least squares because the result is a handful of coefficients: it is
 * stored with the analysis and the client redraws it without the raw baseline points. Over the
 * narrow windows Flakeline fits (≈100–400 cm⁻¹), fluorescence and substrate backgrounds are
 * smooth enough for degree 2–3 (common practice, no source). This curve is the starting point:
 * the peak fit refines it together with the peaks (see lorentzian-fit.ts).
 */
import { type SpectrumBaseline } from '../schemas/evidence-analysis';
import { linearLeastSquares } from './linear-algebra';
import { noiseFromSecondDifferences } from './robust-stats';

export const DEFAULT_BASELINE_DEGREE = 3;
/** Points this many σ above the curve count as peak, not background (common practice, no source). */
export const CLIP_SIGMAS = 2;
const MAX_ITERATIONS = 50;

/** Value of the baseline at x. */
export function baselineAt(baseline: { xCentre: number; xHalfSpan: number; coefficients: readonly number[] }, x: number): number {
  const t = (x - baseline.xCentre) / baseline.xHalfSpan;
  let value = 0;
  for (let i = baseline.coefficients.length - 1; i >= 0; i -= 1) value = value * t + baseline.coefficients[i];
  return value;
}

/** Fits the sigma-clipped polynomial baseline to (x, y), x ascending. */
export function fitBaseline(x: ArrayLike<number>, y: ArrayLike<number>, degree = DEFAULT_BASELINE_DEGREE): SpectrumBaseline {
  const n = x.length;
  if (n < degree + 2) throw new RangeError(`A degree-${degree} baseline needs at least ${degree + 2} points, got ${n}`);
  const xCentre = (x[0] + x[n - 1]) / 2;
  const xHalfSpan = (x[n - 1] - x[0]) / 2 || 1;
  const t = Float64Array.from({ length: n }, (_, i) => (x[i] - xCentre) / xHalfSpan);
  const noise = noiseFromSecondDifferences(y);
  const included = new Uint8Array(n).fill(1);
  const powers = (row: number, out: number[]) => {
    let value = 1;
    for (let j = 0; j <= degree; j += 1) {
      out[j] = value;
      value *= t[row];
    }
  };

  let coefficients: number[] = new Array<number>(degree + 1).fill(0);
  for (let iteration = 0; iteration < MAX_ITERATIONS; iteration += 1) {
    const solved = linearLeastSquares(n, degree + 1, powers, y, (row) => included[row]);
    if (!solved) break; // too few points left for this degree: keep the last good curve
    coefficients = solved;
    let changed = 0;
    let keptCount = 0;
    for (let i = 0; i < n; i += 1) {
      let fit = 0;
      for (let j = degree; j >= 0; j -= 1) fit = fit * t[i] + coefficients[j];
      const keep = y[i] - fit <= CLIP_SIGMAS * noise ? 1 : 0;
      if (keep !== included[i]) changed += 1;
      included[i] = keep;
      keptCount += keep;
    }
    if (changed === 0 || keptCount <= degree + 1) break;
  }
  return { method: 'polynomial_fitted_with_peaks', degree, xCentre, xHalfSpan, coefficients };
}
