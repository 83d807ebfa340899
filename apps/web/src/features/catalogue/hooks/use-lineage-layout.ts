import type { LineageGraphResponse } from '@tappet/contracts';
import { useEffect, useState } from 'react';
import { layoutLineage, type Dagre, type LineageLayout } from './lineage-layout';

export * from './lineage-layout';

export type LineageLayoutState = { status: 'pending' } | { status: 'ready'; layout: LineageLayout } | { status: 'failed' };

/** The layout library in this thread: where no worker can start (tests, a blocked worker script). */
function layOutHere(graph: LineageGraphResponse): Promise<LineageLayoutState> {
  return import('@dagrejs/dagre').then(
    (mod) => {
      // The ESM build has a default export; some interop layers hand over the namespace only.
      const dagre: Dagre = (mod as unknown as { default?: Dagre }).default ?? mod;
      try {
        return { status: 'ready', layout: layoutLineage(dagre, graph) };
      } catch {
        return { status: 'failed' };
      }
    },
    () => ({ status: 'failed' }),
  );
}

/**
 * One worker lays out every picture, started on first use: a large lineage takes dagre long
 * enough to hold up a tablet's screen (docs/decisions/027-part-page-first-load.md, "Later").
 */
let worker: Worker | null | undefined;
let nextId = 0;
const waiting = new Map<number, { graph: LineageGraphResponse; done: (state: LineageLayoutState) => void }>();

function layoutWorker(): Worker | null {
  if (worker !== undefined) return worker;
  if (typeof Worker === 'undefined') return (worker = null);
  try {
    worker = new Worker(new URL('./lineage-layout.worker.ts', import.meta.url), { type: 'module' });
  } catch {
    return (worker = null);
  }
  worker.onmessage = (event: MessageEvent<{ id: number; layout: LineageLayout | null }>) => {
    const request = waiting.get(event.data.id);
    waiting.delete(event.data.id);
    request?.done(event.data.layout ? { status: 'ready', layout: event.data.layout } : { status: 'failed' });
  };
  // The worker could not start: what it was given is laid out here, and so is everything after.
  worker.onerror = () => {
    worker?.terminate();
    worker = null;
    const pending = [...waiting.values()];
    waiting.clear();
    for (const { graph, done } of pending) void layOutHere(graph).then(done);
  };
  return worker;
}

function layOut(graph: LineageGraphResponse): Promise<LineageLayoutState> {
  const target = layoutWorker();
  if (!target) return layOutHere(graph);
  return new Promise((done) => {
    const id = ++nextId;
    waiting.set(id, { graph, done });
    target.postMessage({ id, graph });
  });
}

/** Lays out the graph whenever it changes, off the page's thread where a worker can run. */
export function useLineageLayout(graph: LineageGraphResponse | undefined): LineageLayoutState {
  const [state, setState] = useState<{ graph: LineageGraphResponse; result: LineageLayoutState } | null>(null);

  useEffect(() => {
    if (!graph) return;
    let live = true;
    void layOut(graph).then((result) => {
      if (live) setState({ graph, result });
    });
    return () => {
      live = false;
    };
  }, [graph]);

  if (!graph || !state || state.graph !== graph) return { status: 'pending' };
  return state.result;
}
