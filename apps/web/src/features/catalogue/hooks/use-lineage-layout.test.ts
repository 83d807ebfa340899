import dagre from '@dagrejs/dagre';
import { renderHook, waitFor } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ids, lineageFixture } from '../testing';
import { edgeLabel, layoutLineage, nodeSizeOf } from './use-lineage-layout';

describe('layoutLineage', () => {
  it('places older numbers above newer ones and routes every edge between its boxes', () => {
    const layout = layoutLineage(dagre, lineageFixture());
    const y = Object.fromEntries(layout.nodes.map((n) => [n.partId, n.y]));
    expect(y[ids.old]).toBeLessThan(y[ids.mid]!);
    expect(y[ids.mid]).toBeLessThan(y[ids.current]!);
    expect(layout.edges).toHaveLength(2);
    for (const edge of layout.edges) expect(edge.points.length).toBeGreaterThanOrEqual(2);
    for (const node of layout.nodes) {
      expect(node.x - node.width / 2).toBeGreaterThanOrEqual(0);
      expect(node.y + node.height / 2).toBeLessThanOrEqual(layout.height);
    }
  });

  it('lays out a circle of replacements and a self-link without looping, and drops edges that leave the picture', () => {
    const base = lineageFixture();
    const graph = {
      ...base,
      edges: [
        ...base.edges,
        { from: ids.current, to: ids.old, kind: 'replaced_by' as const, interchange: 'both' as const, quantity: 1 },
        { from: ids.mid, to: ids.mid, kind: 'replaced_by' as const, interchange: 'both' as const, quantity: 1 },
        { from: ids.old, to: ids.kit, kind: 'kit_contains' as const, interchange: 'both' as const, quantity: 3 },
      ],
      truncated: true,
    };
    const layout = layoutLineage(dagre, graph);
    expect(layout.nodes).toHaveLength(3);
    expect(layout.edges.map((e) => `${e.from}>${e.to}`)).not.toContain(`${ids.old}>${ids.kit}`);
    expect(layout.edges).toHaveLength(4);
  });

  it('gives each marker its own line in the box', () => {
    const plain = nodeSizeOf({ isFocus: false, isCurrent: false, status: 'available', inProblem: false });
    const busy = nodeSizeOf({ isFocus: true, isCurrent: true, status: 'nla', inProblem: true });
    expect(busy.height - plain.height).toBe(80);
  });

  it('labels edges with kind, quantity and direction', () => {
    expect(edgeLabel({ kind: 'replaced_by', interchange: 'one_way', quantity: 2 })).toBe('replaced by ×2, one way');
    expect(edgeLabel({ kind: 'kit_contains', interchange: 'both', quantity: 4 })).toBe('contains ×4');
    expect(edgeLabel({ kind: 'equivalent', interchange: 'both', quantity: 0.5 })).toBe('equivalent ×0.5, both ways');
  });
});

describe('useLineageLayout and its worker', () => {
  /** A stand-in Worker: records what it is sent, and answers as the real worker module does, or fails to start. */
  function fakeWorker(mode: 'answers' | 'fails to start') {
    const sent: unknown[] = [];
    class FakeWorker {
      onmessage: ((event: MessageEvent) => void) | null = null;
      onerror: ((event: Event) => void) | null = null;
      constructor(readonly url: URL) {}
      postMessage(message: { id: number; graph: ReturnType<typeof lineageFixture> }) {
        sent.push(message);
        setTimeout(() => {
          if (mode === 'fails to start') this.onerror?.(new Event('error'));
          else this.onmessage?.({ data: { id: message.id, layout: layoutLineage(dagre, message.graph) } } as MessageEvent);
        }, 0);
      }
      terminate() {}
    }
    vi.stubGlobal('Worker', FakeWorker);
    return sent;
  }

  afterEach(() => {
    vi.unstubAllGlobals();
    vi.resetModules();
  });

  it('hands the graph to the worker and shows the layout it answers', async () => {
    const sent = fakeWorker('answers');
    const { useLineageLayout } = await import('./use-lineage-layout');
    const graph = lineageFixture();
    const { result } = renderHook(() => useLineageLayout(graph));
    expect(result.current.status).toBe('pending');
    await waitFor(() => expect(result.current.status).toBe('ready'));
    expect(sent).toEqual([{ id: 1, graph }]);
    expect(result.current).toEqual({ status: 'ready', layout: layoutLineage(dagre, graph) });
  });

  it('lays the graph out in the page when the worker cannot start', async () => {
    const sent = fakeWorker('fails to start');
    const { useLineageLayout } = await import('./use-lineage-layout');
    const graph = lineageFixture();
    const { result } = renderHook(() => useLineageLayout(graph));
    // The layout library is loaded in the page first (slow in a test run).
    await waitFor(() => expect(result.current.status).toBe('ready'), { timeout: 5000 });
    expect(sent).toHaveLength(1);
    expect(result.current).toEqual({ status: 'ready', layout: layoutLineage(dagre, graph) });
    // Later pictures do not try the worker again.
    const another = lineageFixture();
    const second = renderHook(() => useLineageLayout(another));
    await waitFor(() => expect(second.result.current.status).toBe('ready'), { timeout: 5000 });
    expect(sent).toHaveLength(1);
  });
});
