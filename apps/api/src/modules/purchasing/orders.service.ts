import { randomUUID } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import { formatMoney } from '@tappet/domain';
import { purchaseOrderListLimit, type AuditAction, type orderInputSchema, type orderLineInputSchema, type orderUpdateSchema, type PurchaseOrder, type PurchaseOrderStatus, type receiptInputSchema } from '@tappet/contracts';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { HttpError, badRequest, notFound } from '../../lib/http-error';
import type { Mailer } from '../../lib/mailer';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { PartEntity } from '../catalogue/catalogue.entity';
import { ShopEntity } from '../shops/shops.entity';
import { ShopSettingsEntity } from '../settings/settings.entity';
import { JobEntity, JobSpecialOrderEntity } from '../jobs/jobs.entity';
import { setSpecialOrderStatus } from '../jobs/jobs.service';
import { BinEntity } from '../stock/stock.entity';
import { holdStock, receiveStock } from '../stock/stock.service';
import { convertMinorUnits } from './money';
import { renderOrderPdf } from './order-pdf';
import { LIVE_ORDER_STATES, receivedForSpecialOrder } from './special-orders';
import { ListingEntity, PurchaseOrderEntity, PurchaseOrderLineEntity, PurchaseReceiptEntity, type PurchaseOrderLineRow, type PurchaseOrderRow, type SupplierRow } from './purchasing.entity';
import { partOf, shopCurrencyOf, supplierOf } from './suppliers.service';

export type OrderCreate = z.output<typeof orderInputSchema>;
export type OrderPatch = z.output<typeof orderUpdateSchema>;
export type OrderLineInput = z.output<typeof orderLineInputSchema>;
export type ReceiptInput = z.output<typeof receiptInputSchema>;

const noSuchOrder = () => notFound('No such purchase order in this shop.');
/** 409 with a machine-readable reason for the web app. */
const orderConflict = (reason: string, message: string) => new HttpError(409, 'conflict', message, { reason });
const iso = (d: Date | string | null) => (d === null ? null : new Date(d).toISOString());

/** "PO-000042": the reference printed on the order and quoted by the supplier. */
export const orderReference = (n: number) => `PO-${String(n).padStart(6, '0')}`;

/** Orders whose lines and prices can still change (an edit sends them back to draft). */
const editable: PurchaseOrderStatus[] = ['draft', 'awaiting_approval', 'approved'];
/** Orders the supplier has and that can still deliver. */
const open: PurchaseOrderStatus[] = ['sent', 'partly_received'];

const outstanding = (l: PurchaseOrderLineRow) => l.quantity - l.receivedQuantity - l.cancelledQuantity;

/** How the caller may act on an order; the router derives it from the CASL ability. */
export interface OrderPermissions {
  /** The ability allows sending an order of this total (shop currency) without approval. */
  canSendTotal(totalShopMinor: number): boolean;
  /** The caller's spending limit, for the refusal message; null when none is set. */
  spendingLimitMinor: number | null;
}

/**
 * Purchase orders: drafts by hand or from the reorder list, approval above a buyer's limit, the
 * PDF e-mailed to the supplier, receipts into bins through the stock ledger (in the same
 * transaction, so the moving average moves with them), cancelling and closing back-orders.
 * Mail is sent after the transaction commits, never inside it.
 */
export function createOrdersService(deps: { db: Database; clock: Clock; mailer: Mailer; onMailError?: (err: unknown) => void }) {
  const { db, clock, mailer } = deps;

  async function orderRow(manager: EntityManager, shopId: string, orderId: string): Promise<PurchaseOrderRow> {
    const row = await shopScoped(manager, PurchaseOrderEntity, shopId).findOne({ id: orderId });
    if (!row) throw noSuchOrder();
    return row;
  }

  async function linesOf(manager: EntityManager, shopId: string, orderId: string): Promise<PurchaseOrderLineRow[]> {
    return shopScoped(manager, PurchaseOrderLineEntity, shopId).find({ orderId }, { position: 'ASC' });
  }

  async function view(manager: EntityManager, shopId: string, orderId: string): Promise<PurchaseOrder> {
    const o = await orderRow(manager, shopId, orderId);
    const supplier = await supplierOf(manager, shopId, o.supplierId);
    const lines = await linesOf(manager, shopId, orderId);
    const parts = new Map<string, string>();
    for (const l of lines) if (!parts.has(l.partId)) parts.set(l.partId, (await partOf(manager, shopId, l.partId)).number);
    const receipts = await manager.query<Array<Record<string, string | number>>>(
      `SELECT r.id, r.line_id AS lineId, r.bin_id AS binId, b.code AS binCode, r.condition, r.quantity, r.unit_price_minor AS unitPriceMinor, r.unit_cost_shop_minor AS unitCostShopMinor, r.received_at AS receivedAt
       FROM purchase_receipts r JOIN stock_bins b ON b.shop_id = r.shop_id AND b.id = r.bin_id WHERE r.shop_id = ? AND r.order_id = ? ORDER BY r.received_at, r.id`,
      [shopId, orderId],
    );
    return {
      ...summary(o, supplier, await shopCurrencyOf(manager, shopId)),
      lines: lines.map((l) => ({
        id: l.id,
        position: l.position,
        partId: l.partId,
        partNumber: parts.get(l.partId)!,
        supplierNumber: l.supplierNumber,
        description: l.description,
        quantity: l.quantity,
        receivedQuantity: l.receivedQuantity,
        cancelledQuantity: l.cancelledQuantity,
        outstandingQuantity: outstanding(l),
        unitPriceMinor: l.unitPriceMinor,
        coreDepositMinor: l.coreDepositMinor,
        lineTotalMinor: l.quantity * (l.unitPriceMinor + l.coreDepositMinor),
        purpose: l.purpose,
        specialOrderId: l.specialOrderId,
      })),
      receipts: receipts.map((r) => ({
        id: String(r['id']),
        lineId: String(r['lineId']),
        binId: String(r['binId']),
        binCode: String(r['binCode']),
        condition: String(r['condition']),
        quantity: Number(r['quantity']),
        unitPriceMinor: Number(r['unitPriceMinor']),
        unitCostShopMinor: Number(r['unitCostShopMinor']),
        receivedAt: new Date(`${String(r['receivedAt']).replace(' ', 'T')}${String(r['receivedAt']).endsWith('Z') ? '' : 'Z'}`).toISOString(),
      })),
    };
  }

  function summary(o: PurchaseOrderRow, supplier: SupplierRow, shopCurrency: string) {
    return {
      id: o.id,
      number: o.number,
      reference: orderReference(o.number),
      supplierId: o.supplierId,
      supplierName: supplier.name,
      supplierEmail: supplier.email,
      status: o.status,
      currency: o.currency,
      shopCurrency,
      exchangeRate: o.exchangeRate,
      totalMinor: o.totalMinor,
      totalShopMinor: o.totalShopMinor,
      note: o.note,
      approvalRequestedAt: iso(o.approvalRequestedAt),
      approvedAt: iso(o.approvedAt),
      rejectionReason: o.rejectionReason,
      sentAt: iso(o.sentAt),
      closedReason: o.closedReason,
      createdAt: new Date(o.createdAt).toISOString(),
      updatedAt: new Date(o.updatedAt).toISOString(),
    };
  }

  /** The rate to use: the one given, 1 for the shop's own currency; a foreign order without one is a 400. */
  function rateFor(supplier: SupplierRow, shopCurrency: string, given: string | undefined, current?: string): string {
    if (supplier.currency === shopCurrency) {
      if (given !== undefined && Number(given) !== 1) throw badRequest(`${supplier.name} invoices in ${shopCurrency}, the shop's own currency: the exchange rate is 1.`);
      return '1';
    }
    const rate = given ?? current;
    if (rate === undefined) throw badRequest(`${supplier.name} invoices in ${supplier.currency}: enter the exchange rate (${shopCurrency} per 1 ${supplier.currency}).`);
    return rate;
  }

  /** Builds order lines from the input: parts looked up in the shop, prices from the supplier's listing. */
  async function buildLines(manager: EntityManager, shopId: string, orderId: string, supplier: SupplierRow, inputs: OrderLineInput[]): Promise<PurchaseOrderLineRow[]> {
    const lines: PurchaseOrderLineRow[] = [];
    for (const [i, input] of inputs.entries()) {
      const part = await partOf(manager, shopId, input.partId);
      const listing = await shopScoped(manager, ListingEntity, shopId).findOne({ supplierId: supplier.id, partId: part.id });
      const price = input.unitPriceMinor ?? listing?.priceMinor;
      if (price === undefined) throw badRequest(`${supplier.name} has no listing for ${part.number}: enter its unit price.`, { line: i });
      const special = input.specialOrderId ? await specialOrderFor(manager, shopId, input.specialOrderId, part.id, part.number, i) : null;
      lines.push({
        id: randomUUID(),
        shopId,
        orderId,
        position: i + 1,
        partId: part.id,
        supplierNumber: listing?.supplierNumber ?? null,
        description: part.description,
        quantity: input.quantity,
        receivedQuantity: 0,
        cancelledQuantity: 0,
        unitPriceMinor: price,
        coreDepositMinor: input.coreDepositMinor,
        purpose: input.purpose ?? (special ? `Special order for job ${special.jobNumber}` : null),
        specialOrderId: special?.id ?? null,
      });
    }
    const seen = new Set<string>();
    for (const [i, l] of lines.entries()) {
      if (!l.specialOrderId) continue;
      if (seen.has(l.specialOrderId)) throw badRequest('A special order can be on one line only.', { line: i });
      seen.add(l.specialOrderId);
    }
    return lines;
  }

  /**
   * A job's special order a line may buy for: in this shop, for the same part, still open and not
   * already on another live order (the caller has removed this order's own lines first).
   */
  async function specialOrderFor(manager: EntityManager, shopId: string, specialOrderId: string, partId: string, partNumber: string, line: number): Promise<{ id: string; jobNumber: number }> {
    const row = await shopScoped(manager, JobSpecialOrderEntity, shopId).findOne({ id: specialOrderId });
    if (!row) throw notFound('No such special order in this shop.');
    if (row.partId !== partId) throw badRequest(`That special order is for another part, not ${partNumber}.`, { line });
    if (row.status !== 'open' && row.status !== 'ordered') throw orderConflict('special_order_not_open', `That special order is already ${row.status}.`);
    const [taken] = await manager.query<Array<{ number: number }>>(
      `SELECT o.number FROM purchase_order_lines l JOIN purchase_orders o ON o.shop_id = l.shop_id AND o.id = l.order_id
       WHERE l.shop_id = ? AND l.special_order_id = ? AND o.status IN (${LIVE_ORDER_STATES.map(() => '?').join(', ')}) LIMIT 1`,
      [shopId, specialOrderId, ...LIVE_ORDER_STATES],
    );
    if (taken) throw orderConflict('special_order_taken', `That special order is already on ${orderReference(Number(taken.number))}.`);
    if ((await receivedForSpecialOrder(manager, shopId, specialOrderId)) >= row.quantity) throw orderConflict('special_order_not_open', 'Everything that special order asked for has arrived.');
    const job = await shopScoped(manager, JobEntity, shopId).findOne({ id: row.jobId });
    return { id: row.id, jobNumber: job?.number ?? 0 };
  }

  function totals(lines: PurchaseOrderLineRow[], rate: string, currency: string, shopCurrency: string) {
    const totalMinor = lines.reduce((sum, l) => sum + l.quantity * (l.unitPriceMinor + l.coreDepositMinor), 0);
    if (!Number.isSafeInteger(totalMinor)) throw badRequest('The order total is too large.');
    return { totalMinor, totalShopMinor: convertMinorUnits(totalMinor, rate, currency, shopCurrency) };
  }

  async function nextNumber(manager: EntityManager, shopId: string): Promise<number> {
    const [row] = await manager.query<Array<{ n: number }>>(`SELECT COALESCE(MAX(number), 0) + 1 AS n FROM purchase_orders WHERE shop_id = ?`, [shopId]);
    return Number(row?.n ?? 1);
  }

  async function audit(manager: EntityManager, shopId: string, actor: AuditActor, action: AuditAction, orderId: string, fields: Record<string, unknown>) {
    const changes = Object.fromEntries(Object.entries(fields).filter(([, v]) => v !== undefined).map(([k, v]) => [k, { before: null, after: v }]));
    await recordAudit(manager, { shopId, actor, action, entity: 'purchase_order', entityId: orderId, changes, at: clock.now() });
  }

  function requireStatus(o: PurchaseOrderRow, allowed: PurchaseOrderStatus[], doing: string): void {
    if (!allowed.includes(o.status)) throw orderConflict('wrong_status', `${orderReference(o.number)} is ${o.status.replace(/_/g, ' ')}: it cannot be ${doing} now.`);
  }

  async function transition(manager: EntityManager, o: PurchaseOrderRow, patch: Partial<PurchaseOrderRow>): Promise<void> {
    await manager.update(PurchaseOrderEntity, { shopId: o.shopId, id: o.id }, { ...patch, updatedAt: clock.now() });
  }

  /** Sends mail after a commit; a failure is logged and reported, never undoes the change. */
  async function sendMail(message: Parameters<Mailer['send']>[0]): Promise<boolean> {
    try {
      await mailer.send(message);
      return true;
    } catch (err) {
      deps.onMailError?.(err);
      return false;
    }
  }

  /** Inserts a new draft in `manager`'s transaction and returns its id. */
  async function insertDraft(manager: EntityManager, shopId: string, input: OrderCreate, actor: AuditActor): Promise<string> {
    const supplier = await supplierOf(manager, shopId, input.supplierId);
    if (!supplier.active) throw orderConflict('supplier_inactive', `${supplier.name} is marked as no longer used: reactivate the supplier first.`);
    const shopCurrency = await shopCurrencyOf(manager, shopId);
    const rate = rateFor(supplier, shopCurrency, input.exchangeRate);
    const id = randomUUID();
    const lines = await buildLines(manager, shopId, id, supplier, input.lines);
    const t = totals(lines, rate, supplier.currency, shopCurrency);
    const now = clock.now();
    const number = await nextNumber(manager, shopId);
    await manager.insert(PurchaseOrderEntity, {
      id,
      shopId,
      number,
      supplierId: supplier.id,
      status: 'draft',
      currency: supplier.currency,
      exchangeRate: rate,
      ...t,
      note: input.note,
      createdByUserId: actor.userId,
      approvalRequestedAt: null,
      approvedByUserId: null,
      approvedAt: null,
      rejectionReason: null,
      sentAt: null,
      closedReason: null,
      closedAt: null,
      createdAt: now,
      updatedAt: now,
    });
    await manager.insert(PurchaseOrderLineEntity, lines);
    await audit(manager, shopId, actor, 'purchase_order.created', id, { reference: orderReference(number), supplier: supplier.id, lines: lines.length, totalMinor: t.totalMinor, currency: supplier.currency, exchangeRate: rate });
    return id;
  }

  async function ownersOf(shopId: string): Promise<string[]> {
    const rows = await db.reader.query<Array<{ email: string }>>(
      `SELECT u.email FROM memberships m JOIN users u ON u.id = m.user_id WHERE m.shop_id = ? AND m.role = 'owner' AND m.is_active = 1 AND u.is_active = 1 ORDER BY u.email`,
      [shopId],
    );
    return rows.map((r) => r.email);
  }


  /**
   * After an order is cancelled or closed short: a job's special order it carried, not yet fully
   * received and on no other live order, is open again, so the job shows it waiting to be bought.
   */
  async function reopenSpecialOrders(manager: EntityManager, shopId: string, orderId: string, actor: AuditActor): Promise<void> {
    for (const l of await linesOf(manager, shopId, orderId)) {
      if (!l.specialOrderId) continue;
      const special = await shopScoped(manager, JobSpecialOrderEntity, shopId).findOne({ id: l.specialOrderId });
      if (special?.status !== 'ordered') continue;
      const [others] = await manager.query<Array<{ live: number; received: number }>>(
        `SELECT SUM(CASE WHEN o.status IN (${LIVE_ORDER_STATES.map(() => '?').join(', ')}) THEN 1 ELSE 0 END) AS live, COALESCE(SUM(l.received_quantity), 0) AS received
         FROM purchase_order_lines l JOIN purchase_orders o ON o.shop_id = l.shop_id AND o.id = l.order_id
         WHERE l.shop_id = ? AND l.special_order_id = ?`,
        [...LIVE_ORDER_STATES, shopId, special.id],
      );
      if (Number(others?.live ?? 0) === 0 && Number(others?.received ?? 0) < special.quantity) await setSpecialOrderStatus(manager, shopId, special.id, 'open', actor, clock.now());
    }
  }

  return {
    /** The newest orders matching (at most `purchaseOrderListLimit`; `truncated` says when more match). */
    async list(shopId: string, query: { status?: PurchaseOrderStatus; supplierId?: string }) {
      const found = await shopScoped(db.reader, PurchaseOrderEntity, shopId).find(
        { ...(query.status ? { status: query.status } : {}), ...(query.supplierId ? { supplierId: query.supplierId } : {}) },
        { number: 'DESC' },
        purchaseOrderListLimit + 1,
      );
      const rows = found.slice(0, purchaseOrderListLimit);
      const shopCurrency = await shopCurrencyOf(db.reader, shopId);
      const counts = new Map(
        (await db.reader.query<Array<{ id: string; n: number }>>(`SELECT order_id AS id, COUNT(*) AS n FROM purchase_order_lines WHERE shop_id = ? GROUP BY order_id`, [shopId])).map((r) => [r.id, Number(r.n)]),
      );
      const suppliers = new Map<string, SupplierRow>();
      const out = [];
      for (const o of rows) {
        if (!suppliers.has(o.supplierId)) suppliers.set(o.supplierId, await supplierOf(db.reader, shopId, o.supplierId));
        out.push({ ...summary(o, suppliers.get(o.supplierId)!, shopCurrency), lineCount: counts.get(o.id) ?? 0 });
      }
      return { orders: out, truncated: found.length > purchaseOrderListLimit };
    },

    get: (shopId: string, orderId: string) => view(db.reader, shopId, orderId),

    insertDraft,

    /** A new draft order. Prices default to the supplier's listing; a foreign currency needs a rate. */
    async create(shopId: string, input: OrderCreate, actor: AuditActor): Promise<PurchaseOrder> {
      const id = await db.write((manager) => insertDraft(manager, shopId, input, actor));
      return view(db.reader, shopId, id);
    },

    /**
     * Changes a draft (or an order awaiting or holding approval, which goes back to draft: the
     * approval was for other lines or another total). Lines given replace all lines.
     */
    async update(shopId: string, orderId: string, patch: OrderPatch, actor: AuditActor): Promise<PurchaseOrder> {
      await db.write(async (manager) => {
        const o = await orderRow(manager, shopId, orderId);
        requireStatus(o, editable, 'changed');
        const supplier = await supplierOf(manager, shopId, o.supplierId);
        const shopCurrency = await shopCurrencyOf(manager, shopId);
        const rate = rateFor(supplier, shopCurrency, patch.exchangeRate, o.exchangeRate);
        let lines = await linesOf(manager, shopId, orderId);
        if (patch.lines) {
          await manager.delete(PurchaseOrderLineEntity, { shopId, orderId });
          lines = await buildLines(manager, shopId, orderId, supplier, patch.lines);
          await manager.insert(PurchaseOrderLineEntity, lines);
        }
        const t = totals(lines, rate, o.currency, shopCurrency);
        const back = o.status !== 'draft' ? { status: 'draft' as const, approvedAt: null, approvedByUserId: null, approvalRequestedAt: null } : {};
        await transition(manager, o, { exchangeRate: rate, ...t, ...(patch.note !== undefined ? { note: patch.note } : {}), ...back });
        await audit(manager, shopId, actor, 'purchase_order.updated', orderId, {
          exchangeRate: patch.exchangeRate,
          note: patch.note,
          lines: patch.lines ? lines.length : undefined,
          totalMinor: t.totalMinor,
          status: back.status,
        });
      });
      return view(db.reader, shopId, orderId);
    },

    /** Draft → awaiting approval; the shop's owners are e-mailed after the commit. */
    async requestApproval(shopId: string, orderId: string, actor: AuditActor & { name: string | null }): Promise<PurchaseOrder> {
      const o = await db.write(async (manager) => {
        const row = await orderRow(manager, shopId, orderId);
        requireStatus(row, ['draft'], 'sent for approval');
        await transition(manager, row, { status: 'awaiting_approval', approvalRequestedAt: clock.now(), rejectionReason: null });
        await audit(manager, shopId, actor, 'purchase_order.approval_requested', orderId, { status: 'awaiting_approval', totalShopMinor: row.totalShopMinor });
        return row;
      });
      const order = await view(db.reader, shopId, orderId);
      const owners = await ownersOf(shopId);
      const total = formatMoney(o.totalShopMinor, order.shopCurrency);
      for (const to of owners) {
        await sendMail({
          to,
          subject: `Approval needed: ${order.reference} to ${order.supplierName} for ${total}`,
          text: `${actor.name ?? 'A buyer'} asks you to approve purchase order ${order.reference} to ${order.supplierName}, ${order.lines.length} line(s), total ${total}.\n\nOpen the order in Tappet to approve it or reject it with a reason.`,
        });
      }
      return order;
    },

    /** Awaiting approval → approved (owners). */
    async approve(shopId: string, orderId: string, actor: AuditActor): Promise<PurchaseOrder> {
      await db.write(async (manager) => {
        const o = await orderRow(manager, shopId, orderId);
        requireStatus(o, ['awaiting_approval'], 'approved');
        await transition(manager, o, { status: 'approved', approvedAt: clock.now(), approvedByUserId: actor.userId });
        await audit(manager, shopId, actor, 'purchase_order.approved', orderId, { status: 'approved', totalShopMinor: o.totalShopMinor });
      });
      return view(db.reader, shopId, orderId);
    },

    /** Awaiting approval → draft, with the reason kept on the order for the buyer. */
    async reject(shopId: string, orderId: string, reason: string, actor: AuditActor): Promise<PurchaseOrder> {
      await db.write(async (manager) => {
        const o = await orderRow(manager, shopId, orderId);
        requireStatus(o, ['awaiting_approval'], 'rejected');
        await transition(manager, o, { status: 'draft', rejectionReason: reason, approvalRequestedAt: null });
        await audit(manager, shopId, actor, 'purchase_order.rejected', orderId, { status: 'draft', reason });
      });
      return view(db.reader, shopId, orderId);
    },

    /**
     * Sends an order: a draft within the caller's spending limit, or an approved one. Refused with
     * 403 and the totals when a draft is over the limit. The PDF is made and mailed after the
     * commit; `emailed` says whether the mail went.
     */
    async send(shopId: string, orderId: string, permissions: OrderPermissions, actor: AuditActor): Promise<{ order: PurchaseOrder; emailed: boolean; message: string }> {
      await db.write(async (manager) => {
        const o = await orderRow(manager, shopId, orderId);
        requireStatus(o, ['draft', 'approved'], 'sent');
        const supplier = await supplierOf(manager, shopId, o.supplierId);
        if (!supplier.email) throw orderConflict('no_supplier_email', `${supplier.name} has no e-mail address: add one to the supplier before sending.`);
        if (o.status === 'draft' && !permissions.canSendTotal(o.totalShopMinor)) {
          const currency = await shopCurrencyOf(manager, shopId);
          const total = formatMoney(o.totalShopMinor, currency);
          throw new HttpError(
            403,
            'forbidden',
            permissions.spendingLimitMinor === null
              ? `${orderReference(o.number)} (${total}) needs the owner's approval: you have no spending limit set. Ask for approval instead.`
              : `${orderReference(o.number)} totals ${total}, over your spending limit of ${formatMoney(permissions.spendingLimitMinor, currency)}. Ask the owner to approve it.`,
            { reason: 'over_spending_limit', totalShopMinor: o.totalShopMinor, spendingLimitMinor: permissions.spendingLimitMinor },
          );
        }
        await transition(manager, o, { status: 'sent', sentAt: clock.now() });
        // The jobs waiting for these parts now see them as ordered.
        for (const l of await linesOf(manager, shopId, orderId)) {
          if (!l.specialOrderId) continue;
          const special = await shopScoped(manager, JobSpecialOrderEntity, shopId).findOne({ id: l.specialOrderId });
          if (special?.status === 'open') await setSpecialOrderStatus(manager, shopId, special.id, 'ordered', actor, clock.now());
        }
        await audit(manager, shopId, actor, 'purchase_order.sent', orderId, { status: 'sent', to: supplier.email, totalMinor: o.totalMinor });
      });
      const order = await view(db.reader, shopId, orderId);
      const pdf = await this.pdf(shopId, orderId);
      const emailed = await sendMail({
        to: order.supplierEmail!,
        subject: `Purchase order ${order.reference} from ${pdf.shopName}`,
        text: `Please find attached our purchase order ${order.reference} (${order.lines.length} line(s), total ${formatMoney(order.totalMinor, order.currency)}).\nPlease quote ${order.reference} on the delivery note and the invoice.\n\n${pdf.shopName}`,
        attachments: [{ filename: `${order.reference}.pdf`, content: pdf.content, contentType: 'application/pdf' }],
      });
      return { order, emailed, message: emailed ? `${order.reference} was e-mailed to ${order.supplierEmail}.` : `${order.reference} is marked as sent, but the e-mail to ${order.supplierEmail} failed: download the PDF and send it yourself.` };
    },

    /** The order as a PDF (any status: a draft prints for checking). */
    async pdf(shopId: string, orderId: string): Promise<{ content: Buffer; fileName: string; shopName: string }> {
      const order = await view(db.reader, shopId, orderId);
      const shop = await db.reader.findOne(ShopEntity, { where: { id: shopId } });
      const settings = await db.reader.findOne(ShopSettingsEntity, { where: { shopId } });
      const shopName = shop?.name ?? 'Tappet shop';
      const content = await renderOrderPdf({
        reference: order.reference,
        shopName,
        shopAddress: settings?.address ?? '',
        supplierName: order.supplierName,
        currency: order.currency,
        date: order.sentAt ? new Date(order.sentAt) : clock.now(),
        note: order.note,
        lines: order.lines,
        totalMinor: order.totalMinor,
      });
      return { content, fileName: `${order.reference}.pdf`, shopName };
    },

    /** Cancels an order nothing has been received against. */
    async cancel(shopId: string, orderId: string, reason: string, actor: AuditActor): Promise<PurchaseOrder> {
      await db.write(async (manager) => {
        const o = await orderRow(manager, shopId, orderId);
        requireStatus(o, ['draft', 'awaiting_approval', 'approved', 'sent'], 'cancelled');
        await transition(manager, o, { status: 'cancelled', closedReason: reason, closedAt: clock.now() });
        await reopenSpecialOrders(manager, shopId, orderId, actor);
        await audit(manager, shopId, actor, 'purchase_order.cancelled', orderId, { status: 'cancelled', reason });
      });
      return view(db.reader, shopId, orderId);
    },

    /** Closes what is still outstanding on a sent or partly received order (a back-order that will not come). */
    async closeBackOrder(shopId: string, orderId: string, reason: string, actor: AuditActor): Promise<PurchaseOrder> {
      await db.write(async (manager) => {
        const o = await orderRow(manager, shopId, orderId);
        requireStatus(o, open, 'closed');
        const lines = await linesOf(manager, shopId, orderId);
        let closed = 0;
        for (const l of lines) {
          const left = outstanding(l);
          if (left > 0) {
            closed += left;
            await manager.update(PurchaseOrderLineEntity, { shopId, id: l.id }, { cancelledQuantity: l.cancelledQuantity + left });
          }
        }
        await transition(manager, o, { status: 'closed', closedReason: reason, closedAt: clock.now() });
        await reopenSpecialOrders(manager, shopId, orderId, actor);
        await audit(manager, shopId, actor, 'purchase_order.back_order_closed', orderId, { status: 'closed', reason, quantityClosed: closed });
      });
      return view(db.reader, shopId, orderId);
    },

    /**
     * Receives goods against order lines into bins at the price paid (order currency, converted at
     * the order's rate). Each line goes through the stock module's receiveStock in this same
     * transaction, so the ledger, the moving average and the order commit or roll back together.
     */
    async receive(shopId: string, orderId: string, input: ReceiptInput, actor: AuditActor): Promise<PurchaseOrder> {
      await db.write(async (manager) => {
        const o = await orderRow(manager, shopId, orderId);
        requireStatus(o, open, 'received against');
        const shopCurrency = await shopCurrencyOf(manager, shopId);
        const lines = new Map((await linesOf(manager, shopId, orderId)).map((l) => [l.id, l]));
        const now = clock.now();
        const reference = orderReference(o.number);
        for (const item of input.lines) {
          const line = lines.get(item.lineId);
          if (!line) throw notFound('No such line on this order.');
          const left = outstanding(line);
          if (item.quantity > left) {
            const part = await manager.findOne(PartEntity, { where: { shopId, id: line.partId } });
            throw orderConflict('over_receipt', `Only ${left} of ${part?.number ?? 'that part'} are still expected on ${reference}.`);
          }
          if (!(await shopScoped(manager, BinEntity, shopId).findOne({ id: item.binId }))) throw notFound('No such bin in this shop.');
          const unitPrice = item.unitPriceMinor ?? line.unitPriceMinor;
          const unitCost = convertMinorUnits(unitPrice, o.exchangeRate, o.currency, shopCurrency);
          const [movement] = await receiveStock(manager, shopId, { partId: line.partId, binId: item.binId, condition: item.condition, quantity: item.quantity, unitCostMinor: unitCost, reference }, { actor, at: now });
          await manager.insert(PurchaseReceiptEntity, {
            id: randomUUID(),
            shopId,
            orderId,
            lineId: line.id,
            binId: item.binId,
            condition: item.condition,
            quantity: item.quantity,
            unitPriceMinor: unitPrice,
            unitCostShopMinor: unitCost,
            movementId: movement?.id ?? null,
            userId: actor.userId,
            receivedAt: now,
          });
          // A special order: what arrives is set aside for its job (up to what the job asked for; a
          // pack's extra units stay free) and the job's special order moves to received once covered.
          // A line with only a purpose is held whole for that purpose.
          if (line.specialOrderId) {
            const special = await shopScoped(manager, JobSpecialOrderEntity, shopId).findOne({ id: line.specialOrderId });
            if (special) {
              const covered = Math.min(await receivedForSpecialOrder(manager, shopId, special.id), special.quantity);
              const hold = Math.min(item.quantity, special.quantity - covered);
              if (hold > 0) await holdStock(manager, shopId, { partId: line.partId, binId: item.binId, condition: item.condition, quantity: hold, purpose: `${line.purpose ?? 'Special order'} (${reference})`.slice(0, 200), jobId: special.jobId }, { actor, at: now });
              if (covered + item.quantity >= special.quantity && special.status !== 'received' && special.status !== 'cancelled') await setSpecialOrderStatus(manager, shopId, special.id, 'received', actor, now);
            }
          } else if (line.purpose) await holdStock(manager, shopId, { partId: line.partId, binId: item.binId, condition: item.condition, quantity: item.quantity, purpose: `${line.purpose} (${reference})`.slice(0, 200) }, { actor, at: now });
          line.receivedQuantity += item.quantity;
          await manager.update(PurchaseOrderLineEntity, { shopId, id: line.id }, { receivedQuantity: line.receivedQuantity });
          await manager.update(ListingEntity, { shopId, supplierId: o.supplierId, partId: line.partId }, { lastPaidUnitMinor: unitCost, lastPaidAt: now });
        }
        const done = [...lines.values()].every((l) => outstanding(l) === 0);
        const status = done ? 'received' : 'partly_received';
        await transition(manager, o, { status });
        await audit(manager, shopId, actor, 'purchase_order.received', orderId, { status, lines: input.lines.length, quantity: input.lines.reduce((s, l) => s + l.quantity, 0) });
      });
      return view(db.reader, shopId, orderId);
    },
  };
}

export type OrdersService = ReturnType<typeof createOrdersService>;
