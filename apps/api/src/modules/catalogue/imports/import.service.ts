import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { z } from 'zod';
import { normalisePartNumber } from '@tappet/domain';
import { interchanges, linkKinds, partInputSchema, printedNumberSchema, type ImportResult } from '@tappet/contracts';
import type { Database } from '../../../db/write-lock';
import { assertCatalogueRoom } from '../../billing/plan-limits';
import type { Clock } from '../../../lib/clock';
import { HttpError } from '../../../lib/http-error';
import { recordAudit, type AuditActor } from '../../audit/audit.service';
import { FitmentEntity, PartEntity, PartLinkEntity, PartSupplierNumberEntity, type FitmentRow, type PartLinkRow, type PartRow } from '../catalogue.entity';
import { attachDanglingLinks, type CatalogueService } from '../catalogue.service';
import { csvLine, readCsv, type CsvRecord } from './csv';

export type ImportKind = 'parts' | 'links' | 'fitments';

/** Columns of each file kind, in export order, and the ones a file must have. */
export const csvColumns = {
  parts: { known: ['number', 'description', 'origin', 'maker', 'category', 'unit', 'status', 'supplier_numbers', 'notes'], required: ['number', 'description'] },
  links: { known: ['from_number', 'kind', 'to_number', 'quantity', 'interchange', 'effective_date', 'source_reference', 'note'], required: ['from_number', 'kind', 'to_number'] },
  fitments: { known: ['number', 'marque', 'model', 'year_from', 'year_to', 'frame_from', 'frame_to'], required: ['number', 'marque', 'model'] },
} as const;

const MAX_ERRORS = 1000;
const SAMPLE = 50;
const BATCH = 500;

type RowError = ImportResult['errors'][number];
type Sample = ImportResult['sample'][number];

/** camelCase field of a contract → the CSV column it came from. */
const columnOf = (field: PropertyKey | undefined): string | null => (typeof field === 'string' ? field.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`) : null);

/** One message per column of a row (the first), so an empty cell is not reported three ways. */
function zodErrors(row: number, error: z.ZodError): RowError[] {
  const byColumn = new Map<string | null, RowError>();
  for (const i of error.issues) {
    const column = columnOf(i.path[0]);
    if (!byColumn.has(column)) byColumn.set(column, { row, column, message: i.message });
  }
  return [...byColumn.values()];
}

/** Empty cell (or absent column) → undefined; the schema then applies its default. */
const cell = (r: CsvRecord, name: string) => {
  const v = r.cells.get(name);
  return v === undefined || v === '' ? undefined : v;
};
/** Present column: empty means "clear it" (null); absent column: undefined (leave it). */
const clearable = (r: CsvRecord, name: string) => (r.cells.has(name) ? (r.cells.get(name) ?? '') || null : undefined);

const quantityCell = z
  .string()
  .optional()
  .transform((s, ctx) => {
    if (s === undefined) return 1;
    // Spreadsheets in many countries write a decimal comma.
    const n = Number(s.includes('.') ? s : s.replace(',', '.'));
    if (!Number.isFinite(n) || n <= 0 || n > 10_000) {
      ctx.addIssue({ code: 'custom', message: 'The quantity must be a number more than 0 (at most 10000).' });
      return z.NEVER;
    }
    return n;
  });

const linkRowSchema = z.object({
  fromNumber: printedNumberSchema,
  kind: z.enum(linkKinds, { error: 'Use replaced_by, kit_contains or equivalent.' }),
  toNumber: printedNumberSchema,
  quantity: quantityCell,
  interchange: z.enum(interchanges, { error: 'Use both, one_way or with_changes.' }).default('both'),
  effectiveDate: z.iso.date('Use a date like 1974-03-01.').nullable(),
  sourceReference: z.string().max(120, 'The source reference has at most 120 characters.').nullable(),
  note: z.string().max(500, 'The note has at most 500 characters.').nullable(),
});

const yearCell = z
  .string()
  .regex(/^\d{4}$/, 'Use a four-digit year.')
  .transform(Number)
  .pipe(z.number().min(1885, 'Use a year from 1885 on.').max(2100, 'Use a year up to 2100.'))
  .nullable();

const fitmentRowSchema = z.object({
  number: printedNumberSchema,
  marque: z.string({ error: 'Enter the marque.' }).min(1, 'Enter the marque.').max(60, 'The marque has at most 60 characters.'),
  model: z.string({ error: 'Enter the model.' }).min(1, 'Enter the model.').max(80, 'The model has at most 80 characters.'),
  yearFrom: yearCell,
  yearTo: yearCell,
  frameFrom: z.string().max(40, 'The first frame number has at most 40 characters.').nullable(),
  frameTo: z.string().max(40, 'The last frame number has at most 40 characters.').nullable(),
});

interface Collector {
  rows: number;
  errors: RowError[];
  extraErrors: number;
  sample: Sample[];
  added: number;
  changed: number;
  unchanged: number;
}

function collector(): Collector {
  return { rows: 0, errors: [], extraErrors: 0, sample: [], added: 0, changed: 0, unchanged: 0 };
}

function addErrors(c: Collector, errors: RowError[]) {
  for (const e of errors) {
    if (c.errors.length < MAX_ERRORS) c.errors.push(e);
    else c.extraErrors++;
  }
}

function note(c: Collector, row: number, action: Sample['action'], summary: string) {
  if (action === 'add') c.added++;
  else if (action === 'change') c.changed++;
  else c.unchanged++;
  if (action !== 'same' && c.sample.length < SAMPLE) c.sample.push({ row, action, summary });
}

/** A date as TypeORM stores a `datetime` column ("YYYY-MM-DD HH:MM:SS.SSS", UTC), so rows read back alike. */
const sqlDate = (d: Date) => d.toISOString().replace('T', ' ').replace('Z', '');

/**
 * Inserts rows with multi-row INSERT statements: TypeORM's entity insert costs about ten times
 * as much per row, which matters at 100,000 rows. Plain SQL, valid on PostgreSQL too.
 */
async function insertRows(manager: EntityManager, table: string, columns: string[], rows: unknown[][]): Promise<void> {
  const placeholders = `(${columns.map(() => '?').join(', ')})`;
  for (let i = 0; i < rows.length; i += BATCH) {
    const batch = rows.slice(i, i + BATCH);
    await manager.query(`INSERT INTO ${table} (${columns.join(', ')}) VALUES ${batch.map(() => placeholders).join(', ')}`, batch.flat());
  }
}

/** Writes run inside the one transaction of a commit, batched. */
type Plan = (manager: EntityManager) => Promise<void>;

/**
 * CSV import and export of a shop's catalogue. An import reads and checks the whole file first
 * (nothing is written while reading), then — when committing a file without errors — writes
 * everything in one transaction, in batches, so a failure leaves the catalogue as it was.
 */
export function createImportService(deps: { db: Database; clock: Clock; catalogue: CatalogueService }) {
  const { db, clock, catalogue } = deps;

  async function partsByKey(shopId: string) {
    const rows = await db.reader.find(PartEntity, { where: { shopId } });
    return new Map(rows.map((r) => [r.key, r]));
  }

  async function allSupplierNumbers(shopId: string) {
    const rows = await db.reader.find(PartSupplierNumberEntity, { where: { shopId }, order: { key: 'ASC' } });
    const byPart = new Map<string, string[]>();
    for (const r of rows) byPart.set(r.partId, [...(byPart.get(r.partId) ?? []), r.number]);
    return byPart;
  }

  async function planParts(shopId: string, buffer: Buffer, c: Collector, actor: AuditActor): Promise<Plan> {
    const existing = await partsByKey(shopId);
    const supplier = await allSupplierNumbers(shopId);
    const seen = new Map<string, number>();
    const inserts: PartRow[] = [];
    const supplierRows: Array<{ partId: string; numbers: string[] }> = [];
    const updates: Array<{ id: string; patch: Partial<PartRow>; changes: Record<string, { before: unknown; after: unknown }> }> = [];
    const now = clock.now();

    for await (const event of readCsv(buffer, csvColumns.parts)) {
      if (event.type === 'error') {
        c.rows++;
        addErrors(c, [{ row: event.row, column: null, message: event.message }]);
        continue;
      }
      const r = event.record;
      c.rows++;
      const supplierCell = r.cells.get('supplier_numbers');
      const parsed = partInputSchema.safeParse({
        number: r.cells.get('number') ?? '',
        description: r.cells.get('description') ?? '',
        origin: cell(r, 'origin'),
        maker: cell(r, 'maker'),
        category: cell(r, 'category'),
        unit: cell(r, 'unit'),
        status: cell(r, 'status'),
        notes: cell(r, 'notes'),
        supplierNumbers: supplierCell ? supplierCell.split(';').map((s) => s.trim()).filter(Boolean) : [],
      });
      if (!parsed.success) {
        addErrors(c, zodErrors(r.row, parsed.error));
        continue;
      }
      const p = parsed.data;
      const key = normalisePartNumber(p.number);
      const earlier = seen.get(key);
      if (earlier !== undefined) {
        addErrors(c, [{ row: r.row, column: 'number', message: `The number ${p.number} is already on row ${earlier} of this file.` }]);
        continue;
      }
      seen.set(key, r.row);
      const fields: Partial<PartRow> = { number: p.number, description: p.description };
      // Only the columns the file has are compared and written.
      if (r.cells.has('origin')) fields.origin = p.origin;
      if (r.cells.has('maker')) fields.maker = p.maker;
      if (r.cells.has('category')) fields.category = p.category;
      if (r.cells.has('unit')) fields.unit = p.unit;
      if (r.cells.has('status')) fields.status = p.status;
      if (r.cells.has('notes')) fields.notes = p.notes;
      const old = existing.get(key);
      if (!old) {
        const id = randomUUID();
        inserts.push({ id, shopId, key, origin: p.origin, maker: p.maker, category: p.category, unit: p.unit, status: p.status, notes: p.notes, number: p.number, description: p.description, createdAt: now, updatedAt: now });
        if (p.supplierNumbers.length) supplierRows.push({ partId: id, numbers: p.supplierNumbers });
        note(c, r.row, 'add', `${p.number} ${p.description}`);
        continue;
      }
      const changes: Record<string, { before: unknown; after: unknown }> = {};
      for (const [k, v] of Object.entries(fields)) {
        const before = old[k as keyof PartRow];
        if (before !== v) changes[k] = { before, after: v };
      }
      if (r.cells.has('supplier_numbers')) {
        const before = supplier.get(old.id) ?? [];
        const after = [...p.supplierNumbers].sort((a, b) => normalisePartNumber(a).localeCompare(normalisePartNumber(b)));
        if (before.join('; ') !== after.join('; ')) {
          changes['supplierNumbers'] = { before: before.join('; '), after: after.join('; ') };
          supplierRows.push({ partId: old.id, numbers: p.supplierNumbers });
        }
      }
      if (Object.keys(changes).length === 0) {
        note(c, r.row, 'same', p.number);
        continue;
      }
      const { supplierNumbers: _sn, ...patch } = Object.fromEntries(Object.entries(changes).map(([k, v]) => [k, v.after]));
      updates.push({ id: old.id, patch: { ...(patch as Partial<PartRow>), updatedAt: now }, changes });
      note(c, r.row, 'change', `${p.number}: ${Object.keys(changes).join(', ')}`);
    }

    return async (manager) => {
      await insertRows(
        manager,
        'parts',
        ['id', 'shop_id', 'number', 'key', 'description', 'origin', 'maker', 'category', 'unit', 'status', 'notes', 'created_at', 'updated_at'],
        inserts.map((p) => [p.id, p.shopId, p.number, p.key, p.description, p.origin, p.maker, p.category, p.unit, p.status, p.notes, sqlDate(p.createdAt), sqlDate(p.updatedAt)]),
      );
      for (const u of updates) {
        await manager.update(PartEntity, { shopId, id: u.id }, u.patch);
        if (u.patch.number !== undefined) await manager.update(PartLinkEntity, { shopId, toPartId: u.id }, { toNumber: u.patch.number });
        await recordAudit(manager, { shopId, actor, action: 'part.updated', entity: 'part', entityId: u.id, changes: u.changes, at: now });
      }
      const numberRows: Array<{ shopId: string; partId: string; number: string; key: string }> = [];
      for (const s of supplierRows) {
        await manager.delete(PartSupplierNumberEntity, { shopId, partId: s.partId });
        const keys = new Set<string>();
        for (const number of s.numbers) {
          const key = normalisePartNumber(number);
          if (key && !keys.has(key)) numberRows.push({ shopId, partId: s.partId, number, key });
          keys.add(key);
        }
      }
      await insertRows(manager, 'part_supplier_numbers', ['shop_id', 'part_id', 'number', 'key'], numberRows.map((r) => [r.shopId, r.partId, r.number, r.key]));
      await attachDanglingLinks(manager, shopId);
    };
  }

  async function planLinks(shopId: string, buffer: Buffer, c: Collector): Promise<Plan> {
    const parts = await partsByKey(shopId);
    const existing = new Map((await db.reader.find(PartLinkEntity, { where: { shopId } })).map((l) => [`${l.fromPartId}|${l.kind}|${l.toKey}`, l]));
    const seen = new Map<string, number>();
    const inserts: PartLinkRow[] = [];
    const updates: Array<{ id: string; patch: Partial<PartLinkRow> }> = [];

    for await (const event of readCsv(buffer, csvColumns.links)) {
      c.rows++;
      if (event.type === 'error') {
        addErrors(c, [{ row: event.row, column: null, message: event.message }]);
        continue;
      }
      const r = event.record;
      const parsed = linkRowSchema.safeParse({
        fromNumber: r.cells.get('from_number') ?? '',
        kind: cell(r, 'kind'),
        toNumber: r.cells.get('to_number') ?? '',
        quantity: cell(r, 'quantity'),
        interchange: cell(r, 'interchange'),
        effectiveDate: clearable(r, 'effective_date') ?? null,
        sourceReference: clearable(r, 'source_reference') ?? null,
        note: clearable(r, 'note') ?? null,
      });
      if (!parsed.success) {
        addErrors(c, zodErrors(r.row, parsed.error));
        continue;
      }
      const l = parsed.data;
      const from = parts.get(normalisePartNumber(l.fromNumber));
      const toKey = normalisePartNumber(l.toNumber);
      const to = parts.get(toKey);
      const errors: RowError[] = [];
      if (!from) errors.push({ row: r.row, column: 'from_number', message: `No part numbered ${l.fromNumber} in the catalogue. Import it with the parts first.` });
      if (from && from === to) errors.push({ row: r.row, column: 'to_number', message: 'A part cannot be linked to itself.' });
      if (l.kind === 'equivalent' && l.interchange === 'with_changes') errors.push({ row: r.row, column: 'interchange', message: 'An equivalent is either both ways or one way.' });
      if (errors.length || !from) {
        addErrors(c, errors);
        continue;
      }
      const identity = `${from.id}|${l.kind}|${toKey}`;
      const earlier = seen.get(identity);
      if (earlier !== undefined) {
        addErrors(c, [{ row: r.row, column: 'to_number', message: `The same link is already on row ${earlier} of this file.` }]);
        continue;
      }
      seen.set(identity, r.row);
      const fields = { quantity: l.quantity, interchange: l.interchange, effectiveDate: l.effectiveDate, sourceReference: l.sourceReference, note: l.note };
      const old = existing.get(identity);
      const label = `${from.number} ${l.kind} ${to?.number ?? l.toNumber}`;
      if (!old) {
        inserts.push({ id: randomUUID(), shopId, fromPartId: from.id, kind: l.kind, toPartId: to?.id ?? null, toNumber: to?.number ?? l.toNumber, toKey, ...fields });
        note(c, r.row, 'add', label);
        continue;
      }
      const patch = Object.fromEntries(Object.entries(fields).filter(([k, v]) => old[k as keyof PartLinkRow] !== v)) as Partial<PartLinkRow>;
      if (Object.keys(patch).length === 0) note(c, r.row, 'same', label);
      else {
        updates.push({ id: old.id, patch });
        note(c, r.row, 'change', `${label}: ${Object.keys(patch).join(', ')}`);
      }
    }

    return async (manager) => {
      await insertRows(
        manager,
        'part_links',
        ['id', 'shop_id', 'from_part_id', 'kind', 'to_part_id', 'to_number', 'to_key', 'quantity', 'interchange', 'effective_date', 'source_reference', 'note'],
        inserts.map((l) => [l.id, l.shopId, l.fromPartId, l.kind, l.toPartId, l.toNumber, l.toKey, l.quantity, l.interchange, l.effectiveDate, l.sourceReference, l.note]),
      );
      for (const u of updates) await manager.update(PartLinkEntity, { shopId, id: u.id }, u.patch);
    };
  }

  async function planFitments(shopId: string, buffer: Buffer, c: Collector): Promise<Plan> {
    const parts = await partsByKey(shopId);
    const identity = (f: Omit<FitmentRow, 'id' | 'shopId'>) => JSON.stringify([f.partId, f.marque, f.model, f.yearFrom, f.yearTo, f.frameFrom, f.frameTo]);
    const existing = new Set((await db.reader.find(FitmentEntity, { where: { shopId } })).map(identity));
    const seen = new Map<string, number>();
    const inserts: FitmentRow[] = [];

    for await (const event of readCsv(buffer, csvColumns.fitments)) {
      c.rows++;
      if (event.type === 'error') {
        addErrors(c, [{ row: event.row, column: null, message: event.message }]);
        continue;
      }
      const r = event.record;
      const parsed = fitmentRowSchema.safeParse({
        number: r.cells.get('number') ?? '',
        marque: r.cells.get('marque') ?? '',
        model: r.cells.get('model') ?? '',
        yearFrom: cell(r, 'year_from') ?? null,
        yearTo: cell(r, 'year_to') ?? null,
        frameFrom: cell(r, 'frame_from') ?? null,
        frameTo: cell(r, 'frame_to') ?? null,
      });
      if (!parsed.success) {
        addErrors(c, zodErrors(r.row, parsed.error));
        continue;
      }
      const f = parsed.data;
      const part = parts.get(normalisePartNumber(f.number));
      const errors: RowError[] = [];
      if (!part) errors.push({ row: r.row, column: 'number', message: `No part numbered ${f.number} in the catalogue. Import it with the parts first.` });
      if (f.yearFrom !== null && f.yearTo !== null && f.yearFrom > f.yearTo) errors.push({ row: r.row, column: 'year_to', message: 'The first year comes before the last.' });
      if (errors.length || !part) {
        addErrors(c, errors);
        continue;
      }
      const row = { partId: part.id, marque: f.marque, model: f.model, yearFrom: f.yearFrom, yearTo: f.yearTo, frameFrom: f.frameFrom, frameTo: f.frameTo };
      const id = identity(row);
      const label = `${part.number} fits ${f.marque} ${f.model}`;
      const earlier = seen.get(id);
      if (earlier !== undefined) {
        addErrors(c, [{ row: r.row, column: null, message: `The same fitment is already on row ${earlier} of this file.` }]);
        continue;
      }
      seen.set(id, r.row);
      if (existing.has(id)) note(c, r.row, 'same', label);
      else {
        inserts.push({ id: randomUUID(), shopId, ...row });
        note(c, r.row, 'add', label);
      }
    }
    return async (manager) => {
      await insertRows(
        manager,
        'fitments',
        ['id', 'shop_id', 'part_id', 'marque', 'model', 'year_from', 'year_to', 'frame_from', 'frame_to'],
        inserts.map((f) => [f.id, f.shopId, f.partId, f.marque, f.model, f.yearFrom, f.yearTo, f.frameFrom, f.frameTo]),
      );
    };
  }

  return {
    /** Previews or commits one CSV file. A commit writes nothing unless every row is good. */
    async run(shopId: string, input: { kind: ImportKind; mode: 'preview' | 'commit'; file: Buffer; fileName: string }, actor: AuditActor): Promise<ImportResult> {
      const c = collector();
      const plan =
        input.kind === 'parts' ? await planParts(shopId, input.file, c, actor) : input.kind === 'links' ? await planLinks(shopId, input.file, c) : await planFitments(shopId, input.file, c);
      if (c.extraErrors > 0) {
        c.errors.push({ row: c.errors.at(-1)?.row ?? 0, column: null, message: `${c.extraErrors} more problems are not listed; fix these first.` });
      }
      let committed = false;
      if (input.mode === 'commit' && c.errors.length === 0 && c.added + c.changed > 0) {
        try {
          await catalogue.writeCatalogue(shopId, async (manager) => {
            // Parts past the plan's catalogue size refuse the whole file, like any other problem.
            if (input.kind === 'parts') await assertCatalogueRoom(manager, shopId, c.added);
            await plan(manager);
            await recordAudit(manager, {
              shopId,
              actor,
              action: 'catalogue.imported',
              entity: 'import',
              entityId: null,
              changes: { kind: { before: null, after: input.kind }, file: { before: null, after: input.fileName }, added: { before: null, after: c.added }, changed: { before: null, after: c.changed } },
              at: clock.now(),
            });
          });
        } catch (err) {
          // The catalogue changed between reading the file and writing it (e.g. a part added meanwhile).
          if (err instanceof Error && /UNIQUE|FOREIGN KEY/i.test(err.message)) throw new HttpError(409, 'conflict', 'The catalogue changed while the file was being read. Nothing was imported; try again.');
          throw err;
        }
        committed = true;
      }
      return { kind: input.kind, mode: input.mode, rows: c.rows, added: c.added, changed: c.changed, unchanged: c.unchanged, sample: c.sample, errors: c.errors, committed };
    },

    /** The shop's parts, links or fitments as CSV lines (header first), in the import format. */
    async *exportCsv(shopId: string, kind: ImportKind): AsyncGenerator<string> {
      yield '\ufeff' + csvLine([...csvColumns[kind].known]);
      if (kind === 'parts') {
        const supplier = await allSupplierNumbers(shopId);
        const rows = await db.reader.find(PartEntity, { where: { shopId }, order: { key: 'ASC' } });
        for (const p of rows) yield csvLine([p.number, p.description, p.origin, p.maker, p.category, p.unit, p.status, (supplier.get(p.id) ?? []).join('; '), p.notes]);
      } else if (kind === 'links') {
        const rows = await db.reader.query<Array<Record<string, string | number | null>>>(
          `SELECT f.number AS fromNumber, l.kind, COALESCE(t.number, l.to_number) AS toNumber, l.quantity, l.interchange, l.effective_date AS effectiveDate, l.source_reference AS sourceReference, l.note
           FROM part_links l JOIN parts f ON f.shop_id = l.shop_id AND f.id = l.from_part_id LEFT JOIN parts t ON t.shop_id = l.shop_id AND t.id = l.to_part_id
           WHERE l.shop_id = ? ORDER BY f.key, l.kind, l.to_key`,
          [shopId],
        );
        for (const l of rows) yield csvLine([l['fromNumber'], l['kind'], l['toNumber'], l['quantity'], l['interchange'], l['effectiveDate'], l['sourceReference'], l['note']]);
      } else {
        const rows = await db.reader.query<Array<Record<string, string | number | null>>>(
          `SELECT p.number, f.marque, f.model, f.year_from AS yearFrom, f.year_to AS yearTo, f.frame_from AS frameFrom, f.frame_to AS frameTo
           FROM fitments f JOIN parts p ON p.shop_id = f.shop_id AND p.id = f.part_id WHERE f.shop_id = ? ORDER BY p.key, f.marque, f.model, f.year_from`,
          [shopId],
        );
        for (const f of rows) yield csvLine([f['number'], f['marque'], f['model'], f['yearFrom'], f['yearTo'], f['frameFrom'], f['frameTo']]);
      }
    },
  };
}

export type ImportService = ReturnType<typeof createImportService>;
