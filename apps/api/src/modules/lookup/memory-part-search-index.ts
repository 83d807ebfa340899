import type { EntityManager } from 'typeorm';
import { foldLookalikes, trigramsOf, typoTolerance, wordsOf, type PartNumberEntry } from '@tappet/domain';
import { breathe } from '../../lib/breathe';
import { keysWithinTypos, oneEditPatterns, type PartSearchFilters, type PartSearchIndex, type SearchablePart, type SearchCandidate } from './part-search-index';

// An in-memory `PartSearchIndex` (docs/decisions/014): each shop's searchable text is read from the
// database once per catalogue version and held in compact structures, so a lookup runs no SQL
// except for a fitment filter. It answers the same questions with the same semantics as the SQLite
// FTS5 implementation (part-search-index.ts): the same LIKE patterns, the same trigram OR queries
// ranked by the same BM25 formula, the same filters, the same row and number order from `load`.

/** BM25 parameters, as FTS5's built-in `bm25()` uses them. */
const K1 = 1.2;
const B = 0.75;
/** Shortest typed key that can be two typos from a key of 8 characters (as the SQLite index). */
const MIN_TWO_TYPO_QUERY = 6;
/** `load` answers in chunks, each ordered by id, as the SQLite index's `IN (…)` query does. */
const LOAD_CHUNK = 500;
/**
 * Parts read per statement when a shop's index is built, and documents handled between pauses:
 * a build lets other callbacks run between slices, so a rebuild after a catalogue write does not
 * stall other requests.
 */
const BUILD_SLICE = 5_000;

/** A posting list: the documents holding a trigram, once per occurrence, in document order. */
interface Postings {
  docs: Int32Array;
  /** How many distinct documents hold it (BM25's n(q)). */
  documents: number;
}

/** One shop's parts as the index holds them; documents are numbered in rowid order. */
interface ShopIndex {
  size: number;
  rows: Array<Omit<SearchablePart, 'numbers'>>;
  numbers: PartNumberEntry[][];
  docOf: Map<string, number>;
  /** Category folded for SQLite's NOCASE (ASCII only). */
  categories: Array<string | null>;
  /** The FTS `keys` column: every folded key space-separated and space-padded (" 713456 12345 "). */
  keysText: string[];
  /** Which of 0–9 and A–Z each document's keys hold, two words per document (see `symbolOf`). */
  keyMasks: Uint32Array;
  /** The FTS `description` column. */
  descriptions: string[];
  /** Raw key (own, supplier, unlinked equivalent) → documents: exact lookups. */
  byRawKey: Map<string, number[]>;
  /** Own and supplier raw keys, sorted, with their documents: prefix ranges. */
  prefixKeys: SortedKeys;
  /** Whole folded keys of the keys text, sorted and sorted reversed (LIKE patterns' heads and tails). */
  foldedKeys: SortedKeys;
  reversedKeys: SortedKeys;
  /** Trigram postings of the keys column and of the description column (lower case). */
  keyGrams: GramTable;
  descriptionGrams: GramTable;
  /** Tokens (trigrams) per row over both columns, and their mean: BM25's |D| and avgdl. */
  rowTokens: Int32Array;
  averageTokens: number;
  /** Scratch space for scoring, reused by every query (queries never await mid-scoring). */
  scores: Float64Array;
}

/** SQLite's NOCASE: only ASCII letters fold. */
const nocase = (s: string) => s.replace(/[A-Z]/g, (c) => c.toLowerCase());

/** FTS5 trigram tokens of a text of `length` code points: one per three-character window. */
const tokenCount = (length: number) => Math.max(0, length - 2);

/** Trigrams of [a-z0-9] (almost all of them) are numbered 0…36³−1 and kept in one CSR table. */
const GRAM_SPACE = 36 * 36 * 36;
const base36 = (c: number) => (c >= 48 && c <= 57 ? c - 48 : c >= 97 && c <= 122 ? c - 87 : -1);
/** The number of the trigram at `i` in `text`, or -1 when it holds anything but a–z 0–9. */
function gramCodeAt(text: string, i: number): number {
  const a = base36(text.charCodeAt(i));
  const b = base36(text.charCodeAt(i + 1));
  const c = base36(text.charCodeAt(i + 2));
  return a < 0 || b < 0 || c < 0 ? -1 : (a * 36 + b) * 36 + c;
}
const isAscii = (s: string) => {
  for (let i = 0; i < s.length; i++) if (s.charCodeAt(i) > 127) return false;
  return true;
};

/** Trigram postings of one column: a CSR table for a–z 0–9 trigrams, a map for the rest (other letters). */
class GramTable {
  private offsets = new Int32Array(GRAM_SPACE + 1);
  private docs = new Int32Array(0);
  private documents = new Int32Array(GRAM_SPACE);
  private other = new Map<string, Postings>();

  /**
   * Builds from lower-cased texts, one per document; windows of anything but letters and digits
   * are left out (typed trigrams hold nothing else). Yields to the event loop between slices.
   */
  static async build(texts: readonly string[], slice: number): Promise<GramTable> {
    const table = new GramTable();
    await table.fill(texts, slice);
    return table;
  }

  private async fill(texts: readonly string[], slice: number): Promise<void> {
    const counts = new Int32Array(GRAM_SPACE + 1);
    const otherLists = new Map<string, number[]>();
    const wide: Array<string[] | null> = new Array<string[] | null>(texts.length);
    for (let doc = 0; doc < texts.length; doc++) {
      if (doc % slice === slice - 1) await breathe();
      wide[doc] = isAscii(texts[doc]!) ? null : [...texts[doc]!];
    }
    for (let doc = 0; doc < texts.length; doc++) {
      if (doc % slice === slice - 1) await breathe();
      const text = texts[doc]!;
      const chars = wide[doc];
      if (!chars) {
        for (let i = 0; i + 3 <= text.length; i++) {
          const code = gramCodeAt(text, i);
          if (code >= 0) counts[code + 1]!++;
        }
        continue;
      }
      for (let i = 0; i + 3 <= chars.length; i++) {
        const gram = chars[i]! + chars[i + 1]! + chars[i + 2]!;
        const code = gram.length === 3 ? gramCodeAt(gram, 0) : -1;
        if (code >= 0) counts[code + 1]!++;
        else if (/^[\p{L}\p{N}]+$/u.test(gram)) {
          const list = otherLists.get(gram);
          if (list) list.push(doc);
          else otherLists.set(gram, [doc]);
        }
      }
    }
    for (let c = 0; c < GRAM_SPACE; c++) counts[c + 1]! += counts[c]!;
    this.offsets = counts;
    this.docs = new Int32Array(counts[GRAM_SPACE]!);
    const fill = Int32Array.from(counts.subarray(0, GRAM_SPACE));
    const lastDoc = new Int32Array(GRAM_SPACE).fill(-1);
    const docs = this.docs;
    const documents = this.documents;
    for (let doc = 0; doc < texts.length; doc++) {
      if (doc % slice === slice - 1) await breathe();
      const text = texts[doc]!;
      const chars = wide[doc];
      const n = chars ? chars.length : text.length;
      for (let i = 0; i + 3 <= n; i++) {
        const code = chars ? (chars[i]!.length + chars[i + 1]!.length + chars[i + 2]!.length === 3 ? gramCodeAt(chars[i]! + chars[i + 1]! + chars[i + 2]!, 0) : -1) : gramCodeAt(text, i);
        if (code < 0) continue;
        docs[fill[code]!++] = doc;
        if (lastDoc[code] !== doc) {
          lastDoc[code] = doc;
          documents[code]!++;
        }
      }
    }
    for (const [gram, list] of otherLists) {
      let documents = 0;
      for (let i = 0; i < list.length; i++) if (i === 0 || list[i] !== list[i - 1]) documents++;
      this.other.set(gram, { docs: Int32Array.from(list), documents });
    }
  }

  /** The documents holding `gram` (once per occurrence, in document order), or undefined. */
  get(gram: string): Postings | undefined {
    const code = gram.length === 3 ? gramCodeAt(gram, 0) : -1;
    if (code < 0) return this.other.get(gram);
    const from = this.offsets[code]!;
    const to = this.offsets[code + 1]!;
    return to > from ? { docs: this.docs.subarray(from, to), documents: this.documents[code]! } : undefined;
  }
}

/** Keys → documents, with the keys sorted (code-unit order, as SQLite's BINARY collation) for range scans. */
interface SortedKeys {
  keys: string[];
  docs: Map<string, number[]>;
}
const sortedKeys = async (docs: Map<string, number[]>, slice: number): Promise<SortedKeys> => ({ keys: await sortYielding([...docs.keys()], slice), docs });

/**
 * Distinct strings in code-unit order (as `Array.prototype.sort()` puts them), sorted in runs and
 * merged with pauses between slices: one sort of 200,000 keys holds the event loop for a few
 * hundred milliseconds.
 */
export async function sortYielding(keys: string[], slice: number): Promise<string[]> {
  const run = 4 * slice;
  for (let from = 0; from < keys.length; from += run) {
    const sorted = keys.slice(from, from + run).sort();
    for (let i = 0; i < sorted.length; i++) keys[from + i] = sorted[i]!;
    await breathe();
  }
  let source = keys;
  let target = new Array<string>(keys.length);
  let since = 0;
  for (let width = run; width < keys.length; width *= 2) {
    for (let left = 0; left < keys.length; left += 2 * width) {
      const middle = Math.min(left + width, keys.length);
      const end = Math.min(left + 2 * width, keys.length);
      let i = left;
      let j = middle;
      for (let k = left; k < end; k++) target[k] = j >= end || (i < middle && source[i]! < source[j]!) ? source[i++]! : source[j++]!;
      since += end - left;
      if (since >= run) {
        since = 0;
        await breathe();
      }
    }
    [source, target] = [target, source];
  }
  return source;
}

/** First position in sorted `keys` not below `key`. */
function lowerBound(keys: readonly string[], key: string): number {
  let lo = 0;
  let hi = keys.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (keys[mid]! < key) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Documents of the keys starting with `prefix`, in key order. */
function withPrefix(sorted: SortedKeys, prefix: string, visit: (doc: number) => void): void {
  const { keys, docs } = sorted;
  for (let i = lowerBound(keys, prefix); i < keys.length && keys[i]!.startsWith(prefix); i++) for (const doc of docs.get(keys[i]!)!) visit(doc);
}

const reverse = (s: string) => {
  let out = '';
  for (let i = s.length - 1; i >= 0; i--) out += s[i];
  return out;
};

/** A folded key's character as a bit of a character mask (0–9, then A–Z: 36 bits in two words), or -1 for any other. */
const symbolOf = (c: number) => (c >= 48 && c <= 57 ? c - 48 : c >= 65 && c <= 90 ? c - 55 : -1);

/** Sets document `doc`'s bits in `masks` for the characters of its keys text. */
export function markCharacters(masks: Uint32Array, doc: number, text: string): void {
  for (let i = 0; i < text.length; i++) {
    const symbol = symbolOf(text.charCodeAt(i));
    if (symbol >= 0) masks[2 * doc + (symbol >> 5)]! |= 1 << (symbol & 31);
  }
}

/**
 * A test that turns away the documents whose keys lack more of the typed key's characters (with
 * repeats) than the largest typo tolerance: each edit supplies at most one missing character, so
 * none of their keys, nor any tail of one, can be near enough. It reads two words per document
 * instead of the document's text, and turns away most trigram neighbours.
 */
export function lackingTooMany(masks: Uint32Array, folded: string): (doc: number) => boolean {
  const wanted: number[] = [];
  for (let i = 0; i < folded.length; i++) {
    const symbol = symbolOf(folded.charCodeAt(i));
    if (symbol >= 0) wanted.push(symbol); // any other character is never counted missing
  }
  const largest = typoTolerance(Number.MAX_SAFE_INTEGER);
  return (doc) => {
    const low = masks[2 * doc]!;
    const high = masks[2 * doc + 1]!;
    let missing = 0;
    for (const symbol of wanted) {
      if ((((symbol < 32 ? low : high) >>> (symbol & 31)) & 1) === 0 && ++missing > largest) return true;
    }
    return false;
  };
}

/** Builds one shop's index from its rows (parts in rowid order; numbers ordered by part, then key), yielding to the event loop between slices. */
export async function buildShopIndex(
  parts: Array<Omit<SearchablePart, 'numbers' | 'category'> & { category: string | null }>,
  supplier: Array<{ partId: string; number: string; key: string }>,
  equivalents: Array<{ partId: string; number: string; key: string }>,
  slice = BUILD_SLICE,
): Promise<ShopIndex> {
  const size = parts.length;
  const docOf = new Map<string, number>();
  const numbers: PartNumberEntry[][] = new Array<PartNumberEntry[]>(size);
  const rows: ShopIndex['rows'] = new Array<ShopIndex['rows'][number]>(size);
  const categories: Array<string | null> = new Array<string | null>(size);
  const descriptions: string[] = new Array<string>(size);
  for (let doc = 0; doc < size; doc++) {
    if (doc % slice === slice - 1) await breathe();
    const p = parts[doc]!;
    docOf.set(p.id, doc);
    numbers[doc] = [{ number: p.number, key: p.key, source: 'own' }];
    rows[doc] = { id: p.id, number: p.number, key: p.key, description: p.description, origin: p.origin, category: p.category, status: p.status };
    categories[doc] = p.category === null ? null : nocase(p.category);
    descriptions[doc] = p.description;
  }
  const none: string[] = [];
  const supplierKeys: string[][] = new Array<string[]>(size).fill(none);
  const equivalentKeys: string[][] = new Array<string[]>(size).fill(none);
  for (const s of supplier) {
    const doc = docOf.get(s.partId);
    if (doc === undefined) continue;
    numbers[doc]!.push({ number: s.number, key: s.key, source: 'supplier' });
    if (supplierKeys[doc] === none) supplierKeys[doc] = [];
    supplierKeys[doc]!.push(s.key);
  }
  for (const e of equivalents) {
    const doc = docOf.get(e.partId);
    if (doc === undefined) continue;
    numbers[doc]!.push({ number: e.number, key: e.key, source: 'equivalent' });
    if (equivalentKeys[doc] === none) equivalentKeys[doc] = [];
    equivalentKeys[doc]!.push(e.key);
  }

  const byRawKey = new Map<string, number[]>();
  const addKey = (map: Map<string, number[]>, key: string, doc: number) => {
    const list = map.get(key);
    if (!list) map.set(key, [doc]);
    else if (list[list.length - 1] !== doc) list.push(doc);
  };
  const prefixKeys = new Map<string, number[]>();
  const byFoldedKey = new Map<string, number[]>();
  const byReversedKey = new Map<string, number[]>();
  const keysLower: string[] = new Array<string>(size);
  const descriptionsLower: string[] = new Array<string>(size);
  const keysText: string[] = new Array<string>(size);
  const keyMasks = new Uint32Array(2 * size);
  const rowTokens = new Int32Array(size);
  let totalTokens = 0;

  for (let doc = 0; doc < size; doc++) {
    if (doc % slice === slice - 1) await breathe();
    const part = parts[doc]!;
    addKey(byRawKey, part.key, doc);
    for (const k of supplierKeys[doc]!) addKey(byRawKey, k, doc);
    for (const k of equivalentKeys[doc]!) addKey(byRawKey, k, doc);
    addKey(prefixKeys, part.key, doc);
    for (const k of supplierKeys[doc]!) addKey(prefixKeys, k, doc);
    // The FTS row's keys, in the order the migration's group_concat reads them (primary key / unique index order).
    const folded = [part.key, ...supplierKeys[doc]!, ...equivalentKeys[doc]!].map(foldLookalikes);
    const text = ` ${folded.join(' ')} `;
    keysText[doc] = text;
    markCharacters(keyMasks, doc, text);
    for (const k of folded) {
      addKey(byFoldedKey, k, doc);
      addKey(byReversedKey, reverse(k), doc);
    }
    keysLower[doc] = text.toLowerCase();
    const description = part.description.toLowerCase();
    descriptionsLower[doc] = description;
    rowTokens[doc] = tokenCount(text.length) + tokenCount(isAscii(description) ? description.length : [...description].length);
    totalTokens += rowTokens[doc]!;
  }
  return {
    size,
    rows,
    numbers,
    docOf,
    categories,
    keysText,
    keyMasks,
    descriptions,
    byRawKey,
    prefixKeys: await sortedKeys(prefixKeys, slice),
    foldedKeys: await sortedKeys(byFoldedKey, slice),
    reversedKeys: await sortedKeys(byReversedKey, slice),
    keyGrams: await GramTable.build(keysLower, slice),
    descriptionGrams: await GramTable.build(descriptionsLower, slice),
    rowTokens,
    averageTokens: size === 0 ? 1 : totalTokens / size,
    scores: new Float64Array(size),
  };
}

/**
 * Whether `text` is LIKE `% <head>%<tail> %` (the one-gap pattern), exactly as SQLite evaluates it;
 * `spacedHead` is " " + head and `spacedTail` tail + " " (made once per pattern, not per row).
 */
function likeGap(text: string, spacedHead: string, spacedTail: string): boolean {
  const at = text.indexOf(spacedHead);
  return at >= 0 && text.indexOf(spacedTail, at + spacedHead.length) >= 0;
}

/**
 * Documents best by BM25 for an OR of trigrams in one column, as FTS5's `ORDER BY rank` orders
 * them: for each trigram, idf · f·(k1+1) / (f + k1·(1 − b + b·|D|/avgdl)), summed. n(q) and N are
 * this shop's (FTS5 counts the whole table), so only the order far down a long list can differ.
 * Of the best `limit`, only those `keep` accepts are returned, best first: the caller's own test
 * runs before any row is touched, and only the few kept are sorted.
 */
function bestByBm25(index: ShopIndex, postings: GramTable, grams: readonly string[], pass: (doc: number) => boolean, limit: number, keep: (doc: number) => boolean = () => true): number[] {
  const { scores, rowTokens, averageTokens, size } = index;
  const touched: number[] = [];
  for (const gram of grams) {
    const list = postings.get(gram);
    if (!list) continue;
    let idf = Math.log((size - list.documents + 0.5) / (list.documents + 0.5));
    if (idf <= 0) idf = 1e-6;
    const docs = list.docs;
    for (let i = 0; i < docs.length; ) {
      const doc = docs[i]!;
      let f = 0;
      while (i < docs.length && docs[i] === doc) {
        f++;
        i++;
      }
      if (scores[doc] === 0) touched.push(doc);
      scores[doc]! += (idf * (f * (K1 + 1))) / (f + K1 * (1 - B + (B * rowTokens[doc]!) / averageTokens));
    }
  }
  const passing = touched.filter(pass);
  const out = bestByScore(passing, scores, limit).filter(keep);
  out.sort((a, b) => scores[b]! - scores[a]! || a - b);
  for (const doc of touched) scores[doc] = 0;
  return out;
}

/**
 * The `limit` documents best by score (ties to the lower document), in no particular order. A
 * sort with a comparator over hundreds of documents was a large part of a typo lookup's time; the
 * cut-off score comes from a selection over the scores alone.
 */
export function bestByScore(docs: readonly number[], scores: Float64Array, limit: number): number[] {
  if (limit <= 0) return [];
  if (limit >= docs.length) return [...docs];
  const values = new Float64Array(docs.length);
  for (let i = 0; i < docs.length; i++) values[i] = scores[docs[i]!]!;
  const cutOff = kthLargest(values, limit);
  const out: number[] = [];
  const tied: number[] = [];
  for (const doc of docs) {
    if (scores[doc]! > cutOff) out.push(doc);
    else if (scores[doc] === cutOff) tied.push(doc);
  }
  tied.sort((a, b) => a - b);
  for (let i = 0; out.length < limit; i++) out.push(tied[i]!);
  return out;
}

/** The k-th largest of `values` (1 ≤ k ≤ length), by quickselect; reorders `values`. */
export function kthLargest(values: Float64Array, k: number): number {
  const target = values.length - k; // its place in ascending order
  let lo = 0;
  let hi = values.length - 1;
  while (lo < hi) {
    const pivot = values[(lo + hi) >>> 1]!;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (values[i]! < pivot) i++;
      while (values[j]! > pivot) j--;
      if (i <= j) {
        const swap = values[i]!;
        values[i++] = values[j]!;
        values[j--] = swap;
      }
    }
    if (target <= j) hi = j;
    else if (target >= i) lo = i;
    else break;
  }
  return values[target]!;
}

/** Occurrences of `needle` in `text`, overlapping ones too (each is a phrase instance to FTS5). */
function occurrences(text: string, needle: string): number {
  let n = 0;
  for (let at = text.indexOf(needle); at >= 0; at = text.indexOf(needle, at + 1)) n++;
  return n;
}

/** Options of the in-memory index. */
export interface MemoryPartSearchIndexOptions {
  /** The database reader (rows are read from it when a shop's index is built, and fitments per lookup). */
  reader: () => EntityManager;
  /**
   * A token that changes whenever the shop's catalogue (parts, supplier numbers, links) changes:
   * e.g. the catalogue's cached lineage graph, which is rebuilt after every catalogue write.
   * Compared with `===`.
   */
  versionOf: (shopId: string) => unknown;
  /** Parts read per statement and documents built between pauses (tests use a small one to cross many slices). */
  slice?: number;
}

/** A memory index, plus a way to see how often it was built (for tests). */
export interface MemoryPartSearchIndex extends PartSearchIndex {
  /** How many times a shop's index has been built since start (tests check the cache). */
  builds(): number;
}

/**
 * In-memory implementation of `PartSearchIndex`: per shop, built from the database on first use
 * and rebuilt when `versionOf(shopId)` changes, like the catalogue's lineage graph. A build that
 * started after a lookup began (or after its version was first seen) is fresh enough for it, so
 * concurrent lookups share one build.
 * Fitment filters are read from the database per lookup: fitment edits do not change the version.
 */
export function memoryPartSearchIndex(options: MemoryPartSearchIndexOptions): MemoryPartSearchIndex {
  const { reader, versionOf } = options;
  const slice = options.slice ?? BUILD_SLICE;
  interface Entry {
    /** Clock tick when its rows were read: it holds every write committed before then. */
    readAt: number;
    index: ShopIndex;
  }
  const cache = new Map<string, Entry>();
  const building = new Map<string, { readAt: number; done: Promise<Entry> }>();
  /** The version token last seen per shop, and the tick it was first seen at. */
  const seen = new Map<string, { version: unknown; at: number }>();
  let clock = 0;
  let buildCount = 0;

  async function read(shopId: string, readAt: number): Promise<Entry> {
    buildCount++;
    const db = reader();
    // Read in pages by rowid with a pause between them: one statement over 200,000 rows holds the
    // event loop for most of a second. A write committed between pages may be half seen; only
    // lookups that arrived before this read began are served from it (see indexOf), and they
    // need no write after their arrival.
    const parts: Array<Omit<SearchablePart, 'numbers'> & { rowid: number }> = [];
    for (let after = Number.MIN_SAFE_INTEGER; ; ) {
      const page = await db.query<Array<Omit<SearchablePart, 'numbers'> & { rowid: number }>>(
        `SELECT rowid, id, number, key, description, origin, category, status FROM parts WHERE shop_id = ? AND rowid > ? ORDER BY rowid LIMIT ?`,
        [shopId, after, slice],
      );
      for (const row of page) parts.push(row);
      if (page.length < slice) break;
      after = page[page.length - 1]!.rowid;
      await breathe();
    }
    const supplier = await db.query<Array<{ partId: string; number: string; key: string }>>(
      `SELECT part_id AS partId, number, key FROM part_supplier_numbers WHERE shop_id = ? ORDER BY part_id, key`,
      [shopId],
    );
    const equivalents = await db.query<Array<{ partId: string; number: string; key: string }>>(
      `SELECT from_part_id AS partId, to_number AS number, to_key AS key FROM part_links
       WHERE shop_id = ? AND kind = 'equivalent' AND to_part_id IS NULL ORDER BY from_part_id, to_key`,
      [shopId],
    );
    return { readAt, index: await buildShopIndex(parts, supplier, equivalents, slice) };
  }

  /**
   * The shop's index, fresh for this lookup. Rows read after the lookup arrived, or after its
   * version token was first seen, hold every catalogue write it must see (a token changes only
   * after a write commits). So a burst of lookups after an edit shares one build, even while the
   * catalogue hands out several equal graphs built concurrently.
   */
  async function indexOf(shopId: string): Promise<ShopIndex> {
    const arrived = ++clock;
    const version = await versionOf(shopId);
    let token = seen.get(shopId);
    if (!token || token.version !== version) {
      token = { version, at: ++clock };
      seen.set(shopId, token);
    }
    const since = Math.min(arrived, token.at);
    const cached = cache.get(shopId);
    if (cached && cached.readAt > since) return cached.index;
    const pending = building.get(shopId);
    if (pending && pending.readAt > since) return (await pending.done).index;
    const readAt = ++clock;
    const done = read(shopId, readAt).then(
      (entry) => {
        const held = cache.get(shopId);
        if (!held || held.readAt < entry.readAt) cache.set(shopId, entry);
        if (building.get(shopId)?.done === done) building.delete(shopId);
        return entry;
      },
      (err: unknown) => {
        if (building.get(shopId)?.done === done) building.delete(shopId);
        throw err;
      },
    );
    building.set(shopId, { readAt, done });
    return (await done).index;
  }

  /** Parts fitting the fitment filters, read once per filters object (one lookup passes the same one to every call). */
  const fitting = new WeakMap<PartSearchFilters, Promise<Set<string>>>();
  function fittingParts(shopId: string, filters: PartSearchFilters): Promise<Set<string>> | null {
    if (!filters.marque && !filters.model && filters.year === undefined) return null;
    const held = fitting.get(filters);
    if (held) return held;
    const where: string[] = ['shop_id = ?'];
    const params: unknown[] = [shopId];
    if (filters.marque) {
      where.push('marque = ? COLLATE NOCASE');
      params.push(filters.marque);
    }
    if (filters.model) {
      where.push('model = ? COLLATE NOCASE');
      params.push(filters.model);
    }
    if (filters.year !== undefined) {
      where.push('(year_from IS NULL OR year_from <= ?) AND (year_to IS NULL OR year_to >= ?)');
      params.push(filters.year, filters.year);
    }
    const found = reader()
      .query<Array<{ id: string }>>(`SELECT DISTINCT part_id AS id FROM fitments WHERE ${where.join(' AND ')}`, params)
      .then((rows) => new Set(rows.map((r) => r.id)));
    fitting.set(filters, found);
    return found;
  }

  /** The shop's index and a test for the filters. */
  async function prepare(shopId: string, filters: PartSearchFilters): Promise<{ index: ShopIndex; pass: (doc: number) => boolean }> {
    const [index, fits] = await Promise.all([indexOf(shopId), fittingParts(shopId, filters)]);
    const category = filters.category ? nocase(filters.category) : null;
    const origin = filters.origin || null;
    if (category === null && origin === null && fits === null) return { index, pass: () => true };
    const pass = (doc: number) => {
      const row = index.rows[doc]!;
      if (category !== null && index.categories[doc] !== category) return false;
      if (origin !== null && row.origin !== origin) return false;
      return fits === null || fits.has(row.id);
    };
    return { index, pass };
  }

  const candidate = (index: ShopIndex, doc: number): SearchCandidate => ({ id: index.rows[doc]!.id, keys: index.keysText[doc]!, description: index.descriptions[doc]! });

  return {
    builds: () => buildCount,

    async byKey(shopId, key) {
      const index = await indexOf(shopId);
      // The SQL UNION answers distinct ids in id order.
      return [...new Set((index.byRawKey.get(key) ?? []).map((doc) => index.rows[doc]!.id))].sort();
    },

    async byPrefix(shopId, key, filters, limit) {
      const { index, pass } = await prepare(shopId, filters);
      const docs = new Set<number>();
      withPrefix(index.prefixKeys, key, (doc) => {
        if (pass(doc)) docs.add(doc);
      });
      const rows = [...docs].map((doc) => index.rows[doc]!);
      rows.sort((a, b) => a.key.length - b.key.length || (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
      return rows.slice(0, limit).map((r) => r.id);
    },

    async bySubstring(shopId, key, filters, limit) {
      const { index, pass } = await prepare(shopId, filters);
      const folded = foldLookalikes(key);
      const grams = trigramsOf(folded.toLowerCase());
      if (grams.length === 0) return [];
      // The rarest trigram's documents hold every match; the phrase is then checked on the text.
      let rarest: Postings | undefined;
      for (const gram of grams) {
        const list = index.keyGrams.get(gram);
        if (!list) return [];
        if (!rarest || list.docs.length < rarest.docs.length) rarest = list;
      }
      const scored: Array<{ doc: number; score: number }> = [];
      const docs = rarest!.docs;
      for (let i = 0; i < docs.length; i++) {
        const doc = docs[i]!;
        if (i > 0 && docs[i - 1] === doc) continue;
        if (!pass(doc)) continue;
        const f = occurrences(index.keysText[doc]!, folded);
        // One phrase: its idf is the same for every row, so the order is that of the frequency term.
        if (f > 0) scored.push({ doc, score: (f * (K1 + 1)) / (f + K1 * (1 - B + (B * index.rowTokens[doc]!) / index.averageTokens)) });
      }
      scored.sort((a, b) => b.score - a.score || a.doc - b.doc);
      return scored.slice(0, limit).map((s) => index.rows[s.doc]!.id);
    },

    async byTypos(shopId, key, filters, limit) {
      const { index, pass } = await prepare(shopId, filters);
      const folded = foldLookalikes(key);
      // Every whole key one edit away: the SQLite index's LIKE patterns, evaluated the same way.
      const near = new Set<number>();
      const take = (doc: number) => {
        if (near.size < limit && !near.has(doc) && pass(doc)) near.add(doc);
      };
      for (const pattern of oneEditPatterns(folded)) {
        const gap = pattern.indexOf('%');
        if (gap < 0) {
          for (const doc of index.foldedKeys.docs.get(pattern) ?? []) take(doc);
          continue;
        }
        const head = pattern.slice(0, gap);
        const tail = pattern.slice(gap + 1);
        const spacedHead = ` ${head}`;
        const spacedTail = `${tail} `;
        const check = (doc: number) => {
          if (!near.has(doc) && likeGap(index.keysText[doc]!, spacedHead, spacedTail)) take(doc);
        };
        // A match needs a key starting with `head` and one ending with `tail`: scan the longer side.
        if (head.length >= tail.length) withPrefix(index.foldedKeys, head, check);
        else withPrefix(index.reversedKeys, reverse(tail), check);
      }
      // Only candidates the lookup would keep are handed over (see PartSearchIndex.byTypos): most
      // trigram neighbours are further off, and building each one's candidate reads its row.
      const lacking = lackingTooMany(index.keyMasks, folded);
      const within = (doc: number) => !lacking(doc) && keysWithinTypos(folded, index.keysText[doc]!);
      const out = [...near]
        .sort((a, b) => a - b)
        .filter(within)
        .map((doc) => candidate(index, doc));
      // Two typos (keys of 8 or more) only from trigrams: best effort, as in the SQLite index. The
      // SQLite index fills the rest of `limit` with the best by bm25 not already near.
      const grams = trigramsOf(folded.toLowerCase());
      if (folded.length < MIN_TWO_TYPO_QUERY || grams.length === 0 || near.size >= limit) return out;
      const rest = bestByBm25(index, index.keyGrams, grams, (doc) => pass(doc) && !near.has(doc), limit - near.size, within);
      for (const doc of rest) out.push(candidate(index, doc));
      return out;
    },

    async byDescription(shopId, text, filters, limit) {
      const grams = [...new Set(wordsOf(text).flatMap((w) => trigramsOf(w)))];
      if (grams.length === 0) return [];
      const { index, pass } = await prepare(shopId, filters);
      return bestByBm25(index, index.descriptionGrams, grams, pass, limit).map((doc) => candidate(index, doc));
    },

    async load(shopId, ids, filters) {
      if (ids.length === 0) return [];
      const { index, pass } = await prepare(shopId, filters);
      const out: SearchablePart[] = [];
      for (let i = 0; i < ids.length; i += LOAD_CHUNK) {
        const docs = new Set<number>();
        for (const id of ids.slice(i, i + LOAD_CHUNK)) {
          const doc = index.docOf.get(id);
          if (doc !== undefined && pass(doc)) docs.add(doc);
        }
        const rows = [...docs].map((doc) => ({ ...index.rows[doc]!, numbers: index.numbers[doc]!.map((n) => ({ ...n })) }));
        rows.sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
        out.push(...rows);
      }
      return out;
    },
  };
}
