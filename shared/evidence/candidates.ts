/**
 * Monolayer (and bilayer) candidate finder for a whole-chip micrograph with a known calibration.
 *
 * 1. Block-average the image onto a working grid of at most `WORKING_MAX_PIXELS` (a 12 MP image
 *    becomes 3 × 3 blocks, 1333 × 1000). Averaging also lowers pixel noise by the block size.
 *    Areas are then counted in working pixels of (block × µm per pixel)² each, so an edge is
 *    uncertain by about half a working pixel.
 * 2. Estimate the bare-substrate colour across the field: a smooth surface fitted to the most
 *    common colour of each tile, tiles mostly covered by flakes left out (substrate-background.ts).
 * 3. Contrast map C = (background − pixel)/background per channel (the sign of contrast.ts).
 * 4. Classify each working pixel to the nearest predicted contrast of 0 (substrate), 1, 2 or 3
 *    layers (`rgbContrast` on this substrate). A pixel counts as 1 or 2 layers when it is also
 *    inside that count's window in every channel: half the distance to the neighbouring counts'
 *    predictions, so windows never claim a neighbour's pixels, but never narrower than
 *    `MIN_WINDOW_HALF_WIDTH` (twice the default contrast uncertainty of layer-count.ts), so a channel
 *    where the predictions nearly coincide does not reject every pixel for noise.
 * 5. Morphological opening (3 × 3 erosion, then dilation) removes one-pixel slivers, chiefly the
 *    mixed pixels along the edges of thicker flakes, whose averaged colour passes through the
 *    thin-layer windows. Then 4-connected regions, their area, centroid, box and mean contrast.
 */
import { predictionDatasets, rgbContrast, type Substrate } from '../optics/contrast';
import { DEFAULT_CONTRAST_UNCERTAINTY } from '../optics/layer-count';
import { type FlakeMaterialId } from '../optics/materials';
import { type PixelEncoding } from '../optics/micrograph';
import { type CandidateAnalysis, type ContrastWindow, type LayerCandidate, type RgbValues } from '../schemas/evidence-analysis';
import { AnalysisInputError } from './errors';
import { connectedRegions, open3x3 } from './mask-regions';
import { checkImage, intensityTable } from './region-contrast';
import { backgroundAtCentre, backgroundRow, type BackgroundSurface, estimateSubstrateBackground } from './substrate-background';
import { blockAverage, type WorkingImage } from './working-image';

export interface CandidateInput {
  /** 8-bit RGBA, row by row from the top-left corner. */
  readonly rgba: ArrayLike<number>;
  readonly width: number;
  readonly height: number;
  readonly umPerPixel: number;
  readonly material: FlakeMaterialId;
  readonly substrate: Substrate;
  readonly maxCandidates?: number;
  readonly minAreaUm2?: number;
  readonly encoding?: PixelEncoding;
}

/** Working grid size: keeps a 12 MP image well under a second on two cores (measured). */
export const WORKING_MAX_PIXELS = 1_500_000;
export const DEFAULT_MAX_CANDIDATES = 50;
/** Smallest candidate area reported unless asked otherwise, µm², on top of the 3 × 3 working pixels the opening leaves. */
export const DEFAULT_MIN_AREA_UM2 = 1;
export const MIN_WINDOW_HALF_WIDTH = 2 * DEFAULT_CONTRAST_UNCERTAINTY;
const CHANNELS = ['red', 'green', 'blue'] as const;

function toRgb(values: readonly number[]): RgbValues {
  return { red: values[0], green: values[1], blue: values[2] };
}

/** Predicted contrast of 0–3 layers and the windows of 1 and 2 layers. */
function contrastWindows(
  material: FlakeMaterialId,
  substrate: Substrate,
): { predictions: number[][]; windows: ContrastWindow[] } {
  const predictions = [0, 1, 2, 3].map((layers) => {
    if (layers === 0) return [0, 0, 0];
    const predicted = rgbContrast({ material, layers, substrate });
    return CHANNELS.map((channel) => predicted[channel]);
  });
  const windows = [1, 2].map((layers) => {
    const tolerance = [0, 1, 2].map((c) => {
      const gap = Math.min(
        Math.abs(predictions[layers][c] - predictions[layers - 1][c]),
        Math.abs(predictions[layers + 1][c] - predictions[layers][c]),
      );
      return Math.max(MIN_WINDOW_HALF_WIDTH, gap / 2);
    });
    return { layers, predicted: toRgb(predictions[layers]), tolerance: toRgb(tolerance) };
  });
  return { predictions, windows };
}

interface Classified {
  /** 0 = neither, 1 or 2 = inside that layer count's window. */
  readonly labels: Uint8Array;
  readonly labelCounts: readonly number[];
  /** Contrast per channel, filled for labelled pixels only. */
  readonly contrast: Float32Array;
}

/** Labels each working pixel 1 or 2 when its contrast is nearest that prediction and inside its window. */
function classify(
  image: WorkingImage,
  background: BackgroundSurface,
  predictions: number[][],
  windows: ContrastWindow[],
): Classified {
  const predicted = Float64Array.from(predictions.flat());
  const tolerance = Float64Array.from(windows.flatMap((window) => CHANNELS.map((channel) => window.tolerance[channel])));
  const pixels = image.width * image.height;
  const labels = new Uint8Array(pixels);
  const labelCounts = [0, 0, 0];
  const contrast = new Float32Array(3 * pixels);
  const rowBackground = new Float64Array(3 * image.width);
  const values = image.values;
  for (let y = 0; y < image.height; y += 1) {
    backgroundRow(background, y, rowBackground);
    for (let x = 0; x < image.width; x += 1) {
      const i = y * image.width + x;
      const bgRed = rowBackground[3 * x];
      const bgGreen = rowBackground[3 * x + 1];
      const bgBlue = rowBackground[3 * x + 2];
      if (!(bgRed > 0 && bgGreen > 0 && bgBlue > 0)) continue;
      const red = (bgRed - values[3 * i]) / bgRed;
      const green = (bgGreen - values[3 * i + 1]) / bgGreen;
      const blue = (bgBlue - values[3 * i + 2]) / bgBlue;
      let nearest = 0;
      let nearestDistance = Infinity;
      for (let layers = 0; layers < 4; layers += 1) {
        const dr = red - predicted[3 * layers];
        const dg = green - predicted[3 * layers + 1];
        const db = blue - predicted[3 * layers + 2];
        const distance = dr * dr + dg * dg + db * db;
        if (distance < nearestDistance) {
          nearestDistance = distance;
          nearest = layers;
        }
      }
      if (nearest !== 1 && nearest !== 2) continue;
      const w = 3 * (nearest - 1);
      const p = 3 * nearest;
      const dr = red - predicted[p];
      const dg = green - predicted[p + 1];
      const db = blue - predicted[p + 2];
      if (dr * dr <= tolerance[w] ** 2 && dg * dg <= tolerance[w + 1] ** 2 && db * db <= tolerance[w + 2] ** 2) {
        labels[i] = nearest;
        labelCounts[nearest] += 1;
        contrast[3 * i] = red;
        contrast[3 * i + 1] = green;
        contrast[3 * i + 2] = blue;
      }
    }
  }
  return { labels, labelCounts, contrast };
}

export function findLayerCandidates(input: CandidateInput): CandidateAnalysis {
  checkImage(input.rgba, input.width, input.height);
  if (!(input.umPerPixel > 0) || !Number.isFinite(input.umPerPixel)) {
    throw new AnalysisInputError(`The calibration must give a positive µm per pixel, got ${input.umPerPixel}.`);
  }
  const encoding = input.encoding ?? 'as-recorded';
  const table = encoding === 'srgb' ? Float32Array.from(intensityTable('srgb')) : null;
  const image = blockAverage(input.rgba, input.width, input.height, WORKING_MAX_PIXELS, table);
  const background = estimateSubstrateBackground(image.values, image.width, image.height);
  const { predictions, windows } = contrastWindows(input.material, input.substrate);
  const { labels, labelCounts, contrast } = classify(image, background, predictions, windows);

  const workingPixelAreaUm2 = (image.block * input.umPerPixel) ** 2;
  const minAreaUm2 = Math.max(input.minAreaUm2 ?? DEFAULT_MIN_AREA_UM2, 9 * workingPixelAreaUm2);
  const found: LayerCandidate[] = [];
  const mask = new Uint8Array(labels.length);
  const scratch = new Uint8Array(labels.length);
  for (const layers of [1, 2] as const) {
    if (labelCounts[layers] === 0) continue;
    for (let i = 0; i < labels.length; i += 1) mask[i] = labels[i] === layers ? 1 : 0;
    open3x3(mask, scratch, image.width, image.height);
    for (const region of connectedRegions(mask, image, input.width, contrast)) {
      const areaUm2 = region.imagePixels * input.umPerPixel * input.umPerPixel;
      if (areaUm2 < minAreaUm2) continue;
      const x = region.minX * image.block;
      const y = region.minY * image.block;
      found.push({
        layers,
        areaUm2,
        centroidPx: { x: region.centroidX, y: region.centroidY },
        boxPx: {
          x,
          y,
          width: Math.min(input.width, (region.maxX + 1) * image.block) - x,
          height: Math.min(input.height, (region.maxY + 1) * image.block) - y,
        },
        meanContrast: toRgb(region.mean),
      });
    }
  }
  found.sort((a, b) => a.layers - b.layers || b.areaUm2 - a.areaUm2);

  const notes = [
    `Areas are counted on a working grid of ${image.block} × ${image.block} image pixels (${(image.block * input.umPerPixel).toFixed(2)} µm a side); edges are uncertain by about half of that.`,
  ];
  if (background.tilesUsed < background.tilesTotal) {
    notes.push(
      `${background.tilesTotal - background.tilesUsed} of ${background.tilesTotal} background tiles were mostly flake and were left out of the substrate estimate.`,
    );
  }
  if (encoding === 'as-recorded') notes.push('Pixel values were used as recorded (no sRGB decoding).');

  return {
    material: input.material,
    substrate: input.substrate,
    umPerPixel: input.umPerPixel,
    blockSize: image.block,
    workingWidth: image.width,
    workingHeight: image.height,
    workingPixelAreaUm2,
    minAreaUm2,
    background: toRgb(backgroundAtCentre(background)),
    windows,
    candidates: found.slice(0, input.maxCandidates ?? DEFAULT_MAX_CANDIDATES),
    totalFound: found.length,
    datasets: predictionDatasets(input.material, input.substrate).map((dataset) => ({ ...dataset })),
    notes,
  };
}
