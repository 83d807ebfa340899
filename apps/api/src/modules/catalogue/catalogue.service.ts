import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { type z } from 'zod';
import { buildLineageGraph, normalisePartNumber, type LineageGraph, type LineageLink, type LineagePart, type LineageProblem, type PartQuantity } from '@tappet/domain';
import {
  type fitmentInputSchema,
  type fitmentUpdateSchema,
  type linkInputSchema,
  type linkUpdateSchema,
  type partInputSchema,
  type partListQuerySchema,
  type partUpdateSchema,
  type Fitment,
  type LineageGraphResponse,
  type LineageProblemView,
  type Part,
  type PartDetailResponse,
  type PartLink,
  type PartListResponse,
  type ResolveResponse,
} from '@tappet/contracts';
import type { Database, WriteWork } from '../../db/write-lock';
import { assertCatalogueRoom } from '../billing/plan-limits';
import { HttpError, badRequest, notFound } from '../../lib/http-error';
import { breathe } from '../../lib/breathe';
import type { Clock } from '../../lib/clock';
import { diffChanges, recordAudit, type AuditActor } from '../audit/audit.service';
import { FitmentEntity, PartEntity, PartLinkEntity, PartSupplierNumberEntity, type FitmentRow, type PartLinkRow, type PartRow } from './catalogue.entity';

export type PartCreate = z.output<typeof partInputSchema>;
export type PartPatch = z.output<typeof partUpdateSchema>;
export type LinkCreate = z.output<typeof linkInputSchema>;
export type LinkPatch = z.output<typeof linkUpdateSchema>;
export type FitmentCreate = z.output<typeof fitmentInputSchema>;
export type FitmentPatch = z.output<typeof fitmentUpdateSchema>;
export type PartListQuery = z.output<typeof partListQuerySchema>;

const noSuchPart = () => notFound('No such part in this shop.');
const noSuchLink = () => notFound('No such link in this shop.');
const noSuchFitment = () => notFound('No such fitment in this shop.');
const conflict = (message: string) => new HttpError(409, 'conflict', message);

/** The public view of a part row with its supplier numbers. */
export function toPart(row: PartRow, supplierNumbers: string[]): Part {
  return {
    id: row.id,
    number: row.number,
    key: row.key,
    description: row.description,
    origin: row.origin,
    maker: row.maker,
    category: row.category,
    unit: row.unit,
    status: row.status,
    notes: row.notes,
    supplierNumbers,
    createdAt: new Date(row.createdAt).toISOString(),
    updatedAt: new Date(row.updatedAt).toISOString(),
  };
}

/** The public view of a fitment row. */
export function toFitment(row: FitmentRow): Fitment {
  return { id: row.id, partId: row.partId, marque: row.marque, model: row.model, yearFrom: row.yearFrom, yearTo: row.yearTo, frameFrom: row.frameFrom, frameTo: row.frameTo };
}

const toProblemView = (p: LineageProblem): LineageProblemView => ({ kind: p.kind, numbers: p.numbers });
const toQuantity = (q: PartQuantity) => ({ partId: q.partId, number: q.number, quantity: q.quantity });

/** Audit changes of a new record: every field that has a value, from null. */
function createdChanges(fields: Record<string, unknown>) {
  return Object.fromEntries(Object.entries(fields).flatMap(([k, v]) => (v == null || v === '' ? [] : [[k, { before: null, after: v }]])));
}

/** Audit changes of a removed record: every field that had a value, to null. */
function deletedChanges(fields: Record<string, unknown>) {
  return Object.fromEntries(Object.entries(fields).flatMap(([k, v]) => (v == null ? [] : [[k, { before: v, after: null }]])));
}

/** Supplier numbers in a stable order (by key), so comparing two lists ignores the order typed. */
const byKey = (numbers: readonly string[]) => [...numbers].sort((a, b) => normalisePartNumber(a).localeCompare(normalisePartNumber(b)));

/** Escapes LIKE wildcards so a search for "10%" means the characters. */
const likeEscape = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/** Supplier numbers of some parts, sorted by key, grouped by part id. */
export async function supplierNumbersOf(manager: EntityManager, shopId: string, partIds: string[]): Promise<Map<string, string[]>> {
  const result = new Map<string, string[]>();
  for (let i = 0; i < partIds.length; i += 500) {
    const rows = await manager
      .createQueryBuilder(PartSupplierNumberEntity, 's')
      .where('s.shopId = :shopId AND s.partId IN (:...ids)', { shopId, ids: partIds.slice(i, i + 500) })
      .orderBy('s.key', 'ASC')
      .getMany();
    for (const r of rows) result.set(r.partId, [...(result.get(r.partId) ?? []), r.number]);
  }
  return result;
}

/** Replaces a part's supplier numbers (inside a write). Duplicate keys keep the first spelling. */
export async function replaceSupplierNumbers(manager: EntityManager, shopId: string, partId: string, numbers: string[]): Promise<void> {
  await manager.delete(PartSupplierNumberEntity, { shopId, partId });
  const seen = new Set<string>();
  const rows = [];
  for (const number of numbers) {
    const key = normalisePartNumber(number);
    if (!key || seen.has(key)) continue;
    seen.add(key);
    rows.push({ shopId, partId, number, key });
  }
  if (rows.length) await manager.insert(PartSupplierNumberEntity, rows);
}

/** Points links that name a number not yet in the catalogue at the part that now has it. */
export async function attachDanglingLinks(manager: EntityManager, shopId: string): Promise<void> {
  await manager.query(
    `UPDATE part_links SET to_part_id = (SELECT p.id FROM parts p WHERE p.shop_id = part_links.shop_id AND p.key = part_links.to_key)
     WHERE shop_id = ? AND to_part_id IS NULL AND EXISTS (SELECT 1 FROM parts p WHERE p.shop_id = part_links.shop_id AND p.key = part_links.to_key)`,
    [shopId],
  );
}

/** How long a process trusts the catalogue version it last read for a shop (decision 020). */
export const catalogueVersionCheckMs = 1000;

/** Parts read per statement when a shop's lineage graph is built. */
const GRAPH_READ_PAGE = 10_000;

/**
 * The catalogue: parts, links, fitments and the lineage answers built on them. Each shop's
 * lineage graph is built from the database on first use and cached until the shop's catalogue
 * version (shops.catalogue_version) moves. Every catalogue write moves it in its own transaction,
 * so other API processes on the database see the change within {@link catalogueVersionCheckMs};
 * this process sees it at once.
 */
export function createCatalogueService(deps: { db: Database; clock: Clock }) {
  const { db, clock } = deps;
  const versions = new Map<string, { version: number; readAt: number }>();
  const graphs = new Map<string, { version: number; graph: LineageGraph }>();

  /** The shop's catalogue version, read again when the last reading is older than a second. */
  async function versionOf(shopId: string): Promise<number> {
    const now = clock.now().getTime();
    const known = versions.get(shopId);
    if (known && now - known.readAt < catalogueVersionCheckMs) return known.version;
    const rows = await db.reader.query<Array<{ version: number | string }>>(`SELECT catalogue_version AS version FROM shops WHERE id = ?`, [shopId]);
    const version = Number(rows[0]?.version ?? 0);
    versions.set(shopId, { version, readAt: now });
    return version;
  }

  /** A write that changes the shop's parts or links: moves the catalogue version with it. */
  async function writeCatalogue<T>(shopId: string, work: WriteWork<T>): Promise<T> {
    let version = 0;
    const result = await db.write(async (manager) => {
      const out = await work(manager);
      const rows = await manager.query<Array<{ version: number | string }>>(`UPDATE shops SET catalogue_version = catalogue_version + 1 WHERE id = ? RETURNING catalogue_version AS version`, [shopId]);
      version = Number(rows[0]?.version ?? 0);
      return out;
    });
    // Known here only after the commit, so a graph read mid-write is never cached as the new one.
    versions.set(shopId, { version, readAt: clock.now().getTime() });
    return result;
  }

  /** Graph builds under way, shared by every caller asking for the same version. */
  const building = new Map<string, { version: number; graph: Promise<LineageGraph> }>();

  async function graphOf(shopId: string): Promise<LineageGraph> {
    const version = await versionOf(shopId);
    const cached = graphs.get(shopId);
    if (cached && cached.version === version) return cached.graph;
    const pending = building.get(shopId);
    if (pending && pending.version === version) return pending.graph;
    const graph = readGraph(shopId)
      .then((built) => {
        if ((graphs.get(shopId)?.version ?? -1) < version) graphs.set(shopId, { version, graph: built });
        return built;
      })
      .finally(() => {
        if (building.get(shopId)?.graph === graph) building.delete(shopId);
      });
    building.set(shopId, { version, graph });
    return graph;
  }

  /**
   * The shop's parts (in pages by rowid, pausing between them: one statement over 200,000 rows
   * holds the event loop for most of a second) and links, as a lineage graph. A write committed
   * between pages bumps the version, so the graph read here serves only callers that asked before
   * it; a link from a part added meanwhile is left out rather than failing the build.
   */
  async function readGraph(shopId: string): Promise<LineageGraph> {
    const parts: LineagePart[] = [];
    for (let after = Number.MIN_SAFE_INTEGER; ; ) {
      const page = await db.reader.query<Array<LineagePart & { rowid: number }>>(
        `SELECT rowid, id, number, status FROM parts WHERE shop_id = ? AND rowid > ? ORDER BY rowid LIMIT ?`,
        [shopId, after, GRAPH_READ_PAGE],
      );
      for (const { rowid: _, ...part } of page) parts.push(part);
      if (page.length < GRAPH_READ_PAGE) break;
      after = page[page.length - 1]!.rowid;
      await breathe();
    }
    const rows = await db.reader.query<Array<{ id: string; kind: LineageLink['kind']; fromId: string; toId: string | null; toNumber: string; quantity: number; interchange: LineageLink['interchange'] }>>(
      `SELECT id, kind, from_part_id AS fromId, to_part_id AS toId, to_number AS toNumber, quantity, interchange FROM part_links WHERE shop_id = ?`,
      [shopId],
    );
    const known = new Set(parts.map((p) => p.id));
    return buildLineageGraph(
      parts,
      rows.filter((r) => known.has(r.fromId)),
    );
  }

  async function partRow(manager: EntityManager, shopId: string, partId: string): Promise<PartRow> {
    const row = await manager.findOne(PartEntity, { where: { shopId, id: partId } });
    if (!row) throw noSuchPart();
    return row;
  }

  async function linkViews(shopId: string, where: 'from' | 'to', partId: string): Promise<PartLink[]> {
    const column = where === 'from' ? 'l.from_part_id' : 'l.to_part_id';
    const rows = await db.reader.query<Array<Record<string, unknown>>>(
      `SELECT l.id, l.from_part_id AS fromPartId, f.number AS fromNumber, l.kind, l.to_part_id AS toPartId, COALESCE(t.number, l.to_number) AS toNumber,
              l.quantity, l.interchange, l.effective_date AS effectiveDate, l.source_reference AS sourceReference, l.note
       FROM part_links l JOIN parts f ON f.shop_id = l.shop_id AND f.id = l.from_part_id
       LEFT JOIN parts t ON t.shop_id = l.shop_id AND t.id = l.to_part_id
       WHERE l.shop_id = ? AND ${column} = ? ORDER BY l.kind, toNumber`,
      [shopId, partId],
    );
    return rows as unknown as PartLink[];
  }

  async function linkView(shopId: string, linkId: string): Promise<PartLink> {
    const rows = await db.reader.query<Array<Record<string, unknown>>>(
      `SELECT l.id, l.from_part_id AS fromPartId, f.number AS fromNumber, l.kind, l.to_part_id AS toPartId, COALESCE(t.number, l.to_number) AS toNumber,
              l.quantity, l.interchange, l.effective_date AS effectiveDate, l.source_reference AS sourceReference, l.note
       FROM part_links l JOIN parts f ON f.shop_id = l.shop_id AND f.id = l.from_part_id
       LEFT JOIN parts t ON t.shop_id = l.shop_id AND t.id = l.to_part_id
       WHERE l.shop_id = ? AND l.id = ?`,
      [shopId, linkId],
    );
    if (!rows[0]) throw noSuchLink();
    return rows[0] as unknown as PartLink;
  }

  async function partView(shopId: string, partId: string): Promise<Part> {
    const row = await partRow(db.reader, shopId, partId);
    const numbers = await supplierNumbersOf(db.reader, shopId, [row.id]);
    return toPart(row, numbers.get(row.id) ?? []);
  }

  return {
    graphOf,
    writeCatalogue,

    /** A page of the shop's parts, filtered; each with the number of lineage problems it is in. */
    async list(shopId: string, query: PartListQuery): Promise<PartListResponse> {
      const graph = await graphOf(shopId);
      const problemCount = new Map<string, number>();
      for (const p of graph.problems()) for (const id of new Set(p.partIds)) problemCount.set(id, (problemCount.get(id) ?? 0) + 1);

      const qb = db.reader.createQueryBuilder(PartEntity, 'p').where('p.shopId = :shopId', { shopId });
      if (query.q) {
        const key = normalisePartNumber(query.q);
        const text = `%${likeEscape(query.q)}%`;
        const keyLike = `%${likeEscape(key)}%`;
        qb.andWhere(
          `(p.description LIKE :text ESCAPE '\\' OR p.number LIKE :text ESCAPE '\\'${key ? ` OR p.key LIKE :keyLike ESCAPE '\\' OR EXISTS (SELECT 1 FROM part_supplier_numbers s WHERE s.shop_id = p.shop_id AND s.part_id = p.id AND s.key LIKE :keyLike ESCAPE '\\')` : ''})`,
          { text, keyLike },
        );
      }
      if (query.category) qb.andWhere('p.category = :category', { category: query.category });
      if (query.origin) qb.andWhere('p.origin = :origin', { origin: query.origin });
      if (query.status) qb.andWhere('p.status = :status', { status: query.status });
      if (query.problemsOnly) {
        const ids = [...problemCount.keys()];
        if (ids.length === 0) qb.andWhere('1 = 0');
        else qb.andWhere('p.id IN (:...ids)', { ids });
      }
      const [rows, total] = await qb
        .orderBy('p.key', 'ASC')
        .skip((query.page - 1) * query.pageSize)
        .take(query.pageSize)
        .getManyAndCount();
      const numbers = await supplierNumbersOf(db.reader, shopId, rows.map((r) => r.id));
      const categories = await db.reader.query<Array<{ category: string }>>(`SELECT DISTINCT category FROM parts WHERE shop_id = ? AND category IS NOT NULL ORDER BY category`, [shopId]);
      return {
        items: rows.map((r) => ({ ...toPart(r, numbers.get(r.id) ?? []), problemCount: problemCount.get(r.id) ?? 0 })),
        total,
        page: query.page,
        pageSize: query.pageSize,
        categories: categories.map((c) => c.category),
      };
    },

    /** Adds a part; its number must be new to the shop (compared on the normalised key). */
    async create(shopId: string, input: PartCreate, actor: AuditActor): Promise<Part> {
      const key = normalisePartNumber(input.number);
      const now = clock.now();
      const row: PartRow = {
        id: randomUUID(),
        shopId,
        number: input.number,
        key,
        description: input.description,
        origin: input.origin,
        maker: input.maker,
        category: input.category,
        unit: input.unit,
        status: input.status,
        notes: input.notes,
        createdAt: now,
        updatedAt: now,
      };
      await writeCatalogue(shopId, async (manager) => {
        if (await manager.exists(PartEntity, { where: { shopId, key } })) throw conflict(`The shop already has a part numbered like ${input.number}.`);
        await assertCatalogueRoom(manager, shopId, 1);
        await manager.insert(PartEntity, row);
        await replaceSupplierNumbers(manager, shopId, row.id, input.supplierNumbers);
        await attachDanglingLinks(manager, shopId);
        const { id: _id, shopId: _s, createdAt: _c, updatedAt: _u, ...fields } = row;
        await recordAudit(manager, {
          shopId,
          actor,
          action: 'part.created',
          entity: 'part',
          entityId: row.id,
          changes: createdChanges({ ...fields, supplierNumbers: input.supplierNumbers.join('; ') }),
          at: now,
        });
      });
      return partView(shopId, row.id);
    },

    /** Changes a part's fields; a new number must still be unique in the shop. */
    async update(shopId: string, partId: string, patch: PartPatch, actor: AuditActor): Promise<Part> {
      const now = clock.now();
      await writeCatalogue(shopId, async (manager) => {
        const before = await partRow(manager, shopId, partId);
        const { supplierNumbers, ...fields } = patch;
        const next: Partial<PartRow> = { ...fields };
        if (fields.number !== undefined) {
          next.key = normalisePartNumber(fields.number);
          if (next.key !== before.key && (await manager.exists(PartEntity, { where: { shopId, key: next.key } }))) {
            throw conflict(`The shop already has a part numbered like ${fields.number}.`);
          }
        }
        const changes = diffChanges(before as unknown as Record<string, unknown>, next as Record<string, unknown>);
        if (supplierNumbers !== undefined) {
          const old = (await supplierNumbersOf(manager, shopId, [partId])).get(partId) ?? [];
          if (old.join('; ') !== byKey(supplierNumbers).join('; ')) changes['supplierNumbers'] = { before: old.join('; '), after: byKey(supplierNumbers).join('; ') };
          await replaceSupplierNumbers(manager, shopId, partId, supplierNumbers);
        }
        if (Object.keys(changes).length === 0) return;
        await manager.update(PartEntity, { shopId, id: partId }, { ...next, updatedAt: now });
        if (next.number !== undefined) {
          // Links keep the printed number of the part they point at.
          await manager.update(PartLinkEntity, { shopId, toPartId: partId }, { toNumber: next.number, toKey: next.key });
          await attachDanglingLinks(manager, shopId);
        }
        await recordAudit(manager, { shopId, actor, action: 'part.updated', entity: 'part', entityId: partId, changes, at: now });
      });
      return partView(shopId, partId);
    },

    /** A part with its links, fitments, current parts and problems. */
    async detail(shopId: string, partId: string): Promise<PartDetailResponse> {
      const part = await partView(shopId, partId);
      const graph = await graphOf(shopId);
      const fitments = await db.reader.find(FitmentEntity, { where: { shopId, partId }, order: { marque: 'ASC', model: 'ASC', yearFrom: 'ASC' } });
      return {
        part,
        linksFrom: await linkViews(shopId, 'from', partId),
        linksTo: await linkViews(shopId, 'to', partId),
        fitments: fitments.map(toFitment),
        current: graph.currentParts(partId).current.map(toQuantity),
        problems: graph.problemsFor(partId).map(toProblemView),
      };
    },

    /** The lineage around a part, bounded, for the lineage picture. Numbers not in the catalogue are left out. */
    async lineage(shopId: string, partId: string): Promise<LineageGraphResponse> {
      await partRow(db.reader, shopId, partId);
      const graph = await graphOf(shopId);
      const hood = graph.neighbourhood(partId, { maxNodes: 60 });
      const inProblem = new Set(graph.problems().flatMap((p) => p.partIds));
      const ids = hood.nodes.flatMap((n) => (n.partId ? [n.partId] : []));
      const descriptions = new Map<string, string>();
      for (let i = 0; i < ids.length; i += 500) {
        const rows = await db.reader.createQueryBuilder(PartEntity, 'p').select(['p.id', 'p.description']).where('p.shopId = :shopId AND p.id IN (:...ids)', { shopId, ids: ids.slice(i, i + 500) }).getMany();
        for (const r of rows) descriptions.set(r.id, r.description);
      }
      const known = new Map(hood.nodes.flatMap((n) => (n.partId ? [[n.key, n.partId] as const] : [])));
      return {
        nodes: hood.nodes.flatMap((n) =>
          n.partId && n.status
            ? [{ partId: n.partId, number: n.number, description: descriptions.get(n.partId) ?? '', status: n.status, isCurrent: n.resolvesStart, isFocus: n.isStart, inProblem: inProblem.has(n.partId) }]
            : [],
        ),
        edges: hood.edges.flatMap((e) => {
          const from = known.get(e.from);
          const to = known.get(e.to);
          return from && to ? [{ from, to, kind: e.kind, interchange: e.interchange, quantity: e.quantity }] : [];
        }),
        truncated: hood.truncated,
      };
    },

    /** Resolves a printed number (or a supplier's number for a part) to what fills a demand for it. */
    async resolve(shopId: string, printed: string): Promise<ResolveResponse> {
      const key = normalisePartNumber(printed);
      let row = key ? await db.reader.findOne(PartEntity, { where: { shopId, key } }) : null;
      if (!row && key) {
        const viaSupplier = await db.reader.findOne(PartSupplierNumberEntity, { where: { shopId, key } });
        if (viaSupplier) row = await db.reader.findOne(PartEntity, { where: { shopId, id: viaSupplier.partId } });
      }
      if (!row) throw notFound(`No part numbered ${printed} in this shop's catalogue, nor a supplier number like it.`);
      const graph = await graphOf(shopId);
      const numbers = await supplierNumbersOf(db.reader, shopId, [row.id]);
      return {
        query: printed,
        part: toPart(row, numbers.get(row.id) ?? []),
        current: graph.currentParts(row.id).current.map(toQuantity),
        canFill: graph.canFill(row.id).options.map((o) => ({ parts: o.parts.map(toQuantity), via: o.via, needsChanges: o.needsChanges })),
        problems: graph.problemsFor(row.id).map(toProblemView),
      };
    },

    /** Every lineage problem of the shop's catalogue. */
    async problems(shopId: string): Promise<LineageProblemView[]> {
      return (await graphOf(shopId)).problems().map(toProblemView);
    },

    /** Links two parts (or a part to a number not in the catalogue yet). Both ends must be the shop's. */
    async createLink(shopId: string, input: LinkCreate, actor: AuditActor): Promise<PartLink> {
      const id = randomUUID();
      await writeCatalogue(shopId, async (manager) => {
        await partRow(manager, shopId, input.fromPartId);
        let toPartId: string | null;
        let toNumber: string;
        if (input.toPartId) {
          const to = await partRow(manager, shopId, input.toPartId);
          toPartId = to.id;
          toNumber = to.number;
        } else {
          toNumber = input.toNumber!;
          toPartId = (await manager.findOne(PartEntity, { where: { shopId, key: normalisePartNumber(toNumber) } }))?.id ?? null;
        }
        const toKey = normalisePartNumber(toNumber);
        if (toPartId === input.fromPartId) throw badRequest('A part cannot be linked to itself.', [{ path: ['toPartId'], message: 'A part cannot be linked to itself.' }]);
        if (await manager.exists(PartLinkEntity, { where: { shopId, fromPartId: input.fromPartId, kind: input.kind, toKey } })) throw conflict('That link already exists.');
        const row: PartLinkRow = {
          id,
          shopId,
          fromPartId: input.fromPartId,
          kind: input.kind,
          toPartId,
          toNumber,
          toKey,
          quantity: input.quantity,
          interchange: input.interchange,
          effectiveDate: input.effectiveDate ?? null,
          sourceReference: input.sourceReference,
          note: input.note,
        };
        await manager.insert(PartLinkEntity, row);
        const { id: _i, shopId: _s, ...fields } = row;
        await recordAudit(manager, { shopId, actor, action: 'part_link.created', entity: 'part_link', entityId: id, changes: createdChanges(fields), at: clock.now() });
      });
      return linkView(shopId, id);
    },

    async updateLink(shopId: string, linkId: string, patch: LinkPatch, actor: AuditActor): Promise<PartLink> {
      await writeCatalogue(shopId, async (manager) => {
        const before = await manager.findOne(PartLinkEntity, { where: { shopId, id: linkId } });
        if (!before) throw noSuchLink();
        const interchange = patch.interchange ?? before.interchange;
        if (before.kind === 'equivalent' && interchange === 'with_changes') {
          throw badRequest('An equivalent is either both ways or one way.', [{ path: ['interchange'], message: 'An equivalent is either both ways or one way.' }]);
        }
        const changes = diffChanges(before as unknown as Record<string, unknown>, patch as Record<string, unknown>);
        if (Object.keys(changes).length === 0) return;
        await manager.update(PartLinkEntity, { shopId, id: linkId }, patch);
        await recordAudit(manager, { shopId, actor, action: 'part_link.updated', entity: 'part_link', entityId: linkId, changes, at: clock.now() });
      });
      return linkView(shopId, linkId);
    },

    async deleteLink(shopId: string, linkId: string, actor: AuditActor): Promise<void> {
      await writeCatalogue(shopId, async (manager) => {
        const before = await manager.findOne(PartLinkEntity, { where: { shopId, id: linkId } });
        if (!before) throw noSuchLink();
        await manager.delete(PartLinkEntity, { shopId, id: linkId });
        const { id: _i, shopId: _s, ...fields } = before;
        const changes = deletedChanges(fields);
        await recordAudit(manager, { shopId, actor, action: 'part_link.deleted', entity: 'part_link', entityId: linkId, changes, at: clock.now() });
      });
    },

    async createFitment(shopId: string, input: FitmentCreate, actor: AuditActor): Promise<Fitment> {
      const row: FitmentRow = {
        id: randomUUID(),
        shopId,
        partId: input.partId,
        marque: input.marque,
        model: input.model,
        yearFrom: input.yearFrom ?? null,
        yearTo: input.yearTo ?? null,
        frameFrom: input.frameFrom,
        frameTo: input.frameTo,
      };
      await db.write(async (manager) => {
        await partRow(manager, shopId, input.partId);
        await manager.insert(FitmentEntity, row);
        const { id: _i, shopId: _s, ...fields } = row;
        await recordAudit(manager, { shopId, actor, action: 'fitment.created', entity: 'fitment', entityId: row.id, changes: createdChanges(fields), at: clock.now() });
      });
      return toFitment(row);
    },

    async updateFitment(shopId: string, fitmentId: string, patch: FitmentPatch, actor: AuditActor): Promise<Fitment> {
      return db.write(async (manager) => {
        const before = await manager.findOne(FitmentEntity, { where: { shopId, id: fitmentId } });
        if (!before) throw noSuchFitment();
        const after = { ...before, ...patch };
        if (after.yearFrom != null && after.yearTo != null && after.yearFrom > after.yearTo) {
          throw badRequest('The first year comes before the last.', [{ path: ['yearTo'], message: 'The first year comes before the last.' }]);
        }
        const changes = diffChanges(before as unknown as Record<string, unknown>, patch as Record<string, unknown>);
        if (Object.keys(changes).length > 0) {
          await manager.update(FitmentEntity, { shopId, id: fitmentId }, patch);
          await recordAudit(manager, { shopId, actor, action: 'fitment.updated', entity: 'fitment', entityId: fitmentId, changes, at: clock.now() });
        }
        return toFitment(after);
      });
    },

    async deleteFitment(shopId: string, fitmentId: string, actor: AuditActor): Promise<void> {
      await db.write(async (manager) => {
        const before = await manager.findOne(FitmentEntity, { where: { shopId, id: fitmentId } });
        if (!before) throw noSuchFitment();
        await manager.delete(FitmentEntity, { shopId, id: fitmentId });
        const { id: _i, shopId: _s, ...fields } = before;
        const changes = deletedChanges(fields);
        await recordAudit(manager, { shopId, actor, action: 'fitment.deleted', entity: 'fitment', entityId: fitmentId, changes, at: clock.now() });
      });
    },
  };
}

export type CatalogueService = ReturnType<typeof createCatalogueService>;
