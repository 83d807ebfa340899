import Fuse from 'fuse.js';
import { describe, expect, it } from 'vitest';
import { partSearchQuerySchema } from '@tappet/contracts';
import { buildLineageGraph, normalisePartNumber } from '@tappet/domain';
import { createLookupService } from '../lookup.service';
import type { PartSearchIndex, SearchablePart } from '../part-search-index';

// The service asks fuse.js for scores only where hits share kind and rank; these tests pin down
// that the order among such hits is still fuse.js's, and that untied hits keep their own order.

const part = (id: string, number: string, description: string): SearchablePart => {
  const key = normalisePartNumber(number);
  return { id, number, key, description, origin: 'genuine', category: null, status: 'available', numbers: [{ number, key, source: 'own' }] };
};

/** An index over a fixed list: every part is a typo candidate, `load` answers in the list's order. */
function fixedIndex(parts: SearchablePart[]): PartSearchIndex {
  return {
    byKey: async (_shop, key) => parts.filter((p) => p.key === key).map((p) => p.id),
    byPrefix: async () => [],
    bySubstring: async () => [],
    byTypos: async () => parts.map((p) => ({ id: p.id, keys: ` ${p.key} `, description: p.description })),
    byDescription: async () => [],
    load: async (_shop, ids) => parts.filter((p) => ids.includes(p.id)),
  };
}

const lookupOver = (parts: SearchablePart[]) => createLookupService({ index: fixedIndex(parts), graphOf: async () => buildLineageGraph([], []) });
const fuseScores = (q: string, parts: SearchablePart[]) =>
  new Map(
    new Fuse(
      parts.map((p) => ({ id: p.id, numbers: p.numbers.map((n) => n.number), description: p.description })),
      { keys: ['numbers', 'description'], includeScore: true, ignoreLocation: true, threshold: 1 },
    )
      .search(q)
      .map((r) => [r.item.id, r.score ?? 1]),
  );

describe('tie-break among hits of the same kind and rank', () => {
  it('orders parts one typo away by their fuse.js score, whatever order the index loads them in', async () => {
    // Both are one typo from the query; the second shares the query's description word as well.
    const parts = [part('a', '71-3465', 'Brake shoe'), part('b', '71-3546', '713456 clutch cable')];
    const q = '71-3456';
    const scores = fuseScores(q, parts);
    expect(scores.get('b')!).toBeLessThan(scores.get('a')!); // the case is only useful if fuse.js reverses the load order
    const { results } = await lookupOver(parts).search('shop', partSearchQuerySchema.parse({ q, limit: 10 }));
    expect(results.map((r) => [r.id, r.match])).toEqual([
      ['b', 'fuzzy'],
      ['a', 'fuzzy'],
    ]);
  });

  it('leaves hits of different ranks in rank order, whatever order the index loads them in', async () => {
    // "a" is one typo away, "b" two (keys of 8 characters forgive two); "b" is loaded first.
    const parts = [part('b', 'KV-124357', 'KV 123 456'), part('a', 'KV-123457', 'Lever')];
    const q = 'KV-123456';
    const { results } = await lookupOver(parts).search('shop', partSearchQuerySchema.parse({ q, limit: 10 }));
    expect(results.map((r) => r.reason)).toEqual(['close to KV-123457 (1 typo)', 'close to KV-124357 (2 typos)']);
  });
});
