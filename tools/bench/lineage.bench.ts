// Lineage engine: building the graph and resolving numbers, at 10k, 50k and 200k parts
// (links at 30 % of parts, as in the 200k parts / 60k links). Target: resolve p95 ≤ 2 ms.
import { buildLineageGraph, type LineageLink, type LineagePart } from '@tappet/domain';
import { performance } from 'node:perf_hooks';
import { prng, summarise, timeRuns, type Figure } from './harness';

/** A generated catalogue: chains of replacements, some splits, kits, equivalents and nla ends. */
export function generateCatalogue(partCount: number, seed = 7): { parts: LineagePart[]; links: LineageLink[] } {
  const rand = prng(seed);
  const parts: LineagePart[] = [];
  for (let i = 0; i < partCount; i++) {
    parts.push({ id: `p${i}`, number: `${10 + (i % 90)}-${String(i).padStart(6, '0')}`, status: rand() < 0.05 ? 'nla' : 'available' });
  }
  const links: LineageLink[] = [];
  const linkCount = Math.round(partCount * 0.3);
  const interchanges = ['both', 'one_way', 'with_changes'] as const;
  for (let n = 0; n < linkCount; n++) {
    // Mostly forward in id order, so chains form without many cycles; a few equivalents and kits.
    const from = Math.floor(rand() * (partCount - 10));
    const to = from + 1 + Math.floor(rand() * 9);
    const r = rand();
    const kind = r < 0.8 ? 'replaced_by' : r < 0.9 ? 'equivalent' : 'kit_contains';
    links.push({
      kind,
      fromId: `p${from}`,
      toId: `p${to}`,
      quantity: rand() < 0.1 ? 2 : 1,
      interchange: kind === 'equivalent' ? (rand() < 0.5 ? 'both' : 'one_way') : interchanges[Math.floor(rand() * 3)]!,
    });
  }
  return { parts, links };
}

export function runLineageBench(sizes = [10_000, 50_000, 200_000]): Figure[] {
  const figures: Figure[] = [];
  for (const size of sizes) {
    const { parts, links } = generateCatalogue(size);
    const t0 = performance.now();
    const graph = buildLineageGraph(parts, links);
    graph.problems();
    const buildMs = performance.now() - t0;
    figures.push({ name: `lineage: build graph + problems, ${size.toLocaleString('en')} parts`, unit: 'ms', median: buildMs, p95: buildMs, note: 'one run' });
    const rand = prng(99);
    const ids = Array.from({ length: 2000 }, () => `p${Math.floor(rand() * size)}`);
    const resolve = timeRuns((i) => {
      const id = ids[i % ids.length]!;
      graph.currentParts(id);
      graph.canFill(id);
    }, 2000);
    const fig = summarise(`lineage: resolve (current parts + can fill), ${size.toLocaleString('en')} parts`, resolve);
    if (size === 200_000) {
      fig.target = 'p95 ≤ 2 ms';
      fig.met = fig.p95 <= 2;
    }
    figures.push(fig);
  }
  return figures;
}
