import type { LineageGraph, LineageGraphNode } from '../../../shared/schemas/lineage-graph';
import { generationsInOrder, layoutLineageGraph, NODE_HEIGHT, NODE_WIDTH } from '../../../components/lineage/graph-layout';

// The layout must show lineage as layers: every link runs downwards (parents above children),
// boxes never overlap, and several steps between the same two records share one labelled link.
// These are the picture's own rules (common practice, no source); positions come from dagre.

const node = (code: string, generation: number, kind: LineageGraphNode['kind'] = 'flake'): LineageGraphNode => ({
  code,
  kind,
  material: 'MoS2',
  name: null,
  status: 'ready',
  layerEstimate: null,
  generation,
});
const step = (id: number, type: string) => ({ id, type, startedAt: null });

/** Two crystals → two flakes → a stack → a device, with a second step linking one pair. */
const graph: LineageGraph = {
  code: 'DV-1',
  nodes: [
    node('CR-A', -3, 'crystal'),
    node('CR-B', -3, 'crystal'),
    node('FK-A', -2),
    node('FK-B', -2),
    node('SK-1', -1, 'stack'),
    node('DV-1', 0, 'device'),
  ],
  edges: [
    { parentCode: 'CR-A', childCode: 'FK-A', step: step(1, 'exfoliation') },
    { parentCode: 'CR-B', childCode: 'FK-B', step: step(2, 'exfoliation') },
    { parentCode: 'FK-A', childCode: 'SK-1', step: step(3, 'stacking') },
    { parentCode: 'FK-B', childCode: 'SK-1', step: step(3, 'stacking') },
    { parentCode: 'SK-1', childCode: 'DV-1', step: step(4, 'lithography') },
    { parentCode: 'SK-1', childCode: 'DV-1', step: step(5, 'etching') },
  ],
};

/** A chain of n generations where every record has two parents (the one before and a side source). */
function deepGraph(generations: number): LineageGraph {
  const nodes: LineageGraphNode[] = [];
  const edges: LineageGraph['edges'] = [];
  for (let g = 0; g < generations; g += 1) {
    nodes.push(node(`N${g}`, g - generations + 1), node(`S${g}`, g - generations, 'crystal'));
    edges.push({ parentCode: `S${g}`, childCode: `N${g}`, step: step(2 * g + 1, 'transfer') });
    if (g > 0) edges.push({ parentCode: `N${g - 1}`, childCode: `N${g}`, step: step(2 * g + 2, 'stacking') });
  }
  return { code: `N${generations - 1}`, nodes, edges };
}

const describeSteps = (types: readonly string[]) => types.join(', ');

function expectLayered(layout: ReturnType<typeof layoutLineageGraph>) {
  const at = new Map(layout.nodes.map((placed) => [placed.node.code, placed]));
  for (const edge of layout.edges) {
    const parent = at.get(edge.parentCode)!;
    const child = at.get(edge.childCode)!;
    expect(parent.y + parent.height).toBeLessThanOrEqual(child.y);
    expect(edge.points.length).toBeGreaterThanOrEqual(2);
  }
  for (const a of layout.nodes) {
    for (const b of layout.nodes) {
      if (a === b) continue;
      const apart = a.x + a.width <= b.x || b.x + b.width <= a.x || a.y + a.height <= b.y || b.y + b.height <= a.y;
      expect(apart).toBe(true);
    }
    expect(a.x).toBeGreaterThanOrEqual(0);
    expect(a.y).toBeGreaterThanOrEqual(0);
    expect(a.x + a.width).toBeLessThanOrEqual(layout.width);
    expect(a.y + a.height).toBeLessThanOrEqual(layout.height);
  }
}

describe('lineage picture layout', () => {
  it('puts parents above children, keeps boxes apart and labels each link with its steps', () => {
    const layout = layoutLineageGraph(graph, describeSteps);
    expect(layout.nodes).toHaveLength(6);
    expect(layout.nodes.every((placed) => placed.width === NODE_WIDTH && placed.height === NODE_HEIGHT)).toBe(true);
    expectLayered(layout);
    // Six step links, five pairs: lithography and etching share the stack → device link.
    expect(layout.edges).toHaveLength(5);
    const last = layout.edges.find((edge) => edge.childCode === 'DV-1');
    expect(last?.label).toBe('lithography, etching');
    expect(layout.edges.find((edge) => edge.parentCode === 'FK-B')?.label).toBe('stacking');
  });

  it('lays out a 30-generation, two-parent ancestry in layers', () => {
    const layout = layoutLineageGraph(deepGraph(30), describeSteps);
    expect(layout.nodes).toHaveLength(60);
    expect(layout.edges).toHaveLength(59);
    expectLayered(layout);
  });

  it('orders the generation list from the farthest ancestors down to the descendants', () => {
    const withChild = { ...graph, nodes: [...graph.nodes, node('FK-Z', 1), node('FK-Y', 1)] };
    expect(generationsInOrder(withChild.nodes).map(([generation, nodes]) => [generation, nodes.map((n) => n.code)])).toEqual([
      [-3, ['CR-A', 'CR-B']],
      [-2, ['FK-A', 'FK-B']],
      [-1, ['SK-1']],
      [0, ['DV-1']],
      [1, ['FK-Y', 'FK-Z']],
    ]);
  });
});
