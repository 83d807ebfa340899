import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import { validateGs1 } from '@tappet/domain';
import type { BarcodeLookup, PartBarcode } from '@tappet/contracts';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { badRequest, HttpError, notFound } from '../../lib/http-error';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { PartEntity } from '../catalogue/catalogue.entity';
import { isoOf } from '../stock/stock.queries';
import { PartBarcodeEntity, type PartBarcodeRow } from './barcodes.entity';

type GtinKind = PartBarcode['kind'];

/**
 * Checks a GTIN's GS1 check digit (GS1 General Specifications §7.9.1, via libs/domain) and gives
 * its kind and 14-digit form; a wrong check digit is a 400 naming the digit expected.
 */
export function checkGtin(code: string): { kind: GtinKind; gtin14: string } {
  const result = validateGs1(code);
  if (!result.ok) {
    if (result.reason === 'check_digit') throw badRequest(`${code} is not a valid barcode number: its last digit should be ${result.expected}. Scan it again or check the number.`, { reason: 'check_digit', expected: result.expected });
    throw badRequest('A barcode number has 8, 12, 13 or 14 digits (EAN-8, UPC-A, EAN-13 or GTIN-14).', { reason: result.reason });
  }
  if (result.kind === 'SSCC-18') throw badRequest('That is a shipping container code (SSCC), not a product barcode.', { reason: 'not_a_gtin' });
  return { kind: result.kind, gtin14: code.padStart(14, '0') };
}

/** The part a GTIN (in its 14-digit form) is attached to in the shop, or null: for the lookup. */
export async function partIdOfGtin(reader: EntityManager, shopId: string, gtin14: string): Promise<string | null> {
  return (await shopScoped(reader, PartBarcodeEntity, shopId).findOne({ gtin14 }))?.partId ?? null;
}

const view = (row: PartBarcodeRow): PartBarcode => ({ id: row.id, partId: row.partId, code: row.code, kind: checkGtin(row.code).kind, createdAt: isoOf(row.createdAt) });

/** Supplier barcodes on parts: attach (GS1-checked), detach, and find the part a scanned one names. */
export function createBarcodesService(deps: { db: Database; clock: Clock }) {
  const { db, clock } = deps;
  return {
    async list(shopId: string, partId: string): Promise<{ barcodes: PartBarcode[] }> {
      await shopScoped(db.reader, PartEntity, shopId).findOneOr404({ id: partId }, 'No such part in this shop.');
      const rows = await shopScoped(db.reader, PartBarcodeEntity, shopId).find({ partId }, { createdAt: 'ASC' });
      return { barcodes: rows.map(view) };
    },

    /** Attaches a GTIN to a part; one already on another part of the shop is a 409 naming it. */
    async attach(shopId: string, partId: string, code: string, actor: AuditActor): Promise<PartBarcode> {
      const { gtin14 } = checkGtin(code);
      const row = await db.write(async (manager) => {
        const part = await shopScoped(manager, PartEntity, shopId).findOneOr404({ id: partId }, 'No such part in this shop.');
        const existing = await shopScoped(manager, PartBarcodeEntity, shopId).findOne({ gtin14 });
        if (existing) {
          const owner = await shopScoped(manager, PartEntity, shopId).findOne({ id: existing.partId });
          throw new HttpError(409, 'conflict', existing.partId === part.id ? `${code} is already on ${part.number}.` : `${code} is already on ${owner?.number ?? 'another part'}: take it off there first.`, { reason: 'barcode_taken', partId: existing.partId, partNumber: owner?.number });
        }
        const at = clock.now();
        const created: PartBarcodeRow = { id: randomUUID(), shopId, partId: part.id, code, gtin14, createdAt: at, createdByUserId: actor.userId };
        await manager.insert(PartBarcodeEntity, created);
        await recordAudit(manager, { shopId, actor, action: 'part.barcode_attached', entity: 'part', entityId: part.id, changes: { barcode: { before: null, after: code } }, at });
        return created;
      });
      return view(row);
    },

    async detach(shopId: string, partId: string, barcodeId: string, actor: AuditActor): Promise<void> {
      await db.write(async (manager) => {
        const row = await shopScoped(manager, PartBarcodeEntity, shopId).findOne({ id: barcodeId, partId });
        if (!row) throw notFound('No such barcode on this part.');
        await manager.delete(PartBarcodeEntity, { shopId, id: row.id });
        await recordAudit(manager, { shopId, actor, action: 'part.barcode_detached', entity: 'part', entityId: partId, changes: { barcode: { before: row.code, after: null } }, at: clock.now() });
      });
    },

    /** The part a scanned GTIN names; a valid code on no part is a 404 (`details.reason` `barcode_unknown`), so the caller can offer to attach it. */
    async find(shopId: string, code: string): Promise<BarcodeLookup> {
      const cleaned = code.replace(/[\s-]/g, '');
      const { gtin14 } = checkGtin(cleaned);
      const row = await shopScoped(db.reader, PartBarcodeEntity, shopId).findOne({ gtin14 });
      if (!row) throw new HttpError(404, 'not_found', `No part has the barcode ${cleaned} yet.`, { reason: 'barcode_unknown', code: cleaned });
      const part = await shopScoped(db.reader, PartEntity, shopId).findOneOr404({ id: row.partId }, 'No such part in this shop.');
      return { barcode: view(row), part: { id: part.id, number: part.number, description: part.description } };
    },
  };
}

export type BarcodesService = ReturnType<typeof createBarcodesService>;
