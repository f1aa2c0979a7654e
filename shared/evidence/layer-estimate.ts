/**
 * A layer estimate: the layer count one piece of evidence supports, its uncertainty in layers, the
 * method, and the basis in words. Also the little arithmetic on estimates the combined call needs.
 */
import { LAYER_METHOD_WORDS, type LayerEstimate, type LayerMethod } from '../schemas/evidence-analysis';

export type { LayerEstimate, LayerMethod };

export function layerEstimate(method: LayerMethod, layers: number, uncertainty: number, basis: string): LayerEstimate {
  if (!Number.isInteger(layers) || layers < 1)
    throw new RangeError(`A layer estimate needs a whole number of layers ≥ 1, got ${layers}`);
  if (!(uncertainty >= 0)) throw new RangeError(`A layer uncertainty cannot be negative, got ${uncertainty}`);
  return { layers, uncertainty, method, basis };
}

/** "At least `layers`": evidence that rules out fewer layers but cannot count more. */
export function lowerBoundEstimate(method: LayerMethod, layers: number, uncertainty: number, basis: string): LayerEstimate {
  return { ...layerEstimate(method, layers, uncertainty, basis), isLowerBound: true };
}

/** The layer counts an estimate allows, [low, high] (high is Infinity for a lower bound). */
export function allowedRange(estimate: LayerEstimate): { low: number; high: number } {
  const low = Math.max(1, Math.ceil(estimate.layers - estimate.uncertainty - 1e-9));
  const high = estimate.isLowerBound ? Infinity : Math.floor(estimate.layers + estimate.uncertainty + 1e-9);
  return { low, high };
}

/** The count in words: "1", "2 or more", "3 ± 1". */
export function describeLayers(estimate: Pick<LayerEstimate, 'layers' | 'uncertainty' | 'isLowerBound'>): string {
  if (estimate.isLowerBound) return `${estimate.layers} or more`;
  if (estimate.uncertainty === 0) return String(estimate.layers);
  return `${estimate.layers} ± ${Number(estimate.uncertainty.toFixed(1))}`;
}

/** "Raman says 1", "contrast says 2 or more". */
export function describeEstimate(estimate: LayerEstimate): string {
  return `${LAYER_METHOD_WORDS[estimate.method]} says ${describeLayers(estimate)}`;
}
