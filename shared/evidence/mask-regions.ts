/**
 * Binary masks on the working grid: a 3 × 3 morphological opening that removes slivers one or two
 * pixels wide, and 4-connected regions with the statistics a candidate needs.
 */
import { type WorkingImage } from './working-image';

/** 3-wide minimum (erode) or maximum (dilate) along each row; outside the image counts as 0. */
function rowPass(source: Uint8Array, target: Uint8Array, width: number, height: number, erode: boolean): void {
  for (let y = 0; y < height; y += 1) {
    const start = y * width;
    const last = start + width - 1;
    if (width === 1) {
      target[start] = erode ? 0 : source[start];
      continue;
    }
    target[start] = erode ? 0 : source[start] | source[start + 1];
    target[last] = erode ? 0 : source[last] | source[last - 1];
    if (erode) for (let i = start + 1; i < last; i += 1) target[i] = source[i - 1] & source[i] & source[i + 1];
    else for (let i = start + 1; i < last; i += 1) target[i] = source[i - 1] | source[i] | source[i + 1];
  }
}

/** 3-tall minimum or maximum along each column, a row at a time; outside the image counts as 0. */
function columnPass(source: Uint8Array, target: Uint8Array, width: number, height: number, erode: boolean): void {
  for (let y = 0; y < height; y += 1) {
    const start = y * width;
    const above = y > 0 ? start - width : -1;
    const below = y < height - 1 ? start + width : -1;
    for (let x = 0; x < width; x += 1) {
      const up = above >= 0 ? source[above + x] : 0;
      const down = below >= 0 ? source[below + x] : 0;
      target[start + x] = erode ? source[start + x] & up & down : source[start + x] | up | down;
    }
  }
}

/** 3 × 3 erosion then dilation (an opening) of a 0/1 mask, in place; `scratch` is a work buffer of the same size. */
export function open3x3(mask: Uint8Array, scratch: Uint8Array, width: number, height: number): void {
  rowPass(mask, scratch, width, height, true);
  columnPass(scratch, mask, width, height, true);
  rowPass(mask, scratch, width, height, false);
  columnPass(scratch, mask, width, height, false);
}

export interface MaskRegion {
  /** Image pixels covered (working pixels weighted by the image pixels each holds). */
  readonly imagePixels: number;
  /** Centroid in image pixels, origin at the top-left corner. */
  readonly centroidX: number;
  readonly centroidY: number;
  /** Bounding box in working pixels, inclusive. */
  readonly minX: number;
  readonly minY: number;
  readonly maxX: number;
  readonly maxY: number;
  /** Mean of `perPixel` (3 values a working pixel) over the region. */
  readonly mean: [number, number, number];
}

/** 4-connected regions of a 0/1 mask (cleared as it is read). */
export function connectedRegions(
  mask: Uint8Array,
  image: WorkingImage,
  imageWidth: number,
  perPixel: Float32Array,
): MaskRegion[] {
  const { width, height, block, pixelCounts } = image;
  const regions: MaskRegion[] = [];
  const stack = new Int32Array(mask.length);
  for (let start = 0; start < mask.length; start += 1) {
    if (!mask[start]) continue;
    let top = 0;
    stack[top++] = start;
    mask[start] = 0;
    let imagePixels = 0;
    let sumX = 0;
    let sumY = 0;
    let minX = width;
    let minY = height;
    let maxX = -1;
    let maxY = -1;
    let count = 0;
    const sums: [number, number, number] = [0, 0, 0];
    while (top > 0) {
      const i = stack[--top];
      const x = i % width;
      const y = (i - x) / width;
      const weight = pixelCounts[i];
      const blockEnd = (x + 1) * block;
      const blockWidth = (blockEnd < imageWidth ? blockEnd : imageWidth) - x * block;
      imagePixels += weight;
      sumX += weight * (x * block + blockWidth / 2);
      sumY += weight * (y * block + weight / blockWidth / 2);
      if (x < minX) minX = x;
      if (x > maxX) maxX = x;
      if (y < minY) minY = y;
      if (y > maxY) maxY = y;
      sums[0] += perPixel[3 * i];
      sums[1] += perPixel[3 * i + 1];
      sums[2] += perPixel[3 * i + 2];
      count += 1;
      if (x > 0 && mask[i - 1]) ((mask[i - 1] = 0), (stack[top++] = i - 1));
      if (x < width - 1 && mask[i + 1]) ((mask[i + 1] = 0), (stack[top++] = i + 1));
      if (y > 0 && mask[i - width]) ((mask[i - width] = 0), (stack[top++] = i - width));
      if (y < height - 1 && mask[i + width]) ((mask[i + width] = 0), (stack[top++] = i + width));
    }
    regions.push({
      imagePixels,
      centroidX: sumX / imagePixels,
      centroidY: sumY / imagePixels,
      minX,
      minY,
      maxX,
      maxY,
      mean: [sums[0] / count, sums[1] / count, sums[2] / count],
    });
  }
  return regions;
}
