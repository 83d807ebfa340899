import type { EntityManager } from 'typeorm';
import { foldLookalikes, trigramsOf, wordsOf } from '@tappet/domain';
import { filterSql, MIN_TWO_TYPO_QUERY, oneEditPatterns, sqlitePartSearchIndex, type PartSearchFilters, type PartSearchIndex, type SearchCandidate } from './part-search-index';

/** `%…%` around a trigram or key (A–Z 0–9 or word letters: no LIKE wildcard can come from it). */
const containing = (s: string) => `%${s}%`;

/**
 * PostgreSQL implementation of {@link PartSearchIndex} over the `part_search` table of the
 * PostgreSQL migrations, whose keys and description carry pg_trgm GIN indexes. Those indexes
 * serve `LIKE '%…%'`, so the questions FTS5 answers with MATCH become OR-ed LIKE conditions here,
 * ranked by pg_trgm similarity where FTS5 ranks by bm25. Prefix search and loading are plain SQL,
 * shared with the SQLite implementation.
 */
export function postgresPartSearchIndex(reader: () => EntityManager): PartSearchIndex {
  const portable = sqlitePartSearchIndex(reader);

  /** Candidates whose `column` contains any of `needles`, best `similarity` to `rankBy` first; the shop filter sits in the same query. */
  const candidates = (shopId: string, column: 'keys' | 'description', needles: string[], rankBy: string, filters: PartSearchFilters, limit: number) => {
    const f = filterSql(filters);
    return reader().query<SearchCandidate[]>(
      `SELECT p.id, s.keys, s.description FROM part_search s JOIN parts p ON p.rowid = s.rowid
       WHERE s.shop_id = ? AND p.shop_id = ?${f.sql} AND (${needles.map(() => `s.${column} LIKE ?`).join(' OR ')})
       ORDER BY similarity(s.${column}, ?) DESC, s.rowid LIMIT ?`,
      [shopId, shopId, ...f.params, ...needles, rankBy, limit],
    );
  };

  return {
    ...portable,

    byKey: async (shopId, key) =>
      (
        await reader().query<Array<{ id: string }>>(
          `SELECT id FROM parts WHERE shop_id = ? AND key = ?
           UNION SELECT part_id FROM part_supplier_numbers WHERE shop_id = ? AND key = ?
           UNION SELECT from_part_id FROM part_links WHERE shop_id = ? AND to_key = ? AND kind = 'equivalent' AND to_part_id IS NULL`,
          [shopId, key, shopId, key, shopId, key],
        )
      ).map((r) => r.id),

    bySubstring: async (shopId, key, filters, limit) => {
      const folded = foldLookalikes(key);
      return (await candidates(shopId, 'keys', [containing(folded)], folded, filters, limit)).map((c) => c.id);
    },

    async byTypos(shopId, key, filters, limit) {
      const folded = foldLookalikes(key);
      // As on SQLite: first every whole key one edit away (space-anchored patterns), then trigrams.
      const near = await candidates(
        shopId,
        'keys',
        oneEditPatterns(folded).map((p) => `% ${p} %`),
        folded,
        filters,
        limit,
      );
      const grams = trigramsOf(folded);
      if (folded.length < MIN_TWO_TYPO_QUERY || grams.length === 0 || near.length >= limit) return near;
      const seen = new Set(near.map((c) => c.id));
      const more = (await candidates(shopId, 'keys', grams.map(containing), folded, filters, limit)).filter((c) => !seen.has(c.id));
      return [...near, ...more].slice(0, limit);
    },

    byDescription(shopId, text, filters, limit) {
      const grams = [...new Set(wordsOf(text).flatMap((w) => trigramsOf(w)))];
      if (grams.length === 0) return Promise.resolve([]);
      return candidates(shopId, 'description', grams.map(containing), text, filters, limit);
    },
  };
}

/** The database's own part search index: pg_trgm on PostgreSQL, FTS5 on SQLite. */
export function databasePartSearchIndex(reader: () => EntityManager): PartSearchIndex {
  return reader().connection.options.type === 'postgres' ? postgresPartSearchIndex(reader) : sqlitePartSearchIndex(reader);
}
