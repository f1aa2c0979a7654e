/**
 * Layer count from two regions marked on a micrograph: the mean colour of the flake region against
 * that of the bare substrate beside it, per channel (shared/optics/micrograph.ts), compared with the
 * predicted contrast of 1…10 layers on that substrate (shared/optics/layer-count.ts).
 *
 * Per-pixel values are linearised before averaging when the image is sRGB-encoded, so the means
 * are means of light intensity. The uncertainty per channel is the larger of the default contrast
 * uncertainty (camera and illumination systematics) and the standard error of the two means.
 */
import { type Substrate } from '../optics/contrast';
import { DEFAULT_CONTRAST_UNCERTAINTY, matchLayerCount } from '../optics/layer-count';
import { type FlakeMaterialId } from '../optics/materials';
import { channelMeasurements, type PixelEncoding, regionContrast, srgbToLinear } from '../optics/micrograph';
import { type ContrastAnalysis, type Region, type RegionStats } from '../schemas/evidence-analysis';
import { AnalysisInputError } from './errors';
import { layerEstimate } from './layer-estimate';
import { forEachRegionPixel, regionsOverlap } from './regions';

export interface RegionContrastInput {
  /** 8-bit RGBA, row by row from the top-left corner, 4 bytes a pixel. */
  readonly rgba: ArrayLike<number>;
  readonly width: number;
  readonly height: number;
  readonly flakeRegion: Region;
  readonly substrateRegion: Region;
  readonly material: FlakeMaterialId;
  readonly substrate: Substrate;
  readonly encoding?: PixelEncoding;
  readonly maxLayers?: number;
}

/** Fewest pixels a marked region must cover for a mean worth comparing (common practice, no source). */
export const MIN_REGION_PIXELS = 9;

/** Intensity of each 8-bit value on a 0–255 scale: as recorded, or linear light decoded from sRGB. */
export function intensityTable(encoding: PixelEncoding): Float64Array {
  return Float64Array.from({ length: 256 }, (_, value) => (encoding === 'srgb' ? 255 * srgbToLinear(value / 255) : value));
}

export function checkImage(rgba: ArrayLike<number>, width: number, height: number): void {
  if (!Number.isInteger(width) || !Number.isInteger(height) || width < 1 || height < 1) {
    throw new AnalysisInputError(`An image needs a positive whole width and height, got ${width} × ${height}.`);
  }
  if (rgba.length !== width * height * 4) {
    throw new AnalysisInputError(
      `The pixel buffer holds ${rgba.length} bytes; a ${width} × ${height} RGBA image needs ${width * height * 4}.`,
    );
  }
}

function regionStats(input: RegionContrastInput, region: Region, table: Float64Array, what: string): RegionStats {
  const sums = [0, 0, 0];
  const squares = [0, 0, 0];
  const pixelCount = forEachRegionPixel(region, input.width, input.height, (x, y) => {
    const offset = 4 * (y * input.width + x);
    for (let channel = 0; channel < 3; channel += 1) {
      const value = table[input.rgba[offset + channel]];
      sums[channel] += value;
      squares[channel] += value * value;
    }
  });
  if (pixelCount < MIN_REGION_PIXELS) {
    throw new AnalysisInputError(
      pixelCount === 0
        ? `The ${what} region lies outside the image.`
        : `The ${what} region covers ${pixelCount} pixels inside the image; mark at least ${MIN_REGION_PIXELS}.`,
    );
  }
  const mean = sums.map((sum) => sum / pixelCount);
  const stdDev = squares.map((square, channel) => Math.sqrt(Math.max(0, square / pixelCount - mean[channel] ** 2)));
  return {
    pixelCount,
    mean: { red: mean[0], green: mean[1], blue: mean[2] },
    stdDev: { red: stdDev[0], green: stdDev[1], blue: stdDev[2] },
  };
}

function channelUncertainty(flake: RegionStats, substrate: RegionStats, channel: 'red' | 'green' | 'blue'): number {
  const s = substrate.mean[channel];
  const f = flake.mean[channel];
  if (!(s > 0)) return DEFAULT_CONTRAST_UNCERTAINTY;
  // C = 1 − F/S, so σ_C² = (σ_F̄/S)² + (F σ_S̄/S²)², with σ of a mean = σ/√n.
  const standardError = Math.hypot(
    flake.stdDev[channel] / Math.sqrt(flake.pixelCount) / s,
    (f * substrate.stdDev[channel]) / Math.sqrt(substrate.pixelCount) / (s * s),
  );
  return Math.max(DEFAULT_CONTRAST_UNCERTAINTY, standardError);
}

export function analyzeRegionContrast(input: RegionContrastInput): ContrastAnalysis {
  checkImage(input.rgba, input.width, input.height);
  const encoding = input.encoding ?? 'as-recorded';
  const table = intensityTable(encoding);
  const flake = regionStats(input, input.flakeRegion, table, 'flake');
  const substrateRegion = regionStats(input, input.substrateRegion, table, 'substrate');
  for (const channel of ['red', 'green', 'blue'] as const) {
    if (!(substrateRegion.mean[channel] > 0)) {
      throw new AnalysisInputError(`The substrate region is black in the ${channel} channel; contrast cannot be measured there.`);
    }
  }
  const notes: string[] = [];
  if (regionsOverlap(input.flakeRegion, input.substrateRegion, input.width, input.height)) {
    notes.push('The flake and substrate regions overlap; the contrast is diluted.');
  }
  if (encoding === 'as-recorded') {
    notes.push(
      'Pixel values were used as recorded. For ordinary JPEG/PNG (sRGB) images choose sRGB decoding to work with light intensity.',
    );
  }

  const measured = regionContrast(flake.mean, substrateRegion.mean);
  const uncertainty = {
    red: channelUncertainty(flake, substrateRegion, 'red'),
    green: channelUncertainty(flake, substrateRegion, 'green'),
    blue: channelUncertainty(flake, substrateRegion, 'blue'),
  };
  const measurements = channelMeasurements(measured).map((measurement, i) => ({
    ...measurement,
    uncertainty: [uncertainty.red, uncertainty.green, uncertainty.blue][i],
  }));
  const match = matchLayerCount({
    material: input.material,
    substrate: input.substrate,
    measurements,
    maxLayers: input.maxLayers,
  });
  const best = match.best.layers;
  const runnerUp = match.runnerUp.layers;
  const layerUncertainty =
    match.confidence === 'clear'
      ? match.isPoorFit
        ? 1
        : 0
      : match.confidence === 'marginal'
        ? 1
        : Math.max(1, Math.abs(runnerUp - best));

  return {
    material: input.material,
    substrate: input.substrate,
    pixelEncoding: encoding,
    flake,
    substrateRegion,
    measured: { red: measured.red, green: measured.green, blue: measured.blue },
    uncertainty,
    predictions: match.candidates.map((candidate) => ({
      layers: candidate.layers,
      predicted: { red: candidate.predicted[0], green: candidate.predicted[1], blue: candidate.predicted[2] },
      chiSquared: candidate.chiSquared,
    })),
    bestLayers: best,
    runnerUpLayers: runnerUp,
    margin: match.margin,
    confidence: match.confidence,
    isPoorFit: match.isPoorFit,
    summary: match.summary,
    datasets: match.datasets.map((dataset) => ({ ...dataset })),
    estimate: layerEstimate(
      'optical_contrast',
      best,
      layerUncertainty,
      `Contrast R ${measured.red.toFixed(3)}, G ${measured.green.toFixed(3)}, B ${measured.blue.toFixed(3)} best matches ${best} layer${
        best === 1 ? '' : 's'
      } (${match.confidence}; next ${runnerUp}, Δχ² ${match.margin.toFixed(1)}).`,
    ),
    notes,
  };
}
