/**
 * The bare-substrate colour across a chip micrograph, following the slow fall-off of the
 * microscope's illumination towards the field's edges.
 *
 * The image is cut into tiles of about `TILE_SIZE` pixels; each tile's most common colour (per
 * channel histogram mode) is its substrate colour when bare substrate covers most of it. A smooth
 * surface, quadratic in x and y per channel (vignetting is close to quadratic over a field,
 * common practice, no source), is fitted to the tile colours by least squares, and tiles that
 * stray from it by more than four robust standard deviations (and at least
 * `MIN_OUTLIER_DEVIATION`) are left out and the fit repeated: those are tiles mostly covered by
 * flakes, which any flake large enough to cover a tile is, whatever its thickness.
 */
import { linearLeastSquares } from './linear-algebra';
import { MAD_TO_SIGMA, median } from './robust-stats';

/** Tile edge in pixels of the (working) image. */
export const TILE_SIZE = 40;
/** Relative deviation from the surface always tolerated: below the contrast of any monolayer modelled (common practice, no source). */
export const MIN_OUTLIER_DEVIATION = 0.01;
const OUTLIER_SIGMAS = 4;
const BINS = 256;
const MAX_ROUNDS = 10;

export interface BackgroundSurface {
  /** Per channel, coefficients of 1, u, v, u², uv, v² (u, v from −1 to 1 across the image), or fewer for small images. */
  readonly coefficients: readonly (readonly number[])[];
  readonly width: number;
  readonly height: number;
  readonly tilesUsed: number;
  readonly tilesTotal: number;
}

function basis(u: number, v: number, terms: number, out: number[]): void {
  const all = [1, u, v, u * u, u * v, v * v];
  for (let j = 0; j < terms; j += 1) out[j] = all[j];
}

/**
 * Histogram mode of one channel of a tile: the bin whose ±2-bin neighbourhood holds the most
 * values, refined to the mean of those values. A running window sum, with no Math calls in the
 * loop: global lookups are slow in some hosts (test sandboxes) and this runs for every tile.
 */
function modeOf(counts: Uint32Array, sums: Float64Array, offset: number): number {
  const end = offset + BINS;
  let windowCount = counts[offset] + counts[offset + 1] + counts[offset + 2];
  let best = offset;
  let bestCount = windowCount;
  for (let bin = offset + 1; bin < end; bin += 1) {
    if (bin + 2 < end) windowCount += counts[bin + 2];
    if (bin - 3 >= offset) windowCount -= counts[bin - 3];
    if (windowCount > bestCount) {
      bestCount = windowCount;
      best = bin;
    }
  }
  let count = 0;
  let sum = 0;
  for (let d = best - 2; d <= best + 2; d += 1) {
    if (d < offset || d >= end) continue;
    count += counts[d];
    sum += sums[d];
  }
  return count > 0 ? sum / count : best - offset + 0.5;
}

/** Tile modes, tile row by tile row; `values` holds RGB (0–255 scale) per pixel. */
function tileModes(values: Float32Array, width: number, height: number, tilesX: number, tilesY: number): Float64Array {
  const modes = new Float64Array(tilesX * tilesY * 3);
  const counts = new Uint32Array(tilesX * 3 * BINS);
  const sums = new Float64Array(tilesX * 3 * BINS);
  const tileOfColumn = Int32Array.from({ length: width }, (_, x) => Math.min(tilesX - 1, Math.floor((x * tilesX) / width)));
  // Every other pixel each way still leaves hundreds of samples a tile for the mode, at a quarter of the work.
  const step = width >= 2 * TILE_SIZE && height >= 2 * TILE_SIZE ? 2 : 1;
  for (let ty = 0; ty < tilesY; ty += 1) {
    counts.fill(0);
    sums.fill(0);
    const y0 = Math.floor((ty * height) / tilesY);
    const y1 = Math.floor(((ty + 1) * height) / tilesY);
    for (let y = y0; y < y1; y += step) {
      for (let x = 0; x < width; x += step) {
        const base = tileOfColumn[x] * 3 * BINS;
        const k = 3 * (y * width + x);
        for (let c = 0; c < 3; c += 1) {
          const value = values[k + c];
          // Values are means of 0–255 samples, so value | 0 is already a bin (and avoids a slow global Math call per pixel).
          const bin = base + c * BINS + (value | 0);
          counts[bin] += 1;
          sums[bin] += value;
        }
      }
    }
    for (let tx = 0; tx < tilesX; tx += 1) {
      for (let c = 0; c < 3; c += 1) modes[3 * (ty * tilesX + tx) + c] = modeOf(counts, sums, (tx * 3 + c) * BINS);
    }
  }
  return modes;
}

export function estimateSubstrateBackground(values: Float32Array, width: number, height: number): BackgroundSurface {
  const tilesX = Math.max(1, Math.round(width / TILE_SIZE));
  const tilesY = Math.max(1, Math.round(height / TILE_SIZE));
  const tiles = tilesX * tilesY;
  const modes = tileModes(values, width, height, tilesX, tilesY);
  // Fewer tiles than a quadratic needs with room to reject some: a plane, or a constant.
  const terms = tiles >= 12 ? 6 : tiles >= 4 ? 3 : 1;
  // Tile centres in the coordinates `backgroundRow` uses: u = 2(x + ½)/width − 1 at a pixel.
  const u = Float64Array.from({ length: tiles }, (_, t) => (2 * ((t % tilesX) + 0.5)) / tilesX - 1);
  const v = Float64Array.from({ length: tiles }, (_, t) => (2 * (Math.floor(t / tilesX) + 0.5)) / tilesY - 1);
  const kept = new Uint8Array(tiles).fill(1);
  const row = new Array<number>(terms).fill(0);
  let coefficients: number[][] = [0, 1, 2].map((c) =>
    [median(Float64Array.from({ length: tiles }, (_, t) => modes[3 * t + c])), 0, 0, 0, 0, 0].slice(0, terms),
  );

  for (let round = 0; round < MAX_ROUNDS; round += 1) {
    const fitted = [0, 1, 2].map((c) =>
      linearLeastSquares(
        tiles,
        terms,
        (t, out) => basis(u[t], v[t], terms, out),
        Float64Array.from({ length: tiles }, (_, t) => modes[3 * t + c]),
        (t) => kept[t],
      ),
    );
    if (fitted.some((solution) => solution === null)) break;
    coefficients = fitted as number[][];
    const deviation = Float64Array.from({ length: tiles }, (_, t) => {
      basis(u[t], v[t], terms, row);
      let worst = 0;
      for (let c = 0; c < 3; c += 1) {
        const surface = row.reduce((sum, value, j) => sum + value * coefficients[c][j], 0);
        worst = Math.max(worst, surface > 0 ? Math.abs(modes[3 * t + c] - surface) / surface : Infinity);
      }
      return worst;
    });
    const keptDeviations = deviation.filter((_, t) => kept[t] === 1);
    const threshold = Math.max(MIN_OUTLIER_DEVIATION, OUTLIER_SIGMAS * MAD_TO_SIGMA * median(keptDeviations));
    let changed = false;
    let keptCount = 0;
    for (let t = 0; t < tiles; t += 1) {
      const keep = deviation[t] <= threshold ? 1 : 0;
      if (keep !== kept[t]) changed = true;
      kept[t] = keep;
      keptCount += keep;
    }
    if (!changed || keptCount < terms + 1) break;
  }
  const tilesUsed = kept.reduce((sum, value) => sum + value, 0);
  return { coefficients, width, height, tilesUsed, tilesTotal: tiles };
}

/** Fills `out` (3 values a pixel) with the background along image row y. */
export function backgroundRow(surface: BackgroundSurface, y: number, out: Float64Array): void {
  const { width, height } = surface;
  const v = (2 * (y + 0.5)) / height - 1;
  for (let c = 0; c < 3; c += 1) {
    const k = surface.coefficients[c];
    const constant = k[0] + (k.length > 2 ? k[2] * v : 0) + (k.length > 5 ? k[5] * v * v : 0);
    const linear = (k.length > 1 ? k[1] : 0) + (k.length > 4 ? k[4] * v : 0);
    const quadratic = k.length > 3 ? k[3] : 0;
    for (let x = 0; x < width; x += 1) {
      const u = (2 * (x + 0.5)) / width - 1;
      out[3 * x + c] = constant + u * (linear + u * quadratic);
    }
  }
}

/** Background colour at the image centre. */
export function backgroundAtCentre(surface: BackgroundSurface): number[] {
  return surface.coefficients.map((k) => k[0]);
}
