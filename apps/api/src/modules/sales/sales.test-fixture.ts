import { randomUUID } from 'node:crypto';
import type { Database } from '../../db/write-lock';
import { PartEntity } from '../catalogue/catalogue.entity';
import { createBin, receiveStock } from '../stock/stock.service';
import { InvoiceEntity, InvoiceLineEntity, PaymentEntity } from './sales.entity';

/** Parts with known costs for sales tests and the authorization matrix. */
export interface SalesFixture {
  binId: string;
  /** No category, genuine, 10 on hand at 3.33. */
  plainPartId: string;
  /** Category "Brakes", 10 on hand at 12.34. */
  brakePartId: string;
  /** Origin reproduction, 10 on hand at 10.00. */
  reproPartId: string;
  /** No stock and never received: no cost. */
  unpricedPartId: string;
}

export async function seedSalesFixture(db: Database, shopId: string): Promise<SalesFixture> {
  const ctx = { actor: { userId: null }, at: new Date(Date.UTC(2026, 0, 10)) };
  const part = async (manager: Parameters<Parameters<Database['write']>[0]>[0], number: string, description: string, category: string | null, origin: 'genuine' | 'reproduction' | 'pattern') => {
    const id = randomUUID();
    await manager.insert(PartEntity, { id, shopId, number, key: number.replace(/[^A-Z0-9]/gi, '').toUpperCase(), description, origin, maker: null, category, unit: 'each', status: 'available', notes: null, createdAt: ctx.at, updatedAt: ctx.at });
    return id;
  };
  return db.write(async (manager) => {
    const bin = await createBin(manager, shopId, { code: 'SL-1', description: 'Sales fixture bin' }, ctx);
    const plainPartId = await part(manager, 'SL-100', 'Gasket set', null, 'genuine');
    const brakePartId = await part(manager, 'SL-200', 'Brake shoe pair', 'Brakes', 'genuine');
    const reproPartId = await part(manager, 'SL-300', 'Chrome headlamp rim', 'Lighting', 'reproduction');
    const unpricedPartId = await part(manager, 'SL-400', 'Speedometer cable', null, 'pattern');
    await receiveStock(manager, shopId, { partId: plainPartId, binId: bin.id, condition: 'new', quantity: 10, unitCostMinor: 333 }, ctx);
    await receiveStock(manager, shopId, { partId: brakePartId, binId: bin.id, condition: 'new', quantity: 10, unitCostMinor: 1234 }, ctx);
    await receiveStock(manager, shopId, { partId: reproPartId, binId: bin.id, condition: 'new', quantity: 10, unitCostMinor: 1000 }, ctx);
    return { binId: bin.id, plainPartId, brakePartId, reproPartId, unpricedPartId };
  });
}

/** Invoices in every state for the authorization matrix; spare ids are handed out one per call. */
export interface SalesMatrixFixture {
  partId: string;
  binId: string;
  /** A draft that stays a draft (edits). */
  draftId: string;
  /** An issued invoice with a large amount due (payments, card checkout, e-mail, PDF). */
  payableId: string;
  /** The pay-link token of an issued invoice that is fully paid. */
  paidToken: string;
  /** A ready shop-stock vehicle (drafts of its sale). */
  vehicleId: string;
  nextDraftId(): string;
  nextIssuedId(): string;
  nextJobId(): string;
}

export async function seedSalesMatrixFixture(db: Database, shopId: string, refs: { partId: string; binId: string; vehicleId: string }, spare = 40): Promise<SalesMatrixFixture> {
  const at = new Date(Date.UTC(2026, 0, 12));
  const time = at.toISOString().replace('T', ' ').replace('Z', '');
  let number = 90000;
  return db.write(async (manager) => {
    const invoice = async (status: 'draft' | 'issued', unitPriceMinor: number, payToken: string | null = null) => {
      const id = randomUUID();
      const issued = status === 'issued';
      const tax = Math.round(unitPriceMinor / 5);
      await manager.insert(InvoiceEntity, {
        id, shopId, kind: 'invoice', status, number: issued ? ++number : null, source: 'manual', customerId: null, customerName: 'Matrix Customer', customerEmail: 'matrix@customer.test', customerAddress: null,
        notes: null, jobId: null, vehicleId: null, creditedInvoiceId: null, creditReason: null, currency: 'GBP', taxRounding: 'per-line', netMinor: unitPriceMinor, taxMinor: tax, grossMinor: unitPriceMinor + tax,
        taxByRate: JSON.stringify([{ ratePercent: 20, netMinor: unitPriceMinor, taxMinor: tax }]), payToken, createdByUserId: null, createdAt: at, updatedAt: at, issuedAt: issued ? at : null, emailedAt: null,
      });
      await manager.insert(InvoiceLineEntity, {
        id: randomUUID(), shopId, invoiceId: id, position: 1, kind: 'other', partId: null, description: 'Matrix work', quantity: '1', unitPriceMinor, listedUnitPriceMinor: null, unitCostMinor: null,
        discountPercent: 0, taxRatePercent: 20, netMinor: unitPriceMinor, taxMinor: tax, grossMinor: unitPriceMinor + tax, creditedLineId: null,
      });
      return id;
    };
    const draftId = await invoice('draft', 1000);
    const payableId = await invoice('issued', 50_000_000);
    const paidToken = `matrixpaidtoken${randomUUID().replace(/-/g, '')}`;
    const paidId = await invoice('issued', 1000, paidToken);
    await manager.insert(PaymentEntity, { id: randomUUID(), shopId, invoiceId: paidId, method: 'cash', amountMinor: 1200, receivedOn: '2026-01-12', reference: null, stripeSessionId: null, recordedByUserId: null, createdAt: at });
    await manager.query(`INSERT INTO invoice_counters (shop_id, series, last_number) VALUES (?, 'invoice', ?)`, [shopId, number + 1000]);
    const drafts: string[] = [];
    const issued: string[] = [];
    const jobs: string[] = [];
    for (let i = 0; i < spare; i++) {
      drafts.push(await invoice('draft', 500 + i));
      issued.push(await invoice('issued', 700 + i));
      const jobId = randomUUID();
      await manager.query(
        `INSERT INTO jobs (id, shop_id, number, vehicle_id, title, customer_request, status, due_on, notes, created_by_user_id, created_at, updated_at, started_at, completed_at)
         VALUES (?, ?, ?, ?, ?, ?, 'done', NULL, NULL, NULL, ?, ?, NULL, NULL)`,
        [jobId, shopId, 80000 + i, refs.vehicleId, `Matrix invoice job ${i + 1}`, 'Matrix', time, time],
      );
      jobs.push(jobId);
    }
    const vehicleId = randomUUID();
    await manager.query(
      `INSERT INTO vehicles (id, shop_id, kind, marque, model, year, status, status_since, asking_price_minor, acquisition_cost_minor, created_at, updated_at)
       VALUES (?, ?, 'shop_stock', 'Matrixmoto', 'Tourer', 1965, 'ready', ?, 300000, 200000, ?, ?)`,
      [vehicleId, shopId, time, time, time],
    );
    const take = (list: string[], what: string) => () => {
      const id = list.shift();
      if (!id) throw new Error(`The sales matrix fixture ran out of spare ${what}.`);
      return id;
    };
    return { partId: refs.partId, binId: refs.binId, draftId, payableId, paidToken, vehicleId, nextDraftId: take(drafts, 'drafts'), nextIssuedId: take(issued, 'issued invoices'), nextJobId: take(jobs, 'jobs') };
  });
}
