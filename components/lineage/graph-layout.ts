import dagre from '@dagrejs/dagre';
import type { LineageGraph, LineageGraphEdge, LineageGraphNode } from '@/shared/schemas/lineage-graph';

/** Node box size in layout units (px at zoom 1): room for a code, a kind · material line and a layer call. */
export const NODE_WIDTH = 208;
export const NODE_HEIGHT = 76;
/** Edge labels are one short line of caption text; the width estimate keeps dagre from overlapping them. */
const EDGE_LABEL_HEIGHT = 20;
const EDGE_LABEL_CHAR_WIDTH = 7.5;
const EDGE_LABEL_PADDING = 12;
/** Gaps between boxes; ranks far enough apart for a label between them (common practice, no source). */
const LAYOUT = { rankdir: 'TB', nodesep: 28, edgesep: 16, ranksep: 56, marginx: 24, marginy: 24 } as const;

export interface Point {
  x: number;
  y: number;
}

export interface PlacedNode {
  node: LineageGraphNode;
  /** Top-left corner. */
  x: number;
  y: number;
  width: number;
  height: number;
}

/** One drawn link between two records; several steps linking the same pair share it. */
export interface PlacedEdge {
  key: string;
  parentCode: string;
  childCode: string;
  steps: LineageGraphEdge['step'][];
  label: string;
  points: Point[];
  labelAt: Point;
}

export interface GraphLayout {
  nodes: PlacedNode[];
  edges: PlacedEdge[];
  width: number;
  height: number;
}

interface EdgeData {
  label: string;
  width: number;
  height: number;
  labelpos: 'c';
  points?: Point[];
  x?: number;
  y?: number;
}

const pairKey = (parentCode: string, childCode: string) => `${parentCode}\u0000${childCode}`;

/**
 * Places a lineage graph in layers with dagre: links point down, so sources sit at the top and
 * descendants below. `describeSteps` words the step types of an edge's label.
 */
export function layoutLineageGraph(graph: LineageGraph, describeSteps: (types: readonly string[]) => string): GraphLayout {
  const g = new dagre.graphlib.Graph<
    Record<string, unknown>,
    { width: number; height: number; x?: number; y?: number },
    EdgeData
  >();
  g.setGraph({ ...LAYOUT });
  g.setDefaultEdgeLabel(() => ({ label: '', width: 0, height: 0, labelpos: 'c' }));

  const known = new Set(graph.nodes.map((node) => node.code));
  for (const node of graph.nodes) g.setNode(node.code, { width: NODE_WIDTH, height: NODE_HEIGHT });

  const grouped = new Map<string, { parentCode: string; childCode: string; steps: LineageGraphEdge['step'][] }>();
  for (const edge of graph.edges) {
    // An edge to a record outside the picture cannot be drawn; the server sends none, but be safe.
    if (!known.has(edge.parentCode) || !known.has(edge.childCode)) continue;
    const key = pairKey(edge.parentCode, edge.childCode);
    const group = grouped.get(key) ?? { parentCode: edge.parentCode, childCode: edge.childCode, steps: [] };
    if (!group.steps.some((step) => step.id === edge.step.id)) group.steps.push(edge.step);
    grouped.set(key, group);
  }
  const labels = new Map<string, string>();
  for (const [key, group] of grouped) {
    const label = describeSteps(group.steps.map((step) => step.type));
    labels.set(key, label);
    g.setEdge(group.parentCode, group.childCode, {
      label,
      width: label.length * EDGE_LABEL_CHAR_WIDTH + EDGE_LABEL_PADDING,
      height: EDGE_LABEL_HEIGHT,
      labelpos: 'c',
    });
  }

  dagre.layout(g);

  const nodes: PlacedNode[] = graph.nodes.map((node) => {
    const placed = g.node(node.code);
    return {
      node,
      x: (placed.x ?? 0) - NODE_WIDTH / 2,
      y: (placed.y ?? 0) - NODE_HEIGHT / 2,
      width: NODE_WIDTH,
      height: NODE_HEIGHT,
    };
  });
  const edges: PlacedEdge[] = [...grouped.entries()].map(([key, group]) => {
    const data = g.edge(group.parentCode, group.childCode);
    const points = data.points ?? [];
    const middle = points[Math.floor(points.length / 2)] ?? { x: 0, y: 0 };
    return {
      key,
      parentCode: group.parentCode,
      childCode: group.childCode,
      steps: group.steps,
      label: labels.get(key) ?? '',
      points,
      labelAt: { x: data.x ?? middle.x, y: data.y ?? middle.y },
    };
  });
  const size = g.graph();
  return { nodes, edges, width: Number(size.width ?? 0), height: Number(size.height ?? 0) };
}

/** Generations top to bottom as in the picture: the farthest ancestors first, then the record (0), then its descendants. */
export function generationsInOrder(nodes: readonly LineageGraphNode[]): [number, LineageGraphNode[]][] {
  const groups = new Map<number, LineageGraphNode[]>();
  for (const node of nodes) groups.set(node.generation, [...(groups.get(node.generation) ?? []), node]);
  return [...groups.entries()]
    .sort(([a], [b]) => a - b)
    .map(([generation, members]) => [generation, [...members].sort((a, b) => a.code.localeCompare(b.code))]);
}
