import Fuse from 'fuse.js';
import { foldLookalikes, lineageReason, validateGs1, matchDescription, matchNumber, mergeHits, MIN_SUBSTRING_QUERY, normalisePartNumber, type LineageGraph, type SearchHit } from '@tappet/domain';
import type { PartSearchQueryParsed, PartSearchResponse, StockSummary } from '@tappet/contracts';
import { keysWithinTypos, type PartSearchFilters, type PartSearchIndex, type SearchablePart } from './part-search-index';

/** How many typo candidates the index hands over for exact distance and re-ranking. */
export const TYPO_CANDIDATES = 500;
/** How many parts containing the query are considered. */
const SUBSTRING_CANDIDATES = 200;
/** Numbers have at most 40 characters, so a longer key is two typos from nothing: no typo search (and no 200 patterns). */
const MAX_TYPO_KEY = 42;
/** Options asked of the lineage engine per exact hit. */
const LINEAGE_OPTIONS = 20;

/**
 * Gives each scored hit its fuse.js score as a tie-break, where one can matter: only hits sharing
 * kind and rank with another hit are ever compared by it, and a part's fuse.js score depends on
 * that part alone (no collection statistics), so fuse.js runs over those parts only and the
 * order is the one scoring every candidate would give.
 */
function breakTies(q: string, unscored: readonly SearchHit[], scored: readonly SearchHit[], byId: ReadonlyMap<string, SearchablePart>): void {
  const group = (h: SearchHit) => `${h.match} ${h.rank}`;
  const sizes = new Map<string, number>();
  for (const h of unscored) sizes.set(group(h), (sizes.get(group(h)) ?? 0) + 1);
  for (const h of scored) sizes.set(group(h), (sizes.get(group(h)) ?? 0) + 1);
  const tied = new Set<string>();
  for (const h of scored) if (sizes.get(group(h))! > 1) tied.add(h.partId);
  if (tied.size === 0) return;
  const fuse = new Fuse(
    [...tied].map((id) => byId.get(id)!).map((p) => ({ id: p.id, numbers: p.numbers.map((n) => n.number), description: p.description })),
    { keys: ['numbers', 'description'], includeScore: true, ignoreLocation: true, threshold: 1 },
  );
  const score = new Map(fuse.search(q).map((r) => [r.item.id, r.score ?? 1]));
  for (const h of scored) if (tied.has(h.partId)) h.tieBreak = score.get(h.partId);
}

/**
 * The lookup: candidates from the index (exact keys, prefix or substring, trigram neighbours,
 * description words), lineage relatives of exact hits from the shop's lineage graph, then the
 * forgiving matchers of libs/domain decide and rank; fuse.js only breaks ties among candidates.
 */
export function createLookupService(deps: {
  index: PartSearchIndex;
  graphOf: (shopId: string) => Promise<LineageGraph>;
  /** Stock of each part (the stock module's freeStockByPart); results carry it when given. */
  stockOf?: (shopId: string, partIds: string[]) => Promise<Map<string, StockSummary>>;
  /** The part a supplier barcode (a valid GTIN, 14 digits) is attached to, if any (issue 7). */
  partOfBarcode?: (shopId: string, gtin14: string) => Promise<string | null>;
}) {
  const { index, graphOf } = deps;

  /** Current parts and fill options of each exact hit, as lineage hits naming the number typed. */
  async function relatives(shopId: string, exact: SearchablePart[]): Promise<SearchHit[]> {
    if (exact.length === 0) return [];
    const graph = await graphOf(shopId);
    const hits: SearchHit[] = [];
    for (const part of exact) {
      if (!graph.hasPart(part.id)) continue;
      let rank = 0;
      for (const current of graph.currentParts(part.id).current) {
        if (current.partId !== part.id) hits.push({ partId: current.partId, match: 'lineage', reason: `replaces ${part.number}`, rank: rank++ });
      }
      for (const option of graph.canFill(part.id, { maxOptions: LINEAGE_OPTIONS }).options) {
        for (const piece of option.parts) {
          if (piece.partId !== part.id) hits.push({ partId: piece.partId, match: 'lineage', reason: lineageReason(part.number, option.via, option.needsChanges), rank: rank++ });
        }
      }
    }
    return hits;
  }

  return {
    /** Answers one lookup in a shop; see the issue 5 ranking: exact, lineage, partial, fuzzy. */
    async search(shopId: string, query: PartSearchQueryParsed): Promise<PartSearchResponse> {
      const q = query.q;
      const key = normalisePartNumber(q);
      const filters: PartSearchFilters = { marque: query.marque, model: query.model, year: query.year, category: query.category, origin: query.origin };

      const [exactIds, numberIds, typoCandidates, descriptionCandidates] = await Promise.all([
        key ? index.byKey(shopId, key) : Promise.resolve([]),
        !key ? Promise.resolve([]) : key.length < MIN_SUBSTRING_QUERY ? index.byPrefix(shopId, key, filters, SUBSTRING_CANDIDATES) : index.bySubstring(shopId, key, filters, SUBSTRING_CANDIDATES),
        key.length >= MIN_SUBSTRING_QUERY && key.length <= MAX_TYPO_KEY ? index.byTypos(shopId, key, filters, TYPO_CANDIDATES) : Promise.resolve([]),
        q.length >= MIN_SUBSTRING_QUERY ? index.byDescription(shopId, q, filters, TYPO_CANDIDATES) : Promise.resolve([]),
      ]);

      // A scanned supplier barcode (EAN/UPC/GTIN with a valid GS1 check digit) names its part exactly.
      const digits = q.replace(/[\s-]/g, '');
      const gs1 = /^\d{8}$|^\d{12,14}$/.test(digits) ? validateGs1(digits) : null;
      const barcodePartId = gs1?.ok && deps.partOfBarcode ? await deps.partOfBarcode(shopId, digits.padStart(14, '0')) : null;
      const exactAll = barcodePartId ? [...exactIds, barcodePartId] : exactIds;

      // Only candidates that can match are loaded: numbers within the typo tolerance (also without
      // their prefix), descriptions whose words all meet the typed words.
      const folded = foldLookalikes(key);
      const typoIds = typoCandidates.filter((c) => keysWithinTypos(folded, c.keys)).map((c) => c.id);
      const descriptionIds = descriptionCandidates.filter((c) => matchDescription(q, c.description) !== null).map((c) => c.id);

      // Lineage starts from exact hits whatever the filters; the filters then apply to every result.
      const exactParts = await index.load(shopId, exactAll, {});
      const lineageHits = await relatives(shopId, exactParts.filter((p) => p.id === barcodePartId || matchNumber(q, p.numbers)?.match === 'exact'));
      const ids = [...new Set([...exactAll, ...lineageHits.map((h) => h.partId), ...numberIds, ...typoIds, ...descriptionIds])];
      const parts = await index.load(shopId, ids, filters);
      const byId = new Map(parts.map((p) => [p.id, p]));

      const hits: SearchHit[] = lineageHits.filter((h) => byId.has(h.partId));
      if (barcodePartId && byId.has(barcodePartId)) hits.push({ partId: barcodePartId, match: 'exact', reason: `supplier barcode ${digits}`, rank: 0 });
      /** Hits that fuse.js's score breaks ties for (lineage and barcode hits have none). */
      const scored: SearchHit[] = [];
      for (const part of parts) {
        const number = matchNumber(q, part.numbers);
        if (number) scored.push({ partId: part.id, ...number });
        const words = q.length >= MIN_SUBSTRING_QUERY ? matchDescription(q, part.description) : null;
        if (words) {
          const reason = `description words: ${words.words.join(' ')}`;
          // Whole words rank after numbers containing the query; typo'd words after typo'd numbers.
          if (words.typos === 0) scored.push({ partId: part.id, match: 'partial', reason, rank: 10 });
          else scored.push({ partId: part.id, match: 'fuzzy', reason, rank: 10 + words.typos });
        }
      }
      breakTies(q, hits, scored, byId);
      hits.push(...scored);

      const merged = mergeHits(hits, query.limit);
      // Every result with its stock, lineage relatives too: "none of this number, but 3 of its replacement in B-04".
      const stock = deps.stockOf ? await deps.stockOf(shopId, merged.map((h) => h.partId)) : null;
      const results = merged.map((hit) => {
        const part = byId.get(hit.partId)!;
        const row = { id: part.id, number: part.number, description: part.description, origin: part.origin, category: part.category, status: part.status, match: hit.match, reason: hit.reason };
        const partStock = stock?.get(part.id);
        return partStock ? { ...row, stock: partStock } : row;
      });
      return { results };
    },
  };
}

export type LookupService = ReturnType<typeof createLookupService>;
