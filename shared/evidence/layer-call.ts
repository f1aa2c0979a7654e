/**
 * One layer call per flake from all its evidence. Each estimate allows a range of layer counts
 * (layers ± uncertainty, or "at least" for a lower bound). The estimates agree when some count
 * lies in every range; the call is then the count in that common range nearest to the
 * precision-weighted mean of the exact estimates. When no count fits all of them the flake gets
 * no call, and the summary says in plain words who says what ("Raman says 1, contrast says 2").
 */
import { type LayerCall, type LayerCallEstimate } from '../schemas/evidence-analysis';
import { LAYER_METHOD_WORDS } from '../schemas/evidence-analysis';
import { allowedRange, describeLayers } from './layer-estimate';

export type { LayerCall, LayerCallEstimate };

function layersWord(layers: number): string {
  return layers === 1 ? '1 layer' : `${layers} layers`;
}

function capitalise(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** "Raman says 1, contrast says 2 or more": one phrase per method, in the order the evidence came. */
export function whoSaysWhat(items: readonly LayerCallEstimate[]): string {
  const byMethod = new Map<string, string[]>();
  for (const item of items) {
    const word = LAYER_METHOD_WORDS[item.estimate.method];
    const said = byMethod.get(word) ?? [];
    said.push(describeLayers(item.estimate));
    byMethod.set(word, said);
  }
  const phrases = [...byMethod.entries()].map(([word, said]) => {
    const distinct = [...new Set(said)];
    const times = said.length > 1 && distinct.length === 1 ? ` (${said.length} measurements)` : '';
    return `${word} says ${distinct.join(' and ')}${times}`;
  });
  return capitalise(phrases.join(', '));
}

/** Precision weight of an exact estimate: tighter estimates pull the call harder. */
function weight(uncertainty: number): number {
  return 1 / (uncertainty + 0.5) ** 2;
}

export function combineLayerEstimates(items: readonly LayerCallEstimate[]): LayerCall {
  const estimates = [...items];
  if (estimates.length === 0) {
    return {
      layers: null,
      atLeast: null,
      uncertainty: null,
      status: 'no_evidence',
      summary: 'No evidence gives a layer count yet.',
      estimates,
    };
  }
  const ranges = estimates.map((item) => allowedRange(item.estimate));
  const low = Math.max(...ranges.map((range) => range.low));
  const high = Math.min(...ranges.map((range) => range.high));
  const said = whoSaysWhat(estimates);
  const status = estimates.length === 1 ? 'single' : 'agreeing';

  if (low > high) {
    return {
      layers: null,
      atLeast: null,
      uncertainty: null,
      status: 'disagreeing',
      summary: `${said}: they disagree, so there is no layer call.`,
      estimates,
    };
  }
  const exact = estimates.filter((item) => !item.estimate.isLowerBound);
  if (exact.length === 0) {
    const summary = status === 'single' ? `${said}.` : `${said}: together, at least ${layersWord(low)}.`;
    return { layers: null, atLeast: low, uncertainty: 0, status, summary, estimates };
  }
  const totalWeight = exact.reduce((sum, item) => sum + weight(item.estimate.uncertainty), 0);
  const mean = exact.reduce((sum, item) => sum + weight(item.estimate.uncertainty) * item.estimate.layers, 0) / totalWeight;
  const layers = Math.min(high, Math.max(low, Math.round(mean)));
  const uncertainty = Math.max(layers - low, high - layers);
  const call = uncertainty === 0 ? layersWord(layers) : `${layersWord(layers)} (± ${uncertainty})`;
  const summary = status === 'single' ? `${said}.` : `${said}: they agree on ${call}.`;
  return { layers, atLeast: null, uncertainty, status, summary, estimates };
}
