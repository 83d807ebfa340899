import { randomUUID } from 'node:crypto';
import { z } from 'zod';
import { MoneyFormatError, minorUnitExponent, normalisePartNumber, parseMinorUnits } from '@tappet/domain';
import { listingImportColumns, printedNumberSchema, type ListingImportResult } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { HttpError } from '../../lib/http-error';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { PartEntity, PartSupplierNumberEntity } from '../catalogue/catalogue.entity';
import { readCsv } from '../catalogue/imports/csv';
import { ListingEntity, SupplierEntity, type ListingRow } from './purchasing.entity';
import { nameKeyOf } from './suppliers.service';

type RowError = ListingImportResult['errors'][number];
type Sample = ListingImportResult['sample'][number];

const MAX_ERRORS = 1000;
const SAMPLE = 50;
const columns = { known: listingImportColumns, required: ['supplier', 'part_number', 'price'] } as const;

const wholeCell = (label: string, min: number, max: number) =>
  z
    .string()
    .regex(/^\d+$/, `The ${label} must be a whole number.`)
    .transform(Number)
    .pipe(z.number().min(min, `The ${label} must be at least ${min}.`).max(max, `The ${label} must be at most ${max}.`));

const rowSchema = z.object({
  supplier: z.string({ error: 'Enter the supplier name.' }).min(1, 'Enter the supplier name.'),
  partNumber: printedNumberSchema,
  supplierNumber: printedNumberSchema.nullable(),
  price: z.string({ error: 'Enter the price.' }).min(1, 'Enter the price.'),
  packSize: wholeCell('pack size', 1, 100_000).optional(),
  minOrderQty: wholeCell('minimum order quantity', 0, 1_000_000).optional(),
  leadTimeDays: wholeCell('lead time', 0, 365).nullable().optional(),
});

const columnOf = (field: PropertyKey | undefined) => (typeof field === 'string' ? field.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`) : null);

/**
 * CSV import of supplier listings, shaped like the catalogue import: the whole file is read and
 * checked first (preview writes nothing); a commit writes every row in one transaction, and only
 * when no row has an error. Rows name the supplier (by name) and the part (by its number or one of
 * its supplier numbers); the price is in major units of the supplier's currency ("12.50").
 * A supplier and part already listed is changed in place; columns left out keep their values.
 */
export function createListingsImportService(deps: { db: Database; clock: Clock }) {
  const { db, clock } = deps;

  return {
    async run(shopId: string, input: { mode: 'preview' | 'commit'; file: Buffer; fileName: string }, actor: AuditActor): Promise<ListingImportResult> {
      const suppliers = new Map((await db.reader.find(SupplierEntity, { where: { shopId } })).map((s) => [s.nameKey, s]));
      const partRows = await db.reader.find(PartEntity, { where: { shopId } });
      const parts = new Map(partRows.map((p) => [p.key, p]));
      const partsById = new Map(partRows.map((p) => [p.id, p]));
      const bySupplierNumber = new Map((await db.reader.find(PartSupplierNumberEntity, { where: { shopId } })).map((s) => [s.key, s.partId]));
      const existing = new Map((await db.reader.find(ListingEntity, { where: { shopId } })).map((l) => [`${l.supplierId}|${l.partId}`, l]));
      const errors: RowError[] = [];
      const sample: Sample[] = [];
      let rows = 0;
      let added = 0;
      let changed = 0;
      let unchanged = 0;
      let extra = 0;
      const addError = (e: RowError) => (errors.length < MAX_ERRORS ? errors.push(e) : extra++);
      const seen = new Map<string, number>();
      const inserts: ListingRow[] = [];
      const updates: Array<{ id: string; patch: Partial<ListingRow> }> = [];
      const now = clock.now();

      for await (const event of readCsv(input.file, columns)) {
        rows++;
        if (event.type === 'error') {
          addError({ row: event.row, column: null, message: event.message });
          continue;
        }
        const r = event.record;
        const get = (name: string) => {
          const v = r.cells.get(name);
          return v === undefined || v === '' ? undefined : v;
        };
        const parsed = rowSchema.safeParse({
          supplier: r.cells.get('supplier') ?? '',
          partNumber: r.cells.get('part_number') ?? '',
          supplierNumber: get('supplier_number') ?? null,
          price: r.cells.get('price') ?? '',
          packSize: get('pack_size'),
          minOrderQty: get('min_order_qty'),
          leadTimeDays: r.cells.has('lead_time_days') ? (get('lead_time_days') ?? null) : undefined,
        });
        if (!parsed.success) {
          const byColumn = new Set<string | null>();
          for (const issue of parsed.error.issues) {
            const column = columnOf(issue.path[0]);
            if (!byColumn.has(column)) addError({ row: r.row, column, message: issue.message });
            byColumn.add(column);
          }
          continue;
        }
        const v = parsed.data;
        const supplier = suppliers.get(nameKeyOf(v.supplier));
        const key = normalisePartNumber(v.partNumber);
        const bySupplier = bySupplierNumber.get(key);
        const part = parts.get(key) ?? (bySupplier ? partsById.get(bySupplier) : undefined);
        const rowErrors: RowError[] = [];
        if (!supplier) rowErrors.push({ row: r.row, column: 'supplier', message: `No supplier called ${v.supplier}. Add the supplier first.` });
        if (!part) rowErrors.push({ row: r.row, column: 'part_number', message: `No part numbered ${v.partNumber} in the catalogue.` });
        let priceMinor = 0;
        if (supplier) {
          try {
            // Spreadsheets in many countries write a decimal comma.
            priceMinor = parseMinorUnits(v.price.includes('.') ? v.price : v.price.replace(',', '.'), minorUnitExponent(supplier.currency));
            if (priceMinor < 0) throw new MoneyFormatError('not_a_decimal', v.price);
          } catch (err) {
            if (!(err instanceof MoneyFormatError)) throw err;
            rowErrors.push({ row: r.row, column: 'price', message: `Write the price in ${supplier.currency} like 12.50 (at most ${minorUnitExponent(supplier.currency)} decimals).` });
          }
        }
        if (rowErrors.length || !supplier || !part) {
          rowErrors.forEach(addError);
          continue;
        }
        const identity = `${supplier.id}|${part.id}`;
        const earlier = seen.get(identity);
        if (earlier !== undefined) {
          addError({ row: r.row, column: 'part_number', message: `${supplier.name}'s listing of ${part.number} is already on row ${earlier} of this file.` });
          continue;
        }
        seen.set(identity, r.row);
        const fields: Partial<ListingRow> = { priceMinor };
        if (r.cells.has('supplier_number')) fields.supplierNumber = v.supplierNumber;
        if (v.packSize !== undefined) fields.packSize = v.packSize;
        if (v.minOrderQty !== undefined) fields.minOrderQty = v.minOrderQty;
        if (v.leadTimeDays !== undefined) fields.leadTimeDays = v.leadTimeDays;
        const old = existing.get(identity);
        const label = `${supplier.name}: ${part.number}`;
        if (!old) {
          inserts.push({ id: randomUUID(), shopId, supplierId: supplier.id, partId: part.id, supplierNumber: null, packSize: 1, minOrderQty: 0, leadTimeDays: null, ...fields, priceMinor, lastPaidUnitMinor: null, lastPaidAt: null, createdAt: now, updatedAt: now });
          added++;
          if (sample.length < SAMPLE) sample.push({ row: r.row, action: 'add', summary: label });
          continue;
        }
        const patch = Object.fromEntries(Object.entries(fields).filter(([k, val]) => old[k as keyof ListingRow] !== val)) as Partial<ListingRow>;
        if (Object.keys(patch).length === 0) {
          unchanged++;
          continue;
        }
        updates.push({ id: old.id, patch });
        changed++;
        if (sample.length < SAMPLE) sample.push({ row: r.row, action: 'change', summary: `${label}: ${Object.keys(patch).join(', ')}` });
      }
      if (extra > 0) errors.push({ row: errors.at(-1)?.row ?? 0, column: null, message: `${extra} more problems are not listed; fix these first.` });

      let committed = false;
      if (input.mode === 'commit' && errors.length === 0 && added + changed > 0) {
        try {
          await db.write(async (manager) => {
            for (let i = 0; i < inserts.length; i += 200) await manager.insert(ListingEntity, inserts.slice(i, i + 200));
            for (const u of updates) await manager.update(ListingEntity, { shopId, id: u.id }, { ...u.patch, updatedAt: now });
            await recordAudit(manager, {
              shopId,
              actor,
              action: 'supplier_listings.imported',
              entity: 'import',
              entityId: null,
              changes: { file: { before: null, after: input.fileName }, added: { before: null, after: added }, changed: { before: null, after: changed } },
              at: now,
            });
          });
        } catch (err) {
          if (err instanceof Error && /UNIQUE|FOREIGN KEY/i.test(err.message)) throw new HttpError(409, 'conflict', 'The listings changed while the file was being read. Nothing was imported; try again.');
          throw err;
        }
        committed = true;
      }
      return { mode: input.mode, rows, added, changed, unchanged, sample, errors, committed };
    },
  };
}

export type ListingsImportService = ReturnType<typeof createListingsImportService>;
