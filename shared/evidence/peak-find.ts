/**
 * Peak finding on a baseline-free spectrum: smooth lightly, take local maxima, keep those whose
 * topographic prominence (height above the higher of the two lowest points separating it from
 * taller ground on either side) exceeds a multiple of the noise, and estimate each one's width
 * from where it falls to half its prominence. The results are starting values for the fit.
 */

export interface FoundPeak {
  readonly index: number;
  readonly centre: number;
  readonly height: number;
  readonly prominence: number;
  readonly fwhm: number;
}

export interface PeakFindOptions {
  /** Noise σ of the data; peaks must stand `minSignalToNoise` σ above their surroundings. */
  readonly noise: number;
  /**
   * Prominence needed, in noise σ. 4 keeps random maxima of white noise out (the chance of a 4σ
   * excursion is about 3 × 10⁻⁵ a point) while weak modes of a few percent stay in (common
   * practice, no source).
   */
  readonly minSignalToNoise?: number;
  readonly maxPeaks?: number;
}

export const DEFAULT_MIN_SIGNAL_TO_NOISE = 4;
export const DEFAULT_MAX_PEAKS = 8;

/** 1-4-6-4-1 binomial smoothing (ends kept), enough to stop noise splitting a peak's top. */
export function smooth(y: ArrayLike<number>): Float64Array {
  const n = y.length;
  const out = Float64Array.from(y);
  for (let i = 2; i < n - 2; i += 1) out[i] = (y[i - 2] + 4 * y[i - 1] + 6 * y[i] + 4 * y[i + 1] + y[i + 2]) / 16;
  return out;
}

function prominenceAt(values: Float64Array, index: number): number {
  const peak = values[index];
  let leftLowest = peak;
  for (let i = index - 1; i >= 0 && values[i] <= peak; i -= 1) leftLowest = Math.min(leftLowest, values[i]);
  let rightLowest = peak;
  for (let i = index + 1; i < values.length && values[i] <= peak; i += 1) rightLowest = Math.min(rightLowest, values[i]);
  return peak - Math.max(leftLowest, rightLowest);
}

/** x where `values` crosses `level` walking from `index` in `direction`, linearly interpolated. */
function crossing(x: ArrayLike<number>, values: Float64Array, index: number, level: number, direction: 1 | -1): number {
  let i = index;
  while (i + direction >= 0 && i + direction < values.length && values[i + direction] > level) i += direction;
  const next = i + direction;
  if (next < 0 || next >= values.length) return x[i];
  const fraction = (values[i] - level) / (values[i] - values[next]);
  return x[i] + fraction * (x[next] - x[i]);
}

/** Peaks of (x, y), y with the baseline removed, x ascending; most prominent first. */
export function findPeaks(x: ArrayLike<number>, y: ArrayLike<number>, options: PeakFindOptions): FoundPeak[] {
  const n = x.length;
  if (n < 3) return [];
  const values = smooth(y);
  const threshold = (options.minSignalToNoise ?? DEFAULT_MIN_SIGNAL_TO_NOISE) * Math.max(options.noise, Number.MIN_VALUE);
  const spacing = Math.abs(x[n - 1] - x[0]) / (n - 1);
  const found: FoundPeak[] = [];
  for (let i = 1; i < n - 1; i += 1) {
    if (!(values[i] >= values[i - 1] && values[i] > values[i + 1])) continue;
    if (values[i] < threshold) continue;
    const prominence = prominenceAt(values, i);
    if (prominence < threshold) continue;
    const halfLevel = values[i] - prominence / 2;
    const width = crossing(x, values, i, halfLevel, 1) - crossing(x, values, i, halfLevel, -1);
    found.push({ index: i, centre: x[i], height: values[i], prominence, fwhm: Math.max(width, 2 * spacing) });
  }
  found.sort((a, b) => b.prominence - a.prominence);
  return found.slice(0, options.maxPeaks ?? DEFAULT_MAX_PEAKS);
}
