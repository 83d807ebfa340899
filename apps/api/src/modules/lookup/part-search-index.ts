import type { EntityManager } from 'typeorm';
import { foldedTyposWithinKeyOrTail, foldLookalikes, MIN_SUBSTRING_QUERY, trigramsOf, wordsOf, type NumberSource, type PartNumberEntry } from '@tappet/domain';
import type { PartOrigin, PartStatusValue } from '@tappet/contracts';

/** Narrows candidates: parts that fit a marque / model / year, of a category, of an origin. */
export interface PartSearchFilters {
  marque?: string;
  model?: string;
  year?: number;
  category?: string;
  origin?: PartOrigin;
}

/** A part as the lookup ranks it: its row and every number it answers to. */
export interface SearchablePart {
  id: string;
  number: string;
  key: string;
  description: string;
  origin: PartOrigin;
  category: string | null;
  status: PartStatusValue;
  numbers: PartNumberEntry[];
}

/** A candidate with the text the index holds for it: its folded keys (space-separated) and description. */
export interface SearchCandidate {
  id: string;
  keys: string;
  description: string;
}

/**
 * Where lookup candidates come from. Every method takes the shop and filters inside its own query,
 * so a shop never sees (or is crowded out by) another shop's rows. All full-text SQL is behind
 * this interface: postgres-part-search-index.ts answers the same questions with pg_trgm.
 */
export interface PartSearchIndex {
  /** Parts whose own, supplier or equivalent number has exactly this normalised key (no filters: lineage starts here). */
  byKey(shopId: string, key: string): Promise<string[]>;
  /** Parts with a number starting with this (short) normalised key. */
  byPrefix(shopId: string, key: string, filters: PartSearchFilters, limit: number): Promise<string[]>;
  /** Parts with a number containing this normalised key (≥ 3 characters), O/I folded. */
  bySubstring(shopId: string, key: string, filters: PartSearchFilters, limit: number): Promise<string[]>;
  /**
   * Candidates for typos: every part with a number one edit (O/I folded) from this key, then parts
   * sharing the most trigrams with it (best by bm25), up to `limit`; each with its indexed text so
   * the caller can measure the exact distance before loading anything. An index may leave out
   * candidates that `keysWithinTypos` turns away (the caller drops them anyway), but not change
   * which of the others it returns.
   */
  byTypos(shopId: string, key: string, filters: PartSearchFilters, limit: number): Promise<SearchCandidate[]>;
  /** Parts whose description shares trigrams with the words typed, best first, with their indexed text. */
  byDescription(shopId: string, text: string, filters: PartSearchFilters, limit: number): Promise<SearchCandidate[]>;
  /** The parts with these ids in the shop that pass the filters, with all their numbers. */
  load(shopId: string, ids: readonly string[], filters: PartSearchFilters): Promise<SearchablePart[]>;
}

/**
 * Whether a typed key (folded with `foldLookalikes`) is within the typo tolerance of one of the
 * keys in an index's keys text (folded keys, space-separated) or of one of their tails (the
 * printed prefix left out): the test every typo candidate must pass.
 */
export function keysWithinTypos(folded: string, keys: string): boolean {
  for (let start = 0; start < keys.length; ) {
    let end = keys.indexOf(' ', start);
    if (end < 0) end = keys.length;
    if (end > start && foldedTyposWithinKeyOrTail(folded, keys, start, end, MIN_SUBSTRING_QUERY)) return true;
    start = end + 1;
  }
  return false;
}

/** An FTS5 string literal; our inputs are A–Z 0–9 or words of letters and digits, quoted all the same. */
const literal = (s: string) => `"${s.replace(/"/g, '""')}"`;

/** SQL and parameters for the filters, as conditions on parts alias `p`. */
export function filterSql(filters: PartSearchFilters): { sql: string; params: unknown[] } {
  const parts: string[] = [];
  const params: unknown[] = [];
  if (filters.category) {
    parts.push('p.category = ? COLLATE NOCASE');
    params.push(filters.category);
  }
  if (filters.origin) {
    parts.push('p.origin = ?');
    params.push(filters.origin);
  }
  if (filters.marque || filters.model || filters.year !== undefined) {
    const fit: string[] = ['f.shop_id = p.shop_id', 'f.part_id = p.id'];
    if (filters.marque) {
      fit.push('f.marque = ? COLLATE NOCASE');
      params.push(filters.marque);
    }
    if (filters.model) {
      fit.push('f.model = ? COLLATE NOCASE');
      params.push(filters.model);
    }
    if (filters.year !== undefined) {
      fit.push('(f.year_from IS NULL OR f.year_from <= ?) AND (f.year_to IS NULL OR f.year_to >= ?)');
      params.push(filters.year, filters.year);
    }
    parts.push(`EXISTS (SELECT 1 FROM fitments f WHERE ${fit.join(' AND ')})`);
  }
  return { sql: parts.map((s) => ` AND ${s}`).join(''), params };
}

/**
 * LIKE patterns that together match every key one edit away from `key` (and some more, which the
 * exact distance then drops): for each position, the key with a gap (`%`) there — covering a
 * changed, added or missing character — and the key with two neighbours swapped. Keys are
 * A–Z 0–9 only, so no LIKE wildcard can come from the key itself.
 */
export function oneEditPatterns(key: string): string[] {
  const out = new Set<string>();
  for (let i = 0; i < key.length; i++) {
    out.add(`${key.slice(0, i)}%${key.slice(i + 1)}`);
    if (i + 1 < key.length) out.add(key.slice(0, i) + key[i + 1] + key[i] + key.slice(i + 2));
  }
  return [...out];
}

/** Shortest typed key that can be two typos from a key of 8 characters (the first length forgiving two). */
export const MIN_TWO_TYPO_QUERY = 6;

/** SQLite FTS5 (trigram tokenizer) implementation over the `part_search` table. */
export function sqlitePartSearchIndex(reader: () => EntityManager): PartSearchIndex {
  const ids = async (sql: string, params: unknown[]) => (await reader().query<Array<{ id: string }>>(sql, params)).map((r) => r.id);

  /** FTS candidates: the shop filter sits in the same query as MATCH, before ORDER BY and LIMIT. */
  const match = (shopId: string, expression: string, filters: PartSearchFilters, limit: number) => {
    const f = filterSql(filters);
    return reader().query<SearchCandidate[]>(
      `SELECT p.id, s.keys, s.description FROM part_search s JOIN parts p ON p.rowid = s.rowid
       WHERE part_search MATCH ? AND s.shop_id = ? AND p.shop_id = ?${f.sql}
       ORDER BY s.rank LIMIT ?`,
      [expression, shopId, shopId, ...f.params, limit],
    );
  };

  return {
    byKey: (shopId, key) =>
      ids(
        // Indexes named: without statistics the planner scans the shop's rows by the primary key instead.
        `SELECT id FROM parts WHERE shop_id = ? AND key = ?
         UNION SELECT part_id FROM part_supplier_numbers INDEXED BY idx_part_supplier_numbers_key WHERE shop_id = ? AND key = ?
         UNION SELECT from_part_id FROM part_links INDEXED BY idx_part_links_to_key WHERE shop_id = ? AND to_key = ? AND kind = 'equivalent' AND to_part_id IS NULL`,
        [shopId, key, shopId, key, shopId, key],
      ),

    byPrefix(shopId, key, filters, limit) {
      const f = filterSql(filters);
      // Keys are A–Z 0–9, so every key starting with `key` sorts between it and `key` + "~".
      return ids(
        `SELECT p.id FROM parts p WHERE p.shop_id = ? AND p.id IN (
           SELECT id FROM parts WHERE shop_id = ? AND key >= ? AND key < ?
           UNION SELECT part_id FROM part_supplier_numbers WHERE shop_id = ? AND key >= ? AND key < ?)${f.sql}
         ORDER BY length(p.key), p.key LIMIT ?`,
        [shopId, shopId, key, `${key}~`, shopId, key, `${key}~`, ...f.params, limit],
      );
    },

    bySubstring: async (shopId, key, filters, limit) => (await match(shopId, `keys : ${literal(foldLookalikes(key))}`, filters, limit)).map((c) => c.id),

    async byTypos(shopId, key, filters, limit) {
      const folded = foldLookalikes(key);
      // Trigrams alone miss an edit in the middle of a short key ("714356" and "713456" share none),
      // so first every whole key one edit away, as space-anchored LIKE patterns the trigram index serves.
      const f = filterSql(filters);
      const patterns = oneEditPatterns(folded);
      const near = await reader().query<SearchCandidate[]>(
        `SELECT p.id, s.keys, s.description FROM part_search s JOIN parts p ON p.rowid = s.rowid
         WHERE s.shop_id = ? AND p.shop_id = ?${f.sql} AND s.rowid IN (${patterns.map(() => 'SELECT rowid FROM part_search WHERE keys LIKE ?').join(' UNION ')})
         LIMIT ?`,
        [shopId, shopId, ...f.params, ...patterns.map((p) => `% ${p} %`), limit],
      );
      // Two typos (keys of 8 or more) only from trigrams: best effort, see README.md.
      const grams = trigramsOf(folded);
      if (folded.length < MIN_TWO_TYPO_QUERY || grams.length === 0 || near.length >= limit) return near;
      const seen = new Set(near.map((c) => c.id));
      const more = (await match(shopId, `keys : (${grams.map(literal).join(' OR ')})`, filters, limit)).filter((c) => !seen.has(c.id));
      return [...near, ...more].slice(0, limit);
    },

    byDescription(shopId, text, filters, limit) {
      const grams = [...new Set(wordsOf(text).flatMap((w) => trigramsOf(w)))];
      if (grams.length === 0) return Promise.resolve([]);
      return match(shopId, `description : (${grams.map(literal).join(' OR ')})`, filters, limit);
    },

    async load(shopId, partIds, filters) {
      if (partIds.length === 0) return [];
      const f = filterSql(filters);
      const out: SearchablePart[] = [];
      for (let i = 0; i < partIds.length; i += 500) {
        const chunk = partIds.slice(i, i + 500);
        const marks = chunk.map(() => '?').join(', ');
        const rows = await reader().query<Array<Omit<SearchablePart, 'numbers'>>>(
          `SELECT p.id, p.number, p.key, p.description, p.origin, p.category, p.status FROM parts p WHERE p.shop_id = ? AND p.id IN (${marks})${f.sql}`,
          [shopId, ...chunk, ...f.params],
        );
        if (rows.length === 0) continue;
        const found = rows.map((r) => r.id);
        const foundMarks = found.map(() => '?').join(', ');
        const more = await reader().query<Array<{ partId: string; number: string; key: string; source: NumberSource }>>(
          `SELECT part_id AS partId, number, key, 'supplier' AS source FROM part_supplier_numbers WHERE shop_id = ? AND part_id IN (${foundMarks})
           UNION ALL SELECT from_part_id, to_number, to_key, 'equivalent' FROM part_links WHERE shop_id = ? AND kind = 'equivalent' AND to_part_id IS NULL AND from_part_id IN (${foundMarks})`,
          [shopId, ...found, shopId, ...found],
        );
        const extra = new Map<string, PartNumberEntry[]>();
        for (const m of more) extra.set(m.partId, [...(extra.get(m.partId) ?? []), { number: m.number, key: m.key, source: m.source }]);
        for (const r of rows) out.push({ ...r, numbers: [{ number: r.number, key: r.key, source: 'own' }, ...(extra.get(r.id) ?? [])] });
      }
      return out;
    },
  };
}
