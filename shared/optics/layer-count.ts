/**
 * Layer count from measured optical contrast: predict the contrast of 1…N layers under each
 * measured illumination, score every candidate by χ² = Σ ((C_measured − C_predicted) / σ)², and
 * report the best candidate, the runner-up and how far apart they are.
 *
 * The margin is Δχ² = χ²(runner-up) − χ²(best). Under Gaussian errors, Δχ² of 4 and 9 are the
 * usual "2σ" and "3σ" separations between two hypotheses, which is where the words change:
 * clear (Δχ² ≥ 9), marginal (4 ≤ Δχ² < 9), ambiguous (Δχ² < 4) (common practice, no source).
 * If even the best candidate misses a measurement by more than 3σ, the model does not describe
 * the flake (wrong material, substrate, oxide thickness, or a residue), and the call is never
 * stronger than marginal.
 */
import { contrastUnder, type Illumination, predictionDatasets, type Substrate } from './contrast';
import { type DatasetInfo, type FlakeMaterialId } from './materials';

export interface ContrastMeasurement {
  readonly illumination: Illumination;
  /** Measured contrast in the sign convention of contrast.ts (positive = flake darker). */
  readonly contrast: number;
  /** One standard deviation, absolute; `DEFAULT_CONTRAST_UNCERTAINTY` when omitted. */
  readonly uncertainty?: number;
}

export interface LayerCountQuery {
  readonly material: FlakeMaterialId;
  readonly substrate: Substrate;
  readonly measurements: readonly ContrastMeasurement[];
  /** Largest layer count considered; candidates are 1 … maxLayers. */
  readonly maxLayers?: number;
}

export type MatchConfidence = 'clear' | 'marginal' | 'ambiguous';

export interface LayerCandidate {
  readonly layers: number;
  /** Predicted contrast for each measurement, in the order given. */
  readonly predicted: readonly number[];
  readonly chiSquared: number;
  /** Largest |measured − predicted| / σ over the measurements. */
  readonly worstDeviation: number;
}

export interface LayerCountMatch {
  readonly best: LayerCandidate;
  readonly runnerUp: LayerCandidate;
  /** χ²(runner-up) − χ²(best), ≥ 0. */
  readonly margin: number;
  readonly confidence: MatchConfidence;
  /** True when even the best candidate misses some measurement by more than 3σ. */
  readonly isPoorFit: boolean;
  /** One or two sentences for the person at the microscope. */
  readonly summary: string;
  /** Every candidate, ordered by layer count. */
  readonly candidates: readonly LayerCandidate[];
  readonly datasets: readonly DatasetInfo[];
}

/**
 * Default one-sigma uncertainty of a measured contrast, absolute. Typical of contrast read from a
 * camera image with a few-percent intensity noise (common practice, no source).
 */
export const DEFAULT_CONTRAST_UNCERTAINTY = 0.01;
export const DEFAULT_MAX_LAYERS = 10;
/** Δχ² thresholds for the confidence words (see the module comment). */
export const CLEAR_MARGIN = 9;
export const MARGINAL_MARGIN = 4;
/** A best fit missing any measurement by more than this many σ is flagged as a poor fit. */
export const POOR_FIT_SIGMAS = 3;

function confidenceFor(margin: number, isPoorFit: boolean): MatchConfidence {
  if (margin < MARGINAL_MARGIN) return 'ambiguous';
  if (margin < CLEAR_MARGIN || isPoorFit) return 'marginal';
  return 'clear';
}

function layersWord(layers: number): string {
  return layers === 1 ? '1 layer' : `${layers} layers`;
}

function describe(best: LayerCandidate, runnerUp: LayerCandidate, confidence: MatchConfidence, isPoorFit: boolean): string {
  const ranking = `Best match ${layersWord(best.layers)} (χ² ${best.chiSquared.toFixed(1)}), next ${layersWord(runnerUp.layers)} (χ² ${runnerUp.chiSquared.toFixed(1)}).`;
  const verdict =
    confidence === 'clear'
      ? 'The other layer counts are well outside the measurement uncertainty.'
      : confidence === 'marginal'
        ? 'The runner-up is only 2–3 standard deviations worse; confirm with Raman, PL or AFM.'
        : `${layersWord(best.layers)} and ${layersWord(runnerUp.layers)} both fit within the uncertainty; contrast alone cannot tell them apart.`;
  const fit = isPoorFit
    ? ' Even the best match misses a measurement by more than 3 standard deviations: check the material, substrate and oxide thickness.'
    : '';
  return `${ranking} ${verdict}${fit}`;
}

export function matchLayerCount(query: LayerCountQuery): LayerCountMatch {
  const maxLayers = query.maxLayers ?? DEFAULT_MAX_LAYERS;
  if (!Number.isInteger(maxLayers) || maxLayers < 2) {
    throw new RangeError(`maxLayers must be a whole number of at least 2, got ${maxLayers}`);
  }
  if (query.measurements.length === 0) throw new RangeError('At least one contrast measurement is needed');
  const sigmas = query.measurements.map((measurement) => {
    const sigma = measurement.uncertainty ?? DEFAULT_CONTRAST_UNCERTAINTY;
    if (!(sigma > 0) || !Number.isFinite(sigma)) throw new RangeError(`Uncertainty must be positive, got ${sigma}`);
    if (!Number.isFinite(measurement.contrast)) throw new RangeError('Measured contrast must be a finite number');
    return sigma;
  });

  const candidates: LayerCandidate[] = [];
  for (let layers = 1; layers <= maxLayers; layers += 1) {
    const flake = { material: query.material, layers, substrate: query.substrate };
    const predicted = query.measurements.map((measurement) => contrastUnder(flake, measurement.illumination));
    let chiSquared = 0;
    let worstDeviation = 0;
    predicted.forEach((prediction, i) => {
      const deviation = Math.abs(query.measurements[i].contrast - prediction) / sigmas[i];
      chiSquared += deviation * deviation;
      worstDeviation = Math.max(worstDeviation, deviation);
    });
    candidates.push({ layers, predicted, chiSquared, worstDeviation });
  }

  const ranked = [...candidates].sort((a, b) => a.chiSquared - b.chiSquared || a.layers - b.layers);
  const [best, runnerUp] = ranked;
  const margin = runnerUp.chiSquared - best.chiSquared;
  const isPoorFit = best.worstDeviation > POOR_FIT_SIGMAS;
  const confidence = confidenceFor(margin, isPoorFit);
  return {
    best,
    runnerUp,
    margin,
    confidence,
    isPoorFit,
    summary: describe(best, runnerUp, confidence, isPoorFit),
    candidates,
    datasets: predictionDatasets(query.material, query.substrate),
  };
}
