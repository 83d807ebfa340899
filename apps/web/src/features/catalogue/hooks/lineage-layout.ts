// The lineage picture's layout, without React: the layout worker (lineage-layout.worker.ts) and the
// hook (use-lineage-layout.ts) both use it.
import type * as DagreModule from '@dagrejs/dagre';
import type { LineageGraphResponse } from '@tappet/contracts';
import { interchangeShort, kindShort, quantityWords } from '../components/words';

type GraphNode = LineageGraphResponse['nodes'][number];
type GraphEdge = LineageGraphResponse['edges'][number];

export interface PlacedNode extends GraphNode {
  /** Centre and size, in pixels. */
  x: number;
  y: number;
  width: number;
  height: number;
}

export interface PlacedEdge extends GraphEdge {
  key: string;
  label: string;
  points: Array<{ x: number; y: number }>;
  labelX: number;
  labelY: number;
  labelWidth: number;
}

export interface LineageLayout {
  width: number;
  height: number;
  nodes: PlacedNode[];
  edges: PlacedEdge[];
}

/** What a part's box says about it besides its number, one line each. */
export type NodeMarker = 'focus' | 'current' | 'nla' | 'problem';

export function markersOf(node: Pick<GraphNode, 'isFocus' | 'isCurrent' | 'status' | 'inProblem'>): NodeMarker[] {
  const out: NodeMarker[] = [];
  if (node.isFocus) out.push('focus');
  if (node.isCurrent) out.push('current');
  if (node.status === 'nla') out.push('nla');
  if (node.inProblem) out.push('problem');
  return out;
}

/** Box size: number and description, then one 20 px line per marker. */
export function nodeSizeOf(node: Pick<GraphNode, 'isFocus' | 'isCurrent' | 'status' | 'inProblem'>): { width: number; height: number } {
  return { width: 184, height: 78 + 20 * markersOf(node).length };
}
const labelHeight = 24;

/** "replaced by ×2, one way", "contains ×4", "equivalent ×1, both ways". */
export function edgeLabel(edge: Pick<GraphEdge, 'kind' | 'interchange' | 'quantity'>): string {
  const how = interchangeShort(edge.kind, edge.interchange);
  return `${kindShort[edge.kind]} ${quantityWords(edge.quantity)}${how ? `, ${how}` : ''}`;
}

export type Dagre = Pick<typeof DagreModule, 'graphlib' | 'layout'>;

/**
 * Lays the lineage out top to bottom (older numbers above newer ones, kits above their
 * contents) with dagre. Edges whose ends are not in the picture (a truncated graph) are left out.
 * Cycles are fine: dagre turns an edge round while ranking and restores it for drawing.
 */
export function layoutLineage(dagre: Dagre, graph: LineageGraphResponse): LineageLayout {
  const g = new dagre.graphlib.Graph({ multigraph: true });
  g.setGraph({ rankdir: 'TB', nodesep: 28, ranksep: 72, edgesep: 20, marginx: 16, marginy: 16 });
  g.setDefaultEdgeLabel(() => ({}));
  const ids = new Set(graph.nodes.map((n) => n.partId));
  for (const node of graph.nodes) g.setNode(node.partId, nodeSizeOf(node));
  const kept = graph.edges
    .map((edge, index) => ({ edge, key: `e${index}`, label: edgeLabel(edge) }))
    .filter(({ edge }) => ids.has(edge.from) && ids.has(edge.to));
  for (const { edge, key, label } of kept) {
    // Label width from its length: the picture's label font is about 7.5 px a character.
    g.setEdge({ v: edge.from, w: edge.to, name: key }, { width: Math.ceil(label.length * 7.5) + 16, height: labelHeight, labelpos: 'c' });
  }
  dagre.layout(g);

  const nodes: PlacedNode[] = graph.nodes.map((node) => {
    const placed = g.node(node.partId);
    return { ...node, x: placed.x ?? 0, y: placed.y ?? 0, ...nodeSizeOf(node) };
  });
  const edges: PlacedEdge[] = kept.map(({ edge, key, label }) => {
    const placed = g.edge({ v: edge.from, w: edge.to, name: key });
    const points = placed.points ?? [];
    const mid = points[Math.floor(points.length / 2)] ?? { x: 0, y: 0 };
    return { ...edge, key, label, points, labelX: placed.x ?? mid.x, labelY: placed.y ?? mid.y, labelWidth: placed.width ?? 0 };
  });
  const size = g.graph();
  return { width: Math.ceil(size.width ?? 0), height: Math.ceil(size.height ?? 0), nodes, edges };
}
