/**
 * A micrograph block-averaged onto a smaller working grid: each working pixel is the mean of a
 * block × block square of image pixels (fewer along the right and bottom edges), with the block
 * the smallest whole number that keeps the grid under a given number of pixels. Averaging also
 * lowers pixel noise by the block size.
 */
export interface WorkingImage {
  readonly width: number;
  readonly height: number;
  readonly block: number;
  /** Mean intensity (0–255 scale) per working pixel, channels interleaved. */
  readonly values: Float32Array;
  /** Image pixels in each working pixel (fewer along the right and bottom edges). */
  readonly pixelCounts: Uint16Array;
}

/** Sums of 8-bit values per block, as recorded (the common case: no table lookup). */
function blockSumsRaw(
  rgba: ArrayLike<number>,
  width: number,
  height: number,
  block: number,
  workingWidth: number,
  sums: Float64Array,
): void {
  // Plain comparisons instead of Math.min in the per-block loop: global lookups are slow in some hosts (test sandboxes).
  for (let y = 0; y < height; y += 1) {
    const rowStart = ((y / block) | 0) * workingWidth * 3;
    const rowEnd = (y + 1) * width * 4;
    let p = y * width * 4;
    for (let k = rowStart; p < rowEnd; k += 3) {
      let end = p + block * 4;
      if (end > rowEnd) end = rowEnd;
      let red = 0;
      let green = 0;
      let blue = 0;
      for (; p < end; p += 4) {
        red += rgba[p];
        green += rgba[p + 1];
        blue += rgba[p + 2];
      }
      sums[k] += red;
      sums[k + 1] += green;
      sums[k + 2] += blue;
    }
  }
}

/** Sums per block of the values a table gives each 8-bit value (sRGB decoding). */
function blockSumsDecoded(
  rgba: ArrayLike<number>,
  width: number,
  height: number,
  block: number,
  workingWidth: number,
  table: Float32Array,
  sums: Float64Array,
): void {
  for (let y = 0; y < height; y += 1) {
    const rowStart = ((y / block) | 0) * workingWidth * 3;
    const rowEnd = (y + 1) * width * 4;
    let p = y * width * 4;
    for (let k = rowStart; p < rowEnd; k += 3) {
      let end = p + block * 4;
      if (end > rowEnd) end = rowEnd;
      let red = 0;
      let green = 0;
      let blue = 0;
      for (; p < end; p += 4) {
        red += table[rgba[p]];
        green += table[rgba[p + 1]];
        blue += table[rgba[p + 2]];
      }
      sums[k] += red;
      sums[k + 1] += green;
      sums[k + 2] += blue;
    }
  }
}

export function blockAverage(
  rgba: ArrayLike<number>,
  width: number,
  height: number,
  maxPixels: number,
  table: Float32Array | null,
): WorkingImage {
  const block = Math.max(1, Math.ceil(Math.sqrt((width * height) / maxPixels)));
  const workingWidth = Math.ceil(width / block);
  const workingHeight = Math.ceil(height / block);
  const sums = new Float64Array(workingWidth * workingHeight * 3);
  if (table) blockSumsDecoded(rgba, width, height, block, workingWidth, table, sums);
  else blockSumsRaw(rgba, width, height, block, workingWidth, sums);
  const values = new Float32Array(sums.length);
  const pixelCounts = new Uint16Array(workingWidth * workingHeight);
  const lastColumns = width - (workingWidth - 1) * block;
  const lastRows = height - (workingHeight - 1) * block;
  for (let by = 0; by < workingHeight; by += 1) {
    const rows = by === workingHeight - 1 ? lastRows : block;
    for (let bx = 0; bx < workingWidth; bx += 1) {
      const count = rows * (bx === workingWidth - 1 ? lastColumns : block);
      const i = by * workingWidth + bx;
      pixelCounts[i] = count;
      values[3 * i] = sums[3 * i] / count;
      values[3 * i + 1] = sums[3 * i + 1] / count;
      values[3 * i + 2] = sums[3 * i + 2] / count;
    }
  }
  return { width: workingWidth, height: workingHeight, block, values, pixelCounts };
}
