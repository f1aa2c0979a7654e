/**
 * Robust statistics for noisy data: medians and noise levels that a few peaks, steps or
 * outliers do not disturb.
 */

/** Median of the values (a sorted copy; the input is left alone). NaN for an empty list. */
export function median(values: ArrayLike<number>): number {
  const sorted = Float64Array.from(values).sort();
  const n = sorted.length;
  if (n === 0) return Number.NaN;
  const middle = n >> 1;
  return n % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

/**
 * For normally distributed values σ = 1.4826 × median absolute deviation (1.4826 = 1/Φ⁻¹(3/4),
 * the textbook consistency factor).
 */
export const MAD_TO_SIGMA = 1.4826;

/**
 * Point-to-point noise σ of a signal sampled on a grid, from its second differences
 * yᵢ₋₁ − 2yᵢ + yᵢ₊₁: for white noise their variance is 6σ², and smooth features (peaks wider than
 * a few samples, baselines) hardly contribute, so the median absolute value stays a noise measure.
 */
export function noiseFromSecondDifferences(y: ArrayLike<number>): number {
  const n = y.length;
  if (n < 3) return 0;
  const differences = new Float64Array(n - 2);
  for (let i = 1; i < n - 1; i += 1) differences[i - 1] = Math.abs(y[i - 1] - 2 * y[i] + y[i + 1]);
  return (MAD_TO_SIGMA * median(differences)) / Math.sqrt(6);
}

/**
 * Noise σ from first differences (variance 2σ² for white noise). Suits piecewise-flat signals such
 * as AFM terraces, where the rare steps are outliers the median ignores.
 */
export function noiseFromFirstDifferences(y: ArrayLike<number>): number {
  const n = y.length;
  if (n < 2) return 0;
  const differences = new Float64Array(n - 1);
  for (let i = 1; i < n; i += 1) differences[i - 1] = Math.abs(y[i] - y[i - 1]);
  return (MAD_TO_SIGMA * median(differences)) / Math.SQRT2;
}
