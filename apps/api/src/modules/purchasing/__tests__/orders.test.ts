import { purchaseOrderListLimit } from '@tappet/contracts';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { AuditEventEntity } from '../../audit/audit.entity';
import { HoldEntity, StockPoolEntity } from '../../stock/stock.entity';
import { PurchaseOrderEntity } from '../purchasing.entity';
import { fixtureOrderRow } from '../purchasing.test-fixture';
import { addBin, addPart, addSupplier, post, type Agent } from './helpers';

let ctx: TestContext;
let owner: Agent;
let buyer: Agent;
let mechanic: Agent;
let outsider: Agent;
let shopId: string;
let otherShopId: string;
let ownerEmail: string;

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx);
  shopId = shop.shop.id;
  ownerEmail = shop.byRole.owner.email;
  owner = await signedInAgent(ctx.app, ownerEmail, shop.password);
  // The seeded buyer's spending limit is 50,000 minor units (£500.00).
  buyer = await signedInAgent(ctx.app, shop.byRole.buyer.email, shop.password);
  mechanic = await signedInAgent(ctx.app, shop.byRole.mechanic.email, shop.password);
  const other = await seedShop(ctx, ['owner']);
  otherShopId = other.shop.id;
  outsider = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
});
afterAll(() => ctx.close());

const pool = (partId: string) => ctx.db.reader.findOne(StockPoolEntity, { where: { shopId, partId, condition: 'new' } });
const order = async (id: string) => (await owner.get(`/api/shops/${shopId}/purchasing/orders/${id}`)).body;

describe('the life of a purchase order', () => {
  it('goes draft → approval → sent with the PDF → partly received → back-order closed, moving stock and its average cost', async () => {
    const supplierId = await addSupplier(owner, shopId, { name: 'Marrick Spares', email: 'orders@marrick-spares.test' });
    const partId = await addPart(owner, shopId, 'MS-70-112');
    const binId = await addBin(owner, shopId, 'A-01');
    await post(owner, shopId, `/suppliers/${supplierId}/listings`, { partId, supplierNumber: 'MR 70112', priceMinor: 1250 }, 201);

    // 100 × £12.50 = £1,250.00: over the buyer's £500.00 limit.
    const draft = await post(buyer, shopId, '/orders', { supplierId, lines: [{ partId, quantity: 100 }] }, 201);
    expect(draft).toMatchObject({ status: 'draft', totalMinor: 125_000, totalShopMinor: 125_000, exchangeRate: '1', reference: 'PO-000001' });
    expect(draft.lines[0]).toMatchObject({ unitPriceMinor: 1250, supplierNumber: 'MR 70112', outstandingQuantity: 100 });

    const refused = await buyer.post(`/api/shops/${shopId}/purchasing/orders/${draft.id}/send`).set(csrf);
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toBe('PO-000001 totals £1,250.00, over your spending limit of £500.00. Ask the owner to approve it.');
    expect(refused.body.error.details).toMatchObject({ reason: 'over_spending_limit' });
    expect(ctx.mailer.outbox).toHaveLength(0);
    expect((await order(draft.id)).status).toBe('draft');

    ctx.mailer.outbox.length = 0;
    expect(await post(buyer, shopId, `/orders/${draft.id}/request-approval`, {})).toMatchObject({ status: 'awaiting_approval' });
    const approvalMail = ctx.mailer.outbox.find((m) => m.to === ownerEmail);
    expect(approvalMail?.subject).toBe('Approval needed: PO-000001 to Marrick Spares for £1,250.00');

    // Only the owner decides; a rejection goes back to draft with its reason.
    const buyerApproves = await buyer.post(`/api/shops/${shopId}/purchasing/orders/${draft.id}/approve`).set(csrf);
    expect(buyerApproves.status).toBe(403);
    expect(await post(owner, shopId, `/orders/${draft.id}/reject`, { reason: 'Order half now, half in spring.' })).toMatchObject({ status: 'draft', rejectionReason: 'Order half now, half in spring.' });
    await post(buyer, shopId, `/orders/${draft.id}/request-approval`, {});
    expect(await post(owner, shopId, `/orders/${draft.id}/approve`, {})).toMatchObject({ status: 'approved' });

    // The approved order may be sent by the buyer; the supplier gets the PDF.
    ctx.mailer.outbox.length = 0;
    const sent = await post(buyer, shopId, `/orders/${draft.id}/send`, {});
    expect(sent).toMatchObject({ emailed: true, order: { status: 'sent' } });
    const mail = ctx.mailer.outbox.find((m) => m.to === 'orders@marrick-spares.test');
    expect(mail?.subject).toMatch(/^Purchase order PO-000001 from /);
    expect(mail?.attachments?.[0]).toMatchObject({ filename: 'PO-000001.pdf', contentType: 'application/pdf' });
    expect(mail!.attachments![0]!.content.subarray(0, 5).toString()).toBe('%PDF-');

    // A partial receipt at the listed price, then one at a higher price paid: the moving average.
    const lineId = sent.order.lines[0].id as string;
    const first = await post(buyer, shopId, `/orders/${draft.id}/receipts`, { lines: [{ lineId, quantity: 40, binId }] });
    expect(first).toMatchObject({ status: 'partly_received', lines: [{ receivedQuantity: 40, outstandingQuantity: 60 }] });
    expect(await pool(partId)).toMatchObject({ quantity: 40, valueMinor: 50_000 });
    await post(buyer, shopId, `/orders/${draft.id}/receipts`, { lines: [{ lineId, quantity: 30, binId, unitPriceMinor: 1500 }] });
    expect(await pool(partId)).toMatchObject({ quantity: 70, valueMinor: 95_000 });
    const listing = (await owner.get(`/api/shops/${shopId}/purchasing/parts/${partId}`)).body.listings[0];
    expect(listing).toMatchObject({ lastPaidUnitMinor: 1500, lastPaidAt: expect.any(String) });

    const over = await buyer.post(`/api/shops/${shopId}/purchasing/orders/${draft.id}/receipts`).set(csrf).send({ lines: [{ lineId, quantity: 31, binId }] });
    expect(over.status).toBe(409);
    expect(over.body.error.message).toBe('Only 30 of MS-70-112 are still expected on PO-000001.');
    expect(await pool(partId)).toMatchObject({ quantity: 70 });

    const closed = await post(buyer, shopId, `/orders/${draft.id}/close`, { reason: 'Supplier has run out; no date given.' });
    expect(closed).toMatchObject({ status: 'closed', closedReason: 'Supplier has run out; no date given.', lines: [{ receivedQuantity: 70, cancelledQuantity: 30, outstandingQuantity: 0 }] });
    const late = await buyer.post(`/api/shops/${shopId}/purchasing/orders/${draft.id}/receipts`).set(csrf).send({ lines: [{ lineId, quantity: 1, binId }] });
    expect(late.status).toBe(409);

    const actions = (await ctx.db.reader.find(AuditEventEntity, { where: { shopId, entity: 'purchase_order', entityId: draft.id } })).map((e) => e.action);
    expect(actions).toEqual(
      expect.arrayContaining(['purchase_order.created', 'purchase_order.approval_requested', 'purchase_order.rejected', 'purchase_order.approved', 'purchase_order.sent', 'purchase_order.received', 'purchase_order.back_order_closed']),
    );
  });

  it('lets a buyer send an order within the limit straight away, and receive all of it', async () => {
    const supplierId = await addSupplier(owner, shopId);
    const partId = await addPart(owner, shopId, 'HP-22-01');
    const binId = await addBin(owner, shopId, 'A-02');
    const draft = await post(buyer, shopId, '/orders', { supplierId, lines: [{ partId, quantity: 4, unitPriceMinor: 999 }] }, 201);
    expect((await post(buyer, shopId, `/orders/${draft.id}/send`, {})).order.status).toBe('sent');
    const done = await post(buyer, shopId, `/orders/${draft.id}/receipts`, { lines: [{ lineId: draft.lines[0].id, quantity: 4, binId }] });
    expect(done.status).toBe('received');
    expect(done.receipts).toEqual([expect.objectContaining({ binCode: 'A-02', quantity: 4, unitCostShopMinor: 999 })]);
  });

  it('holds what arrives on a special-order line for its purpose', async () => {
    const supplierId = await addSupplier(owner, shopId);
    const partId = await addPart(owner, shopId, 'SO-77');
    const binId = await addBin(owner, shopId, 'S-01');
    const draft = await post(owner, shopId, '/orders', { supplierId, lines: [{ partId, quantity: 2, unitPriceMinor: 800, purpose: 'Corran Tern 350, frame CT 2231' }] }, 201);
    await post(owner, shopId, `/orders/${draft.id}/send`, {});
    await post(owner, shopId, `/orders/${draft.id}/receipts`, { lines: [{ lineId: draft.lines[0].id, quantity: 2, binId }] });
    const holds = await ctx.db.reader.find(HoldEntity, { where: { shopId, partId } });
    expect(holds).toEqual([expect.objectContaining({ quantity: 2, status: 'active', purpose: `Corran Tern 350, frame CT 2231 (${draft.reference})` })]);
  });

  it('refuses a mechanic, and sending to a supplier without an e-mail address', async () => {
    const supplierId = await addSupplier(owner, shopId, { email: null });
    const partId = await addPart(owner, shopId, 'TR-5');
    const res = await mechanic.post(`/api/shops/${shopId}/purchasing/orders`).set(csrf).send({ supplierId, lines: [{ partId, quantity: 1, unitPriceMinor: 100 }] });
    expect(res.status).toBe(403);
    const draft = await post(owner, shopId, '/orders', { supplierId, lines: [{ partId, quantity: 1, unitPriceMinor: 100 }] }, 201);
    const send = await owner.post(`/api/shops/${shopId}/purchasing/orders/${draft.id}/send`).set(csrf);
    expect(send.status).toBe(409);
    expect(send.body.error.details.reason).toBe('no_supplier_email');
  });

  it('converts a foreign-currency order at the rate entered, rounding half to even once', async () => {
    const supplierId = await addSupplier(owner, shopId, { currency: 'EUR', email: 'bestellung@tarnwell.test' });
    const partId = await addPart(owner, shopId, 'TW-900');
    const binId = await addBin(owner, shopId, 'B-01');
    const noRate = await owner.post(`/api/shops/${shopId}/purchasing/orders`).set(csrf).send({ supplierId, lines: [{ partId, quantity: 3, unitPriceMinor: 1999 }] });
    expect(noRate.status).toBe(400);
    expect(noRate.body.error.message).toContain('enter the exchange rate (GBP per 1 EUR)');
    // 3 × €19.99 = €59.97; × 0.8571 = £51.400287 → 5140 pence.
    const draft = await post(owner, shopId, '/orders', { supplierId, exchangeRate: '0.8571', lines: [{ partId, quantity: 3, unitPriceMinor: 1999 }] }, 201);
    expect(draft).toMatchObject({ currency: 'EUR', shopCurrency: 'GBP', totalMinor: 5997, totalShopMinor: 5140 });
    // A new rate changes the shop total: 5997 × 0.85 = 5097.45 → 5097.
    expect(await owner.patch(`/api/shops/${shopId}/purchasing/orders/${draft.id}`).set(csrf).send({ exchangeRate: '0.85' }).then((r) => r.body.totalShopMinor)).toBe(5097);
    await post(owner, shopId, `/orders/${draft.id}/send`, {});
    // Each unit lands at €19.99 × 0.85 = £16.9915 → 1699 pence.
    const received = await post(owner, shopId, `/orders/${draft.id}/receipts`, { lines: [{ lineId: draft.lines[0].id, quantity: 3, binId }] });
    expect(received.receipts[0]).toMatchObject({ unitPriceMinor: 1999, unitCostShopMinor: 1699 });
    expect(await pool(partId)).toMatchObject({ quantity: 3, valueMinor: 5097 });
  });

  it('cancels an order nothing was received against, and not one that is closed', async () => {
    const supplierId = await addSupplier(owner, shopId);
    const partId = await addPart(owner, shopId, 'CX-1');
    const draft = await post(buyer, shopId, '/orders', { supplierId, lines: [{ partId, quantity: 1, unitPriceMinor: 100 }] }, 201);
    expect(await post(buyer, shopId, `/orders/${draft.id}/cancel`, { reason: 'Found one on the shelf.' })).toMatchObject({ status: 'cancelled' });
    const again = await buyer.post(`/api/shops/${shopId}/purchasing/orders/${draft.id}/cancel`).set(csrf).send({ reason: 'Twice.' });
    expect(again.status).toBe(409);
  });

  it('changes the lines of an approved order (back to draft, totals again), and not of a sent one', async () => {
    const supplierId = await addSupplier(owner, shopId);
    const a = await addPart(owner, shopId, 'ED-1');
    const b = await addPart(owner, shopId, 'ED-2');
    const draft = await post(buyer, shopId, '/orders', { supplierId, lines: [{ partId: a, quantity: 100, unitPriceMinor: 1000 }] }, 201);
    await post(buyer, shopId, `/orders/${draft.id}/request-approval`, {});
    await post(owner, shopId, `/orders/${draft.id}/approve`, {});
    const res = await buyer.patch(`/api/shops/${shopId}/purchasing/orders/${draft.id}`).set(csrf).send({ lines: [{ partId: b, quantity: 3, unitPriceMinor: 1250, coreDepositMinor: 500 }], note: 'Only the gaskets.' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // 3 × (12.50 + 5.00) = 52.50; the approval was for another order, so it is a draft again.
    expect(res.body).toMatchObject({ status: 'draft', totalMinor: 5250, totalShopMinor: 5250, note: 'Only the gaskets.', approvedAt: null });
    expect(res.body.lines.map((l: { partNumber: string; quantity: number }) => [l.partNumber, l.quantity])).toEqual([['ED-2', 3]]);
    await post(buyer, shopId, `/orders/${draft.id}/send`, {});
    const late = await buyer.patch(`/api/shops/${shopId}/purchasing/orders/${draft.id}`).set(csrf).send({ lines: [{ partId: a, quantity: 1, unitPriceMinor: 1 }] });
    expect(late.status).toBe(409);
    expect(late.body.error.details.reason).toBe('wrong_status');
  });
});

describe('another shop', () => {
  it('cannot see, use or link to this shop’s suppliers, parts and orders', async () => {
    const supplierId = await addSupplier(owner, shopId);
    const partId = await addPart(owner, shopId, 'ISO-1');
    const draft = await post(owner, shopId, '/orders', { supplierId, lines: [{ partId, quantity: 1, unitPriceMinor: 100 }] }, 201);
    expect((await outsider.get(`/api/shops/${shopId}/purchasing/orders/${draft.id}`)).status).toBe(404);
    expect((await outsider.get(`/api/shops/${otherShopId}/purchasing/orders/${draft.id}`)).status).toBe(404);
    expect((await outsider.get(`/api/shops/${otherShopId}/purchasing/suppliers/${supplierId}`)).status).toBe(404);
    expect((await outsider.get(`/api/shops/${otherShopId}/purchasing/suppliers`)).body.suppliers).toEqual([]);
    // Ids inside bodies are looked up in the caller's shop.
    const foreignSupplier = await outsider.post(`/api/shops/${otherShopId}/purchasing/orders`).set(csrf).send({ supplierId, lines: [{ partId, quantity: 1, unitPriceMinor: 1 }] });
    expect(foreignSupplier.status).toBe(404);
    const ownSupplier = await addSupplier(outsider, otherShopId);
    const foreignPart = await outsider.post(`/api/shops/${otherShopId}/purchasing/suppliers/${ownSupplier}/listings`).set(csrf).send({ partId, priceMinor: 1 });
    expect(foreignPart.status).toBe(404);
    const foreignLine = await outsider.post(`/api/shops/${otherShopId}/purchasing/orders`).set(csrf).send({ supplierId: ownSupplier, lines: [{ partId, quantity: 1, unitPriceMinor: 1 }] });
    expect(foreignLine.status).toBe(404);
    expect((await outsider.get(`/api/shops/${otherShopId}/purchasing/orders`)).body.orders).toEqual([]);
  });
});

describe('the orders list', () => {
  it('holds the newest orders up to its limit, says when more match, and narrows by supplier and state', async () => {
    const shop = await seedShop(ctx, ['owner']);
    const id = shop.shop.id;
    const who = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    const busy = await addSupplier(who, id, { name: 'Marrick Spares' });
    const quiet = await addSupplier(who, id, { name: 'Tolland Fittings' });
    // Years of orders, written in one go: 501 sent to one supplier, then two drafts to another.
    const at = new Date('2026-03-01T09:00:00Z');
    const row = (number: number, supplierId: string, status: 'sent' | 'draft') => fixtureOrderRow({ shopId: id, number, supplierId, status, totalMinor: 1000, at });
    const rows = [...Array.from({ length: purchaseOrderListLimit + 1 }, (_, i) => row(i + 1, busy, 'sent')), row(purchaseOrderListLimit + 2, quiet, 'draft'), row(purchaseOrderListLimit + 3, quiet, 'draft')];
    await ctx.db.write((m) => m.insert(PurchaseOrderEntity, rows));

    const all = await who.get(`/api/shops/${id}/purchasing/orders`);
    expect(all.status).toBe(200);
    expect(all.body.truncated).toBe(true);
    expect(all.body.orders).toHaveLength(purchaseOrderListLimit);
    expect(all.body.orders.slice(0, 3).map((o: { number: number }) => o.number)).toEqual([503, 502, 501]);
    expect(all.body.orders[0]).toMatchObject({ supplierName: 'Tolland Fittings', status: 'draft', lineCount: 0 });

    const narrowed = await who.get(`/api/shops/${id}/purchasing/orders?supplierId=${quiet}`);
    expect(narrowed.body).toMatchObject({ truncated: false });
    expect(narrowed.body.orders.map((o: { number: number }) => o.number)).toEqual([503, 502]);
    const drafts = await who.get(`/api/shops/${id}/purchasing/orders?status=draft&supplierId=${busy}`);
    expect(drafts.body).toEqual({ orders: [], truncated: false });
    // The 501 sent orders are one more than an answer holds: the oldest is the one left out.
    const sent = await who.get(`/api/shops/${id}/purchasing/orders?status=sent`);
    expect(sent.body.truncated).toBe(true);
    expect(sent.body.orders.at(-1).number).toBe(2);
  });
});
