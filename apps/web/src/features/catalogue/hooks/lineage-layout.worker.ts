import dagre from '@dagrejs/dagre';
import type { LineageGraphResponse } from '@tappet/contracts';
import { layoutLineage, type Dagre, type LineageLayout } from './lineage-layout';

// Lays out lineage pictures for use-lineage-layout.ts, off the page's thread. Answers every
// request with its id: the layout, or null when dagre could not lay the graph out.
const scope = self as unknown as { onmessage: ((event: MessageEvent<{ id: number; graph: LineageGraphResponse }>) => void) | null; postMessage(message: { id: number; layout: LineageLayout | null }): void };

scope.onmessage = (event) => {
  const { id, graph } = event.data;
  try {
    scope.postMessage({ id, layout: layoutLineage(dagre as unknown as Dagre, graph) });
  } catch {
    scope.postMessage({ id, layout: null });
  }
};
