import { randomUUID } from 'node:crypto';
import type { z } from 'zod';
import type { creditInputSchema, SupplierReturn, supplierReturnInputSchema } from '@tappet/contracts';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { HttpError, badRequest, notFound } from '../../lib/http-error';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { adjustStock } from '../stock/stock.service';
import { PurchaseOrderEntity, PurchaseOrderLineEntity, SupplierReturnEntity, type SupplierReturnRow } from './purchasing.entity';
import { created, partOf, supplierOf } from './suppliers.service';

const noSuchReturn = () => notFound('No such return in this shop.');

/**
 * Returns to suppliers and core deposits, each tracked until the supplier credits it. A returned
 * part leaves stock through the stock module in the same transaction (an adjustment with the
 * return's reason, at the moving average); a core is a used part going back, not shop stock.
 */
export function createReturnsService(deps: { db: Database; clock: Clock }) {
  const { db, clock } = deps;

  async function list(shopId: string, where: { id?: string } = {}): Promise<SupplierReturn[]> {
    const rows = await shopScoped(db.reader, SupplierReturnEntity, shopId).find(where, { createdAt: 'DESC' });
    const out: SupplierReturn[] = [];
    for (const r of rows) {
      const supplier = await supplierOf(db.reader, shopId, r.supplierId);
      const part = await partOf(db.reader, shopId, r.partId);
      out.push({
        id: r.id,
        kind: r.kind,
        supplierId: r.supplierId,
        supplierName: supplier.name,
        orderId: r.orderId,
        lineId: r.lineId,
        partId: r.partId,
        partNumber: part.number,
        quantity: r.quantity,
        reason: r.reason,
        expectedCreditMinor: r.expectedCreditMinor,
        currency: r.currency,
        status: r.status,
        creditedMinor: r.creditedMinor,
        creditReference: r.creditReference,
        creditedAt: r.creditedAt ? new Date(r.creditedAt).toISOString() : null,
        createdAt: new Date(r.createdAt).toISOString(),
      });
    }
    return out;
  }

  return {
    list: (shopId: string) => list(shopId),

    /** Records a return (taking the parts out of their bin) or a core sent back for its deposit. */
    async create(shopId: string, input: z.output<typeof supplierReturnInputSchema>, actor: AuditActor): Promise<SupplierReturn> {
      const id = await db.write(async (manager) => {
        const supplier = await supplierOf(manager, shopId, input.supplierId);
        const part = await partOf(manager, shopId, input.partId);
        let orderId: string | null = null;
        let expected = input.expectedCreditMinor;
        if (input.lineId) {
          const line = await shopScoped(manager, PurchaseOrderLineEntity, shopId).findOne({ id: input.lineId });
          if (!line) throw notFound('No such order line in this shop.');
          const order = await shopScoped(manager, PurchaseOrderEntity, shopId).findOneOr404({ id: line.orderId });
          if (order.supplierId !== supplier.id || line.partId !== part.id) throw badRequest('That order line is for another supplier or part.');
          orderId = order.id;
          if (input.kind === 'core') {
            if (line.coreDepositMinor === 0) throw badRequest('That order line carries no core deposit.');
            const returned = await manager.query<Array<{ n: number }>>(`SELECT COALESCE(SUM(quantity), 0) AS n FROM supplier_returns WHERE shop_id = ? AND line_id = ? AND kind = 'core'`, [shopId, line.id]);
            const left = line.receivedQuantity - Number(returned[0]?.n ?? 0);
            if (input.quantity > left) throw new HttpError(409, 'conflict', `Only ${left} core(s) are still owed a deposit on that line.`, { reason: 'too_many_cores' });
            expected ??= line.coreDepositMinor * input.quantity;
          } else {
            expected ??= line.unitPriceMinor * input.quantity;
          }
        } else if (input.kind === 'core') {
          throw badRequest('A core goes back against the order line that carried its deposit: choose the line.');
        }
        if (expected === undefined) throw badRequest('Enter the credit expected, or choose the order line the parts came on.');
        if (input.kind === 'return') {
          if (!input.binId) throw badRequest('Choose the bin the returned parts leave from.');
          await adjustStock(manager, shopId, { partId: part.id, binId: input.binId, condition: input.condition, quantityDelta: -input.quantity, reason: `Returned to ${supplier.name}: ${input.reason}`.slice(0, 200), reference: 'supplier return' }, { actor, at: clock.now() });
        }
        const row: SupplierReturnRow = {
          id: randomUUID(),
          shopId,
          kind: input.kind,
          supplierId: supplier.id,
          orderId,
          lineId: input.lineId,
          partId: part.id,
          binId: input.kind === 'return' ? input.binId : null,
          condition: input.kind === 'return' ? input.condition : null,
          quantity: input.quantity,
          reason: input.reason,
          expectedCreditMinor: expected,
          currency: supplier.currency,
          status: 'open',
          creditedMinor: null,
          creditReference: null,
          creditedAt: null,
          createdByUserId: actor.userId,
          createdAt: clock.now(),
        };
        await manager.insert(SupplierReturnEntity, row);
        await recordAudit(manager, { shopId, actor, action: `supplier_return.created`, entity: 'supplier_return', entityId: row.id, changes: created({ kind: row.kind, supplier: supplier.id, part: part.id, quantity: row.quantity, reason: row.reason, expectedCreditMinor: expected }), at: clock.now() });
        return row.id;
      });
      return (await list(shopId, { id }))[0]!;
    },

    /** Marks a return or core as credited by the supplier (once). */
    async credit(shopId: string, returnId: string, input: z.output<typeof creditInputSchema>, actor: AuditActor): Promise<SupplierReturn> {
      await db.write(async (manager) => {
        const row = await shopScoped(manager, SupplierReturnEntity, shopId).findOne({ id: returnId });
        if (!row) throw noSuchReturn();
        if (row.status === 'credited') throw new HttpError(409, 'conflict', 'That return was already credited.', { reason: 'already_credited' });
        await manager.update(SupplierReturnEntity, { shopId, id: returnId }, { status: 'credited', creditedMinor: input.creditedMinor, creditReference: input.creditReference, creditedAt: clock.now() });
        await recordAudit(manager, {
          shopId,
          actor,
          action: 'supplier_return.credited',
          entity: 'supplier_return',
          entityId: returnId,
          changes: { status: { before: 'open', after: 'credited' }, creditedMinor: { before: null, after: input.creditedMinor }, creditReference: { before: null, after: input.creditReference } },
          at: clock.now(),
        });
      });
      return (await list(shopId, { id: returnId }))[0]!;
    },
  };
}

export type ReturnsService = ReturnType<typeof createReturnsService>;
