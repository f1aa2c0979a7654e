import type { LineageGraph, LineageGraphNode } from '@/shared/schemas/lineage-graph';
import { stepTypePhrase } from '@/components/samples/history-events';

/** "exfoliation", or "transfer, stacking" when several steps link the same two records. */
export function stepsPhrase(types: readonly string[]): string {
  return [...new Set(types.map(stepTypePhrase))].join(', ');
}

const BACK = ['This record', 'Parents', 'Grandparents', 'Great-grandparents'];
const ON = ['This record', 'Children', 'Grandchildren', 'Great-grandchildren'];

/** A generation's heading in the list: relatives by name up close, then by count. */
export function generationTitle(generation: number): string {
  const distance = Math.abs(generation);
  const names = generation < 0 ? BACK : ON;
  if (distance < names.length) return names[distance];
  return generation < 0 ? `${distance} generations back` : `${distance} generations on`;
}

/**
 * The combined layer call of a record (from its thickness evidence), or a note that a kind that
 * should have one has none yet; null for kinds where layers mean nothing (a crystal, a device).
 */
export function layerCall(node: Pick<LineageGraphNode, 'kind' | 'layerEstimate'>): string | null {
  if (node.layerEstimate !== null) return `${node.layerEstimate} ${node.layerEstimate === 1 ? 'layer' : 'layers'}`;
  return node.kind === 'flake' || node.kind === 'film' || node.kind === 'stack' ? 'no layer call yet' : null;
}

export interface MadeBy {
  /** Step types, worded. */
  steps: string;
  parentCodes: string[];
}

/** How each record in the picture was made: the steps and parents linking it from above. */
export function madeByIndex(graph: LineageGraph): Map<string, MadeBy> {
  const types = new Map<string, string[]>();
  const parents = new Map<string, string[]>();
  for (const edge of graph.edges) {
    types.set(edge.childCode, [...(types.get(edge.childCode) ?? []), edge.step.type]);
    const known = parents.get(edge.childCode) ?? [];
    if (!known.includes(edge.parentCode)) parents.set(edge.childCode, [...known, edge.parentCode]);
  }
  const index = new Map<string, MadeBy>();
  for (const [code, stepTypes] of types) index.set(code, { steps: stepsPhrase(stepTypes), parentCodes: parents.get(code) ?? [] });
  return index;
}
