import { randomBytes, randomUUID } from 'node:crypto';
import type Stripe from 'stripe';
import type { EntityManager } from 'typeorm';
import type { z } from 'zod';
import {
  canMoveVehicle,
  type counterSaleSchema,
  type createInvoiceSchema,
  type creditNoteSchema,
  type Invoice,
  type InvoiceLine,
  type invoiceLineInputSchema,
  type InvoiceListResponse,
  type invoiceFromVehicleSchema,
  type invoiceListQuerySchema,
  type InvoiceSummary,
  type PartSellPrice,
  type Payment,
  type recordPaymentSchema,
  type SalesSettings,
  type SellPricesResponse,
  type StockCondition,
  type UpdateSalesSettings,
  type updateInvoiceSchema,
} from '@tappet/contracts';
import { documentTotals, type TaxRounding } from '@tappet/domain';
import { shopScoped } from '../../db/tenant-repository';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { HttpError, badRequest, notFound } from '../../lib/http-error';
import type { Mailer } from '../../lib/mailer';
import { recordAudit, type AuditActor } from '../audit/audit.service';
import { vehicleHandOverBlockers } from '../jobs/jobs.service';
import { issueStock } from '../stock/stock.service';
import { isoOf } from '../stock/stock.queries';
import { VehicleEntity, VehicleStatusChangeEntity } from '../vehicles/vehicles.entity';
import { salesPaymentPurpose } from './card-payments';
import { renderInvoicePdf } from './invoice-pdf';
import { pricingFactsFor, sellPricesFor } from './pricing.service';
import { CardSessionEntity, InvoiceEntity, InvoiceLineEntity, PaymentEntity, type InvoiceLineRow, type InvoiceRow } from './sales.entity';
import { saveSalesSettings, salesSettingsOf, shopBasics, sqlTime, taxRoundingFor } from './sales.settings';

// Invoices, credit notes and payments (issue 12). Totals come from libs/domain documentTotals
// under the shop's tax rounding (docs/decisions/015-sales-prices-and-tax-rounding.md). A draft can be edited;
// issuing takes the next number of the shop's series from invoice_counters in the same
// transaction (all writes are serialised by the write lock, and a rolled-back issue gives its
// number back), so numbers have no gaps. An issued document is never edited: a credit note (its
// own series, CN-) corrects it, in full or by lines. Mail and Stripe calls happen after commit.

type LineInput = z.output<typeof invoiceLineInputSchema>;
type CreateInput = z.output<typeof createInvoiceSchema>;
type UpdateInput = z.output<typeof updateInvoiceSchema>;
type CounterInput = z.output<typeof counterSaleSchema>;
type VehicleSaleInput = z.output<typeof invoiceFromVehicleSchema>;
type CreditInput = z.output<typeof creditNoteSchema>;
type PaymentInput = z.output<typeof recordPaymentSchema>;
export type InvoiceListFilters = z.output<typeof invoiceListQuerySchema>;


const conflict = (reason: string, message: string, details: Record<string, unknown> = {}) => new HttpError(409, 'conflict', message, { reason, ...details });
const noSuchInvoice = () => notFound('No such invoice in this shop.');

export const formatInvoiceNumber = (kind: InvoiceRow['kind'], n: number | null) => (n === null ? null : `${kind === 'credit_note' ? 'CN' : 'INV'}-${String(n).padStart(5, '0')}`);

/** Hours as exact decimal text with up to 4 places (labour minutes / 60, rounded half up at the 4th place). */
export function hoursOf(minutes: number): string {
  const tenThousandths = Math.round((minutes * 10000) / 60);
  const whole = Math.floor(tenThousandths / 10000);
  const fraction = String(tenThousandths % 10000).padStart(4, '0').replace(/0+$/, '');
  return fraction ? `${whole}.${fraction}` : String(whole);
}

interface DraftLine {
  kind: InvoiceLineRow['kind'];
  partId: string | null;
  description: string;
  quantity: string;
  unitPriceMinor: number;
  listedUnitPriceMinor: number | null;
  unitCostMinor: number | null;
  discountPercent: number;
  taxRatePercent: number;
  creditedLineId: string | null;
}

/** Net, tax and gross of each line and of the document (libs/domain, decision 015). */
function totalsOf(lines: readonly DraftLine[], rounding: TaxRounding) {
  return documentTotals(
    lines.map((l) => ({ quantity: l.quantity, unitPriceMinor: l.unitPriceMinor, discountPercent: l.discountPercent, taxRatePercent: l.taxRatePercent })),
    rounding,
  );
}

async function replaceLines(manager: EntityManager, invoice: InvoiceRow, lines: readonly DraftLine[], at: Date): Promise<void> {
  const totals = totalsOf(lines, invoice.taxRounding);
  await manager.query(`DELETE FROM invoice_lines WHERE shop_id = ? AND invoice_id = ?`, [invoice.shopId, invoice.id]);
  if (lines.length > 0) {
    await shopScoped(manager, InvoiceLineEntity, invoice.shopId).insert(
      lines.map((l, i) => ({ id: randomUUID(), invoiceId: invoice.id, position: i + 1, ...l, netMinor: totals.lines[i]!.netMinor, taxMinor: totals.lines[i]!.taxMinor, grossMinor: totals.lines[i]!.grossMinor })),
    );
  }
  await shopScoped(manager, InvoiceEntity, invoice.shopId).update(
    { id: invoice.id },
    { netMinor: totals.netMinor, taxMinor: totals.taxMinor, grossMinor: totals.grossMinor, taxByRate: JSON.stringify(totals.taxByRate), updatedAt: at },
  );
}

async function invoiceRow(manager: EntityManager, shopId: string, invoiceId: string): Promise<InvoiceRow> {
  const row = await shopScoped(manager, InvoiceEntity, shopId).findOne({ id: invoiceId });
  if (!row) throw noSuchInvoice();
  return row;
}

async function customerOf(manager: EntityManager, shopId: string, customerId: string): Promise<{ name: string; email: string | null; address: string | null }> {
  const [row] = await manager.query<Array<{ name: string; email: string | null; address: string | null }>>(`SELECT name, email, address FROM customers WHERE shop_id = ? AND id = ?`, [shopId, customerId]);
  if (!row) throw notFound('No such customer in this shop.');
  return row;
}

/** Paid (payments) and credited (issued credit notes) so far, per invoice. */
async function settledOf(manager: EntityManager, shopId: string, invoiceIds: readonly string[]): Promise<Map<string, { paid: number; credited: number }>> {
  const out = new Map<string, { paid: number; credited: number }>(invoiceIds.map((id) => [id, { paid: 0, credited: 0 }]));
  if (invoiceIds.length === 0) return out;
  const marks = invoiceIds.map(() => '?').join(', ');
  for (const r of await manager.query<Array<{ id: string; paid: number }>>(`SELECT invoice_id AS id, SUM(amount_minor) AS paid FROM invoice_payments WHERE shop_id = ? AND invoice_id IN (${marks}) GROUP BY invoice_id`, [shopId, ...invoiceIds])) {
    out.get(r.id)!.paid = Number(r.paid);
  }
  for (const r of await manager.query<Array<{ id: string; credited: number }>>(
    `SELECT credited_invoice_id AS id, SUM(gross_minor) AS credited FROM invoices WHERE shop_id = ? AND kind = 'credit_note' AND status = 'issued' AND credited_invoice_id IN (${marks}) GROUP BY credited_invoice_id`,
    [shopId, ...invoiceIds],
  )) {
    out.get(r.id)!.credited = Number(r.credited);
  }
  return out;
}

function paymentState(row: Pick<InvoiceRow, 'kind' | 'grossMinor'>, paid: number, credited: number): { paymentStatus: InvoiceSummary['paymentStatus']; dueMinor: number; overpaidMinor: number } {
  if (row.kind === 'credit_note') return { paymentStatus: 'paid', dueMinor: 0, overpaidMinor: 0 };
  const due = row.grossMinor - credited - paid;
  // Cash and transfers are refused above what is due, but card checkouts opened before another
  // payment landed can still complete: the surplus is shown, never hidden in a zero.
  if (due <= 0) return { paymentStatus: 'paid', dueMinor: 0, overpaidMinor: -due };
  return { paymentStatus: paid > 0 ? 'part_paid' : 'unpaid', dueMinor: due, overpaidMinor: 0 };
}

function summaryOf(row: InvoiceRow, settled: { paid: number; credited: number }): InvoiceSummary {
  const state = paymentState(row, settled.paid, settled.credited);
  return {
    id: row.id,
    kind: row.kind,
    status: row.status,
    paymentStatus: state.paymentStatus,
    number: formatInvoiceNumber(row.kind, row.number),
    source: row.source,
    customerId: row.customerId,
    customerName: row.customerName,
    currency: row.currency,
    netMinor: row.netMinor,
    taxMinor: row.taxMinor,
    grossMinor: row.grossMinor,
    paidMinor: settled.paid,
    dueMinor: state.dueMinor,
    overpaidMinor: state.overpaidMinor,
    issuedAt: row.issuedAt ? isoOf(row.issuedAt) : null,
    createdAt: isoOf(row.createdAt),
  };
}

/** Why a job, vehicle or counter sale line became what it is; kept for the audit trail. */
function lineAudit(lines: readonly DraftLine[]): string[] {
  return lines.map((l) => `${l.quantity} × ${l.description} @ ${l.unitPriceMinor}${l.listedUnitPriceMinor !== null && l.listedUnitPriceMinor !== l.unitPriceMinor ? ` (listed ${l.listedUnitPriceMinor})` : ''}`);
}

/** Lines typed in (or changed) on a draft: part lines take their sell price unless one is given. */
async function resolveLines(manager: EntityManager, shopId: string, inputs: readonly LineInput[], standardRate: number): Promise<DraftLine[]> {
  const partIds = inputs.flatMap((l) => (l.partId ? [l.partId] : []));
  const prices = await sellPricesFor(manager, shopId, partIds);
  const facts = await pricingFactsFor(manager, shopId, partIds);
  return inputs.map((l, i) => {
    if (l.kind === 'part' && !l.partId) throw badRequest(`Line ${i + 1}: choose the part.`);
    if (l.partId && !prices.has(l.partId)) throw notFound('No such part in this shop.');
    const listed = l.partId ? (prices.get(l.partId)!.unitMinor ?? null) : null;
    const unit = l.unitPriceMinor ?? listed;
    if (unit === null || unit === undefined) throw conflict('no_sell_price', `Line ${i + 1}: the part has no list price and no cost to price it from. Enter a price.`, { line: i + 1 });
    return {
      kind: l.kind,
      partId: l.partId,
      description: l.description,
      quantity: l.quantity,
      unitPriceMinor: unit,
      listedUnitPriceMinor: listed,
      unitCostMinor: l.partId ? (facts.get(l.partId)?.unitCostMinor ?? null) : null,
      discountPercent: l.discountPercent,
      taxRatePercent: l.taxRatePercent ?? standardRate,
      creditedLineId: null,
    };
  });
}

async function newDraft(manager: EntityManager, shopId: string, fields: Partial<InvoiceRow> & Pick<InvoiceRow, 'source' | 'customerName'>, actor: AuditActor, at: Date): Promise<InvoiceRow> {
  const basics = await shopBasics(manager, shopId);
  const row: InvoiceRow = {
    id: randomUUID(),
    shopId,
    kind: 'invoice',
    status: 'draft',
    number: null,
    customerId: null,
    customerEmail: null,
    customerAddress: null,
    notes: null,
    jobId: null,
    vehicleId: null,
    creditedInvoiceId: null,
    creditReason: null,
    currency: basics.currency,
    taxRounding: await taxRoundingFor(manager, shopId),
    netMinor: 0,
    taxMinor: 0,
    grossMinor: 0,
    taxByRate: '[]',
    payToken: null,
    createdByUserId: actor.userId,
    createdAt: at,
    updatedAt: at,
    issuedAt: null,
    emailedAt: null,
    ...fields,
  };
  await shopScoped(manager, InvoiceEntity, shopId).insert(row);
  return row;
}

async function customerFields(manager: EntityManager, shopId: string, input: { customerId?: string | null; customerName?: string; customerEmail?: string | null; customerAddress?: string | null }) {
  const known = input.customerId ? await customerOf(manager, shopId, input.customerId) : null;
  const name = input.customerName ?? known?.name;
  if (!name) throw badRequest('Choose a customer or give the customer’s name.');
  return {
    customerId: input.customerId ?? null,
    customerName: name,
    customerEmail: input.customerEmail !== undefined ? input.customerEmail : (known?.email ?? null),
    customerAddress: input.customerAddress !== undefined ? input.customerAddress : (known?.address ?? null),
  };
}

/** Takes the next number of the shop's series (in the caller's transaction). */
async function nextNumber(manager: EntityManager, shopId: string, series: InvoiceRow['kind']): Promise<number> {
  await manager.query(
    `INSERT INTO invoice_counters (shop_id, series, last_number) VALUES (?, ?, 1)
     ON CONFLICT (shop_id, series) DO UPDATE SET last_number = invoice_counters.last_number + 1`,
    [shopId, series],
  );
  const [row] = await manager.query<Array<{ n: number }>>(`SELECT last_number AS n FROM invoice_counters WHERE shop_id = ? AND series = ?`, [shopId, series]);
  return Number(row!.n);
}

/** Issues a draft in the caller's transaction: checks, number, vehicle sold (vehicle sales), audit. */
export async function issueInTx(manager: EntityManager, shopId: string, invoiceId: string, actor: AuditActor, at: Date): Promise<InvoiceRow> {
  const row = await invoiceRow(manager, shopId, invoiceId);
  if (row.status !== 'draft') throw conflict('already_issued', `${formatInvoiceNumber(row.kind, row.number)} is already issued; correct it with a credit note.`);
  const lines = await shopScoped(manager, InvoiceLineEntity, shopId).find({ invoiceId });
  if (lines.length === 0) throw conflict('no_lines', 'Add at least one line before issuing.');
  if (row.vehicleId && row.source === 'vehicle') await markVehicleSold(manager, shopId, row.vehicleId, actor, at);
  const number = await nextNumber(manager, shopId, row.kind);
  const payToken = row.kind === 'invoice' ? randomBytes(24).toString('base64url') : null;
  await shopScoped(manager, InvoiceEntity, shopId).update({ id: invoiceId }, { status: 'issued', number, issuedAt: at, updatedAt: at, payToken });
  await recordAudit(manager, {
    shopId,
    actor,
    action: row.kind === 'credit_note' ? 'sales.credit_note_issued' : 'sales.invoice_issued',
    entity: 'invoice',
    entityId: invoiceId,
    changes: { status: { before: 'draft', after: 'issued' }, number: { before: null, after: formatInvoiceNumber(row.kind, number) }, grossMinor: { before: null, after: row.grossMinor } },
    at,
  });
  return { ...row, status: 'issued', number, issuedAt: at, payToken };
}

async function markVehicleSold(manager: EntityManager, shopId: string, vehicleId: string, actor: AuditActor, at: Date): Promise<void> {
  const vehicle = await shopScoped(manager, VehicleEntity, shopId).findOne({ id: vehicleId });
  if (!vehicle) throw notFound('No such vehicle in this shop.');
  if (vehicle.kind !== 'shop_stock') throw conflict('not_shop_stock', 'Only a shop-stock vehicle is sold on an invoice here.');
  if (!canMoveVehicle(vehicle.kind, vehicle.status, 'sold')) throw conflict('vehicle_not_ready', `The vehicle is “${vehicle.status.replace('_', ' ')}”: move it to ready before selling it.`);
  const blockers = await vehicleHandOverBlockers(manager, shopId, vehicleId);
  if (blockers.length > 0) {
    throw conflict('safety_blockers', `This vehicle cannot be sold yet: ${blockers.slice(0, 3).map((b) => `${b.label} (job ${b.jobNumber})`).join('; ')}. Put the work right on the job, or have the owner sign it off there.`, { blockers });
  }
  await shopScoped(manager, VehicleStatusChangeEntity, shopId).insert({ id: randomUUID(), vehicleId, fromStatus: vehicle.status, toStatus: 'sold', changedAt: at, recordedAt: at, byUserId: actor.userId, note: 'Sold on invoice' });
  await shopScoped(manager, VehicleEntity, shopId).update({ id: vehicleId }, { status: 'sold', statusSince: at, updatedAt: at });
  await recordAudit(manager, { shopId, actor, action: 'vehicle.status_changed', entity: 'vehicle', entityId: vehicleId, changes: { status: { before: vehicle.status, after: 'sold' } }, at });
}

async function view(reader: EntityManager, shopId: string, invoiceId: string, showMargin: boolean): Promise<Invoice> {
  const row = await invoiceRow(reader, shopId, invoiceId);
  const settled = (await settledOf(reader, shopId, [row.id])).get(row.id)!;
  const lines = await reader.query<Array<InvoiceLineRow & { partNumber: string | null }>>(
    `SELECT l.id, l.position, l.kind, l.part_id AS partId, p.number AS partNumber, l.description, l.quantity, l.unit_price_minor AS unitPriceMinor,
       l.listed_unit_price_minor AS listedUnitPriceMinor, l.unit_cost_minor AS unitCostMinor, l.discount_percent AS discountPercent,
       l.tax_rate_percent AS taxRatePercent, l.net_minor AS netMinor, l.tax_minor AS taxMinor, l.gross_minor AS grossMinor, l.credited_line_id AS creditedLineId
     FROM invoice_lines l LEFT JOIN parts p ON p.shop_id = l.shop_id AND p.id = l.part_id
     WHERE l.shop_id = ? AND l.invoice_id = ? ORDER BY l.position`,
    [shopId, invoiceId],
  );
  const payments = await reader.query<Array<Omit<Payment, 'createdAt'> & { createdAt: string }>>(
    `SELECT pay.id, pay.method, pay.amount_minor AS amountMinor, pay.received_on AS receivedOn, pay.reference, u.name AS recordedBy, pay.created_at AS createdAt
     FROM invoice_payments pay LEFT JOIN users u ON u.id = pay.recorded_by_user_id WHERE pay.shop_id = ? AND pay.invoice_id = ? ORDER BY pay.received_on, pay.created_at, pay.id`,
    [shopId, invoiceId],
  );
  const creditNotes = await reader.query<Array<{ id: string; number: number | null; grossMinor: number }>>(
    `SELECT id, number, gross_minor AS grossMinor FROM invoices WHERE shop_id = ? AND credited_invoice_id = ? ORDER BY created_at`,
    [shopId, invoiceId],
  );
  const [job] = row.jobId ? await reader.query<Array<{ number: number }>>(`SELECT number FROM jobs WHERE shop_id = ? AND id = ?`, [shopId, row.jobId]) : [];
  const [credited] = row.creditedInvoiceId ? await reader.query<Array<{ number: number | null }>>(`SELECT number FROM invoices WHERE shop_id = ? AND id = ?`, [shopId, row.creditedInvoiceId]) : [];
  const outLines: InvoiceLine[] = lines.map((l) => ({
    id: l.id,
    position: Number(l.position),
    kind: l.kind,
    partId: l.partId,
    partNumber: l.partNumber,
    description: l.description,
    quantity: l.quantity,
    unitPriceMinor: Number(l.unitPriceMinor),
    listedUnitPriceMinor: l.listedUnitPriceMinor === null ? null : Number(l.listedUnitPriceMinor),
    priceOverridden: l.listedUnitPriceMinor !== null && Number(l.listedUnitPriceMinor) !== Number(l.unitPriceMinor),
    discountPercent: Number(l.discountPercent),
    taxRatePercent: Number(l.taxRatePercent),
    netMinor: Number(l.netMinor),
    taxMinor: Number(l.taxMinor),
    grossMinor: Number(l.grossMinor),
    creditedLineId: l.creditedLineId,
    ...(showMargin ? { unitCostMinor: l.unitCostMinor === null ? null : Number(l.unitCostMinor) } : {}),
  }));
  // Margin: the net less the recorded cost of each line (labour and other lines have none and count at their net);
  // unknown when a part line has no cost.
  const marginMinor = outLines.every((l) => l.kind !== 'part' || l.unitCostMinor !== null)
    ? outLines.reduce((sum, l) => sum + l.netMinor - Math.round(Number(l.quantity) * (l.unitCostMinor ?? 0)), 0)
    : null;
  return {
    ...summaryOf(row, settled),
    customerEmail: row.customerEmail,
    customerAddress: row.customerAddress,
    notes: row.notes,
    jobId: row.jobId,
    jobNumber: job ? Number(job.number) : null,
    vehicleId: row.vehicleId,
    creditedInvoiceId: row.creditedInvoiceId,
    creditedInvoiceNumber: credited ? formatInvoiceNumber('invoice', credited.number === null ? null : Number(credited.number)) : null,
    creditReason: row.creditReason,
    creditNotes: creditNotes.map((c) => ({ id: c.id, number: formatInvoiceNumber('credit_note', c.number === null ? null : Number(c.number)), grossMinor: Number(c.grossMinor) })),
    taxRounding: row.taxRounding,
    lines: outLines,
    taxByRate: JSON.parse(row.taxByRate) as Invoice['taxByRate'],
    payments: payments.map((p) => ({ ...p, amountMinor: Number(p.amountMinor), createdAt: isoOf(p.createdAt) })),
    creditedMinor: settled.credited,
    ...(showMargin ? { marginMinor } : {}),
    emailedAt: row.emailedAt ? isoOf(row.emailedAt) : null,
  };
}

/** A draft with lines typed in (in the caller's write). */
export async function createInvoiceInTx(manager: EntityManager, shopId: string, input: CreateInput, actor: AuditActor, at: Date): Promise<string> {
  const customer = await customerFields(manager, shopId, { ...input, customerName: input.customerName ?? (input.customerId ? undefined : 'Customer') });
  const basics = await shopBasics(manager, shopId);
  const lines = await resolveLines(manager, shopId, input.lines, basics.standardTaxRatePercent);
  const row = await newDraft(manager, shopId, { source: 'manual', ...customer, notes: input.notes }, actor, at);
  await replaceLines(manager, row, lines, at);
  await recordAudit(manager, { shopId, actor, action: 'sales.invoice_created', entity: 'invoice', entityId: row.id, changes: { source: { before: null, after: 'manual' }, customer: { before: null, after: customer.customerName }, lines: { before: null, after: lineAudit(lines) } }, at });
  return row.id;
}

/** A counter sale in the caller's write: stock issued, the invoice made and (by default) issued. */
export async function counterSaleInTx(manager: EntityManager, shopId: string, input: CounterInput, actor: AuditActor, at: Date): Promise<{ id: string; email: boolean }> {
  const customer = await customerFields(manager, shopId, input);
  const basics = await shopBasics(manager, shopId);
  const prices = await sellPricesFor(manager, shopId, input.lines.map((l) => l.partId));
  const row = await newDraft(manager, shopId, { source: 'counter', ...customer }, actor, at);
  const lines: DraftLine[] = [];
  for (const [i, l] of input.lines.entries()) {
    const price = prices.get(l.partId);
    if (!price) throw notFound('No such part in this shop.');
    const unit = l.unitPriceMinor ?? price.unitMinor;
    if (unit === null) throw conflict('no_sell_price', `Line ${i + 1}: the part has no list price and no cost to price it from. Enter a price.`, { line: i + 1 });
    const movements = await issueStock(manager, shopId, { partId: l.partId, binId: l.binId, condition: l.condition as StockCondition, quantity: l.quantity, reference: `Counter sale ${row.id.slice(0, 8)}`, note: customer.customerName }, { actor, at });
    const cost = -movements.reduce((s, m) => s + m.valueChangeMinor, 0);
    const [part] = await manager.query<Array<{ number: string; description: string }>>(`SELECT number, description FROM parts WHERE shop_id = ? AND id = ?`, [shopId, l.partId]);
    lines.push({
      kind: 'part',
      partId: l.partId,
      description: `${part!.number} ${part!.description}`.slice(0, 200),
      quantity: String(l.quantity),
      unitPriceMinor: unit,
      listedUnitPriceMinor: price.unitMinor,
      unitCostMinor: Math.round(cost / l.quantity),
      discountPercent: l.discountPercent,
      taxRatePercent: basics.standardTaxRatePercent,
      creditedLineId: null,
    });
  }
  await replaceLines(manager, row, lines, at);
  await recordAudit(manager, { shopId, actor, action: 'sales.counter_sale', entity: 'invoice', entityId: row.id, changes: { customer: { before: null, after: customer.customerName }, lines: { before: null, after: lineAudit(lines) } }, at });
  if (input.issue) await issueInTx(manager, shopId, row.id, actor, at);
  return { id: row.id, email: input.issue && Boolean(customer.customerEmail) };
}

/** A credit note in the caller's write, issued at once. */
export async function creditNoteInTx(manager: EntityManager, shopId: string, invoiceId: string, input: CreditInput, actor: AuditActor, at: Date): Promise<{ id: string; email: boolean }> {
  const original = await invoiceRow(manager, shopId, invoiceId);
  if (original.kind !== 'invoice') throw conflict('not_an_invoice', 'A credit note cannot itself be credited.');
  if (original.status !== 'issued') throw conflict('not_issued', 'Only an issued invoice is credited; change or delete the draft instead.');
  const lines = await shopScoped(manager, InvoiceLineEntity, shopId).find({ invoiceId }, { position: 'ASC' });
  const already = new Map<string, number>();
  for (const r of await manager.query<Array<{ lineId: string; quantity: string }>>(
    `SELECT l.credited_line_id AS lineId, l.quantity FROM invoice_lines l JOIN invoices c ON c.shop_id = l.shop_id AND c.id = l.invoice_id
     WHERE l.shop_id = ? AND c.credited_invoice_id = ? AND l.credited_line_id IS NOT NULL`,
    [shopId, invoiceId],
  )) {
    already.set(r.lineId, (already.get(r.lineId) ?? 0) + Math.round(Number(r.quantity) * 10000));
  }
  const wanted = input.lines ?? lines.map((l) => ({ lineId: l.id, quantity: String((Math.round(Number(l.quantity) * 10000) - (already.get(l.id) ?? 0)) / 10000) }));
  const draft: DraftLine[] = [];
  for (const w of wanted) {
    const line = lines.find((l) => l.id === w.lineId);
    if (!line) throw notFound('No such line on this invoice.');
    const left = Math.round(Number(line.quantity) * 10000) - (already.get(line.id) ?? 0);
    const asked = Math.round(Number(w.quantity) * 10000);
    if (asked <= 0) continue;
    if (asked > left) throw conflict('credit_exceeds_line', `Only ${left / 10000} of “${line.description}” is left to credit.`, { lineId: line.id, leftQuantity: String(left / 10000) });
    draft.push({
      kind: line.kind,
      partId: line.partId,
      description: line.description,
      quantity: String(asked / 10000),
      unitPriceMinor: line.unitPriceMinor,
      listedUnitPriceMinor: line.unitPriceMinor,
      unitCostMinor: line.unitCostMinor,
      discountPercent: Number(line.discountPercent),
      taxRatePercent: Number(line.taxRatePercent),
      creditedLineId: line.id,
    });
  }
  if (draft.length === 0) throw conflict('nothing_to_credit', 'Everything on this invoice has been credited already.');
  const note = await newDraft(
    manager,
    shopId,
    {
      kind: 'credit_note',
      source: 'credit',
      creditedInvoiceId: original.id,
      creditReason: input.reason,
      customerId: original.customerId,
      customerName: original.customerName,
      customerEmail: original.customerEmail,
      customerAddress: original.customerAddress,
      jobId: original.jobId,
      vehicleId: original.vehicleId,
      currency: original.currency,
      taxRounding: original.taxRounding,
    },
    actor,
    at,
  );
  await replaceLines(manager, note, draft, at);
  await recordAudit(manager, { shopId, actor, action: 'sales.credit_note_created', entity: 'invoice', entityId: note.id, changes: { credits: { before: null, after: formatInvoiceNumber('invoice', original.number) }, reason: { before: null, after: input.reason }, lines: { before: null, after: lineAudit(draft) } }, at });
  await issueInTx(manager, shopId, note.id, actor, at);
  return { id: note.id, email: Boolean(original.customerEmail) };
}

/** A cash or bank-transfer payment in the caller's write; never more than is due. */
export async function recordPaymentInTx(manager: EntityManager, shopId: string, invoiceId: string, input: PaymentInput, actor: AuditActor, at: Date): Promise<void> {
  const row = await invoiceRow(manager, shopId, invoiceId);
  if (row.kind !== 'invoice') throw conflict('not_an_invoice', 'A credit note is not paid.');
  const settled = (await settledOf(manager, shopId, [invoiceId])).get(invoiceId)!;
  const due = paymentState(row, settled.paid, settled.credited).dueMinor;
  if (input.amountMinor > due) throw conflict('more_than_due', due > 0 ? `That is more than is due (${due}).` : 'Nothing is due on this invoice.', { dueMinor: due });
  const id = randomUUID();
  await shopScoped(manager, PaymentEntity, shopId).insert({ id, invoiceId, method: input.method, amountMinor: input.amountMinor, receivedOn: input.receivedOn, reference: input.reference, stripeSessionId: null, recordedByUserId: actor.userId, createdAt: at });
  await recordAudit(manager, { shopId, actor, action: 'sales.payment_recorded', entity: 'invoice', entityId: invoiceId, changes: { method: { before: null, after: input.method }, amountMinor: { before: null, after: input.amountMinor }, receivedOn: { before: null, after: input.receivedOn } }, at });
}

export interface SalesServiceDeps {
  db: Database;
  clock: Clock;
  mailer: Mailer;
  stripe: Stripe;
  publicUrl: string;
  onMailError?: (err: unknown) => void;
}

export function createSalesService(deps: SalesServiceDeps) {
  const { db, clock, mailer, stripe, publicUrl } = deps;
  const base = publicUrl.replace(/\/$/, '');

  async function pdfOf(shopId: string, invoiceId: string): Promise<{ filename: string; content: Buffer; invoice: Invoice }> {
    const invoice = await view(db.reader, shopId, invoiceId, false);
    const row = await invoiceRow(db.reader, shopId, invoiceId);
    const basics = await shopBasics(db.reader, shopId);
    const content = await renderInvoicePdf({
      title: invoice.kind === 'credit_note' ? 'Credit note' : 'Invoice',
      number: invoice.number,
      issuedOn: invoice.issuedAt?.slice(0, 10) ?? null,
      shopName: basics.shopName,
      shopAddress: basics.shopAddress,
      customerName: invoice.customerName,
      customerAddress: invoice.customerAddress,
      currency: invoice.currency,
      reference: invoice.creditedInvoiceNumber ? `Credits invoice ${invoice.creditedInvoiceNumber}${invoice.creditReason ? `: ${invoice.creditReason}` : ''}` : invoice.jobNumber ? `Job ${invoice.jobNumber}` : null,
      lines: invoice.lines,
      taxByRate: invoice.taxByRate,
      netMinor: invoice.netMinor,
      taxMinor: invoice.taxMinor,
      grossMinor: invoice.grossMinor,
      paidMinor: invoice.paidMinor,
      creditedMinor: invoice.creditedMinor,
      dueMinor: invoice.dueMinor,
      payUrl: row.payToken ? `${base}/api/pay/${row.payToken}` : null,
      notes: invoice.notes,
    });
    const name = invoice.number ?? `draft-${invoice.id.slice(0, 8)}`;
    return { filename: `${name}.pdf`, content, invoice };
  }

  /** E-mails the PDF (after commit); records when. Failures are reported, never thrown into a finished write. */
  async function emailInvoice(shopId: string, invoiceId: string, actor: AuditActor): Promise<boolean> {
    const { filename, content, invoice } = await pdfOf(shopId, invoiceId);
    if (!invoice.customerEmail) return false;
    const row = await invoiceRow(db.reader, shopId, invoiceId);
    const basics = await shopBasics(db.reader, shopId);
    const payUrl = row.payToken && invoice.dueMinor > 0 ? `${base}/api/pay/${row.payToken}` : null;
    const title = invoice.kind === 'credit_note' ? 'Credit note' : 'Invoice';
    try {
      await mailer.send({
        to: invoice.customerEmail,
        subject: `${title} ${invoice.number ?? ''} from ${basics.shopName}`.replace(/\s+/g, ' ').trim(),
        text: [
          `Dear ${invoice.customerName},`,
          '',
          `Please find attached ${title.toLowerCase()} ${invoice.number ?? ''} from ${basics.shopName}.`,
          payUrl ? `\nAmount due: ${(invoice.dueMinor / 100).toFixed(2)} ${invoice.currency}. Pay by card here: ${payUrl}` : '',
          '',
          basics.shopName,
        ].join('\n'),
        attachments: [{ filename, content, contentType: 'application/pdf' }],
      });
    } catch (err) {
      deps.onMailError?.(err);
      return false;
    }
    const at = clock.now();
    await db.write(async (manager) => {
      await shopScoped(manager, InvoiceEntity, shopId).update({ id: invoiceId }, { emailedAt: at });
      await recordAudit(manager, { shopId, actor, action: 'sales.invoice_emailed', entity: 'invoice', entityId: invoiceId, changes: { to: { before: null, after: invoice.customerEmail } }, at });
    });
    return true;
  }

  async function createCheckout(row: InvoiceRow, amountMinor: number, successUrl: string, cancelUrl: string): Promise<Stripe.Checkout.Session> {
    const number = formatInvoiceNumber(row.kind, row.number) ?? 'draft';
    const metadata = { purpose: salesPaymentPurpose, shopId: row.shopId, invoiceId: row.id };
    return stripe.checkout.sessions.create({
      mode: 'payment',
      line_items: [{ quantity: 1, price_data: { currency: row.currency.toLowerCase(), unit_amount: amountMinor, product_data: { name: `Invoice ${number}` } } }],
      success_url: successUrl,
      cancel_url: cancelUrl,
      client_reference_id: row.shopId,
      ...(row.customerEmail ? { customer_email: row.customerEmail } : {}),
      metadata,
      payment_intent_data: { metadata, description: `Invoice ${number}` },
    });
  }

  async function checkoutFor(shopId: string, invoiceId: string, requested: number | undefined, actor: AuditActor | null, successUrl: string, cancelUrl: string) {
    const row = await invoiceRow(db.reader, shopId, invoiceId);
    if (row.kind !== 'invoice') throw conflict('not_an_invoice', 'A credit note is not paid.');
    if (row.status !== 'issued') throw conflict('not_issued', 'Issue the invoice before taking a card payment.');
    const settled = (await settledOf(db.reader, shopId, [invoiceId])).get(invoiceId)!;
    const due = paymentState(row, settled.paid, settled.credited).dueMinor;
    if (due <= 0) throw conflict('nothing_due', 'Nothing is due on this invoice.');
    const amount = requested ?? due;
    if (amount > due) throw conflict('more_than_due', `That is more than is due (${due}).`, { dueMinor: due });
    // Stripe first, outside any transaction; the session row after.
    const session = await createCheckout(row, amount, successUrl, cancelUrl);
    const at = clock.now();
    await db.write(async (manager) => {
      await shopScoped(manager, CardSessionEntity, shopId).insert({ id: session.id, invoiceId, amountMinor: amount, status: 'open', createdAt: at, completedAt: null });
      await recordAudit(manager, { shopId, actor: actor ?? { userId: null }, action: 'sales.card_checkout_started', entity: 'invoice', entityId: invoiceId, changes: { amountMinor: { before: null, after: amount }, session: { before: null, after: session.id } }, at });
    });
    return { url: session.url ?? '', sessionId: session.id, amountMinor: amount };
  }

  return {
    settings: (shopId: string): Promise<SalesSettings> => salesSettingsOf(db.reader, shopId),

    async updateSettings(shopId: string, input: UpdateSalesSettings, actor: AuditActor): Promise<SalesSettings> {
      await db.write((manager) => saveSalesSettings(manager, shopId, input, actor, clock.now()));
      return salesSettingsOf(db.reader, shopId);
    },

    /** Sell prices of parts; cost and margin only when `showCost`. */
    async sellPrices(shopId: string, partIds: readonly string[], showCost: boolean): Promise<SellPricesResponse> {
      const prices = await sellPricesFor(db.reader, shopId, partIds);
      const facts = await pricingFactsFor(db.reader, shopId, partIds);
      const basics = await shopBasics(db.reader, shopId);
      const out: PartSellPrice[] = [];
      for (const id of partIds) {
        const price = prices.get(id);
        if (!price) continue;
        const f = facts.get(id)!;
        out.push({
          partId: id,
          unitMinor: price.unitMinor,
          basis: price.basis,
          markupPercent: price.markupPercent,
          listPriceMinor: f.listPriceMinor,
          ...(showCost ? { unitCostMinor: f.unitCostMinor, marginMinor: price.unitMinor !== null && f.unitCostMinor !== null ? price.unitMinor - f.unitCostMinor : null } : {}),
        });
      }
      return { currency: basics.currency, prices: out };
    },

    async setListPrice(shopId: string, partId: string, listPriceMinor: number | null, actor: AuditActor): Promise<void> {
      const at = clock.now();
      await db.write(async (manager) => {
        const [part] = await manager.query<Array<{ id: string }>>(`SELECT id FROM parts WHERE shop_id = ? AND id = ?`, [shopId, partId]);
        if (!part) throw notFound('No such part in this shop.');
        const [before] = await manager.query<Array<{ price: number | null }>>(`SELECT list_price_minor AS price FROM part_prices WHERE shop_id = ? AND part_id = ?`, [shopId, partId]);
        if (before) await manager.query(`UPDATE part_prices SET list_price_minor = ?, updated_at = ? WHERE shop_id = ? AND part_id = ?`, [listPriceMinor, sqlTime(at), shopId, partId]);
        else await manager.query(`INSERT INTO part_prices (shop_id, part_id, list_price_minor, updated_at) VALUES (?, ?, ?, ?)`, [shopId, partId, listPriceMinor, sqlTime(at)]);
        await recordAudit(manager, { shopId, actor, action: 'sales.list_price_set', entity: 'part', entityId: partId, changes: { listPriceMinor: { before: before?.price ?? null, after: listPriceMinor } }, at });
      });
    },

    async list(shopId: string, f: InvoiceListFilters): Promise<InvoiceListResponse> {
      const where = ['i.shop_id = ?'];
      const params: unknown[] = [shopId];
      const settledSql = `(SELECT COALESCE(SUM(p.amount_minor), 0) FROM invoice_payments p WHERE p.shop_id = i.shop_id AND p.invoice_id = i.id)
        + (SELECT COALESCE(SUM(c.gross_minor), 0) FROM invoices c WHERE c.shop_id = i.shop_id AND c.credited_invoice_id = i.id AND c.status = 'issued')`;
      const paidSql = `(SELECT COALESCE(SUM(p.amount_minor), 0) FROM invoice_payments p WHERE p.shop_id = i.shop_id AND p.invoice_id = i.id)`;
      if (f.status === 'draft' || f.status === 'issued') {
        where.push('i.status = ?');
        params.push(f.status);
      } else if (f.status === 'paid') where.push(`i.kind = 'invoice' AND i.status = 'issued' AND ${settledSql} >= i.gross_minor`);
      else if (f.status === 'part_paid') where.push(`i.kind = 'invoice' AND i.status = 'issued' AND ${settledSql} < i.gross_minor AND ${paidSql} > 0`);
      else if (f.status === 'unpaid') where.push(`i.kind = 'invoice' AND i.status = 'issued' AND ${settledSql} < i.gross_minor AND ${paidSql} = 0`);
      if (f.kind) {
        where.push('i.kind = ?');
        params.push(f.kind);
      }
      if (f.customerId) {
        where.push('i.customer_id = ?');
        params.push(f.customerId);
      }
      if (f.q) {
        where.push(`(i.customer_name LIKE ? ESCAPE '\\' OR CAST(i.number AS TEXT) = ?)`);
        params.push(`%${f.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`, f.q.replace(/^\D+-?0*/, ''));
      }
      if (f.from) {
        where.push('COALESCE(i.issued_at, i.created_at) >= ?');
        params.push(`${f.from} 00:00:00`);
      }
      if (f.to) {
        where.push('COALESCE(i.issued_at, i.created_at) <= ?');
        params.push(`${f.to} 23:59:59.999`);
      }
      const [count] = await db.reader.query<Array<{ n: number }>>(`SELECT COUNT(*) AS n FROM invoices i WHERE ${where.join(' AND ')}`, params);
      const ids = await db.reader.query<Array<{ id: string }>>(
        `SELECT i.id FROM invoices i WHERE ${where.join(' AND ')} ORDER BY (i.status = 'draft') DESC, COALESCE(i.issued_at, i.created_at) DESC, i.number DESC LIMIT ? OFFSET ?`,
        [...params, f.pageSize, (f.page - 1) * f.pageSize],
      );
      const rows = ids.length ? await db.reader.getRepository(InvoiceEntity).find({ where: ids.map((r) => ({ id: r.id, shopId })) }) : [];
      const byId = new Map(rows.map((r) => [r.id, r]));
      const settled = await settledOf(db.reader, shopId, ids.map((r) => r.id));
      return { invoices: ids.map((r) => summaryOf(byId.get(r.id)!, settled.get(r.id)!)), total: Number(count?.n ?? 0) };
    },

    get: (shopId: string, invoiceId: string, showMargin: boolean) => view(db.reader, shopId, invoiceId, showMargin),

    create(shopId: string, input: CreateInput, actor: AuditActor): Promise<string> {
      const at = clock.now();
      return db.write((manager) => createInvoiceInTx(manager, shopId, input, actor, at));
    },

    /** A draft from a job: its issued (less returned) parts at sell prices, its labour at the rate recorded. */
    async createFromJob(shopId: string, jobId: string, actor: AuditActor): Promise<string> {
      const at = clock.now();
      return db.write(async (manager) => {
        const [job] = await manager.query<Array<{ id: string; number: number; title: string; vehicleId: string; customerId: string | null; marque: string; model: string }>>(
          `SELECT j.id, j.number, j.title, j.vehicle_id AS vehicleId, v.customer_id AS customerId, v.marque, v.model FROM jobs j JOIN vehicles v ON v.shop_id = j.shop_id AND v.id = j.vehicle_id WHERE j.shop_id = ? AND j.id = ?`,
          [shopId, jobId],
        );
        if (!job) throw notFound('No such job in this shop.');
        const [existing] = await manager.query<Array<{ id: string; status: string }>>(`SELECT id, status FROM invoices WHERE shop_id = ? AND job_id = ? AND kind = 'invoice' LIMIT 1`, [shopId, jobId]);
        if (existing) throw conflict('job_already_invoiced', `Job ${job.number} already has an invoice${existing.status === 'draft' ? ' (a draft)' : ''}.`, { invoiceId: existing.id });
        const basics = await shopBasics(manager, shopId);
        const parts = await manager.query<Array<{ partId: string; number: string; description: string; quantity: number; cost: number }>>(
          `SELECT m.part_id AS partId, p.number, p.description, -SUM(m.quantity_delta) AS quantity, -SUM(m.value_change_minor) AS cost
           FROM stock_movements m JOIN parts p ON p.shop_id = m.shop_id AND p.id = m.part_id
           WHERE m.shop_id = ? AND m.job_id = ? AND m.kind IN ('issued', 'returned')
           GROUP BY m.part_id, p.number, p.description, p.key HAVING -SUM(m.quantity_delta) > 0 ORDER BY p.key`,
          [shopId, jobId],
        );
        const prices = await sellPricesFor(manager, shopId, parts.map((p) => p.partId));
        const lines: DraftLine[] = [];
        for (const p of parts) {
          const quantity = Number(p.quantity);
          const unitCost = Math.round(Math.max(0, Number(p.cost)) / quantity);
          const listed = prices.get(p.partId)?.unitMinor ?? null;
          lines.push({
            kind: 'part',
            partId: p.partId,
            description: `${p.number} ${p.description}`,
            quantity: String(quantity),
            // No list price and no cost: priced at zero, to be set on the draft before issuing.
            unitPriceMinor: listed ?? 0,
            listedUnitPriceMinor: listed,
            unitCostMinor: unitCost,
            discountPercent: 0,
            taxRatePercent: basics.standardTaxRatePercent,
            creditedLineId: null,
          });
        }
        const labour = await manager.query<Array<{ workedOn: string; minutes: number; description: string; rate: number }>>(
          `SELECT worked_on AS workedOn, minutes, description, rate_minor_per_hour AS rate FROM labour_entries WHERE shop_id = ? AND job_id = ? ORDER BY worked_on, created_at`,
          [shopId, jobId],
        );
        for (const l of labour) {
          lines.push({
            kind: 'labour',
            partId: null,
            description: `Labour ${l.workedOn}: ${l.description}`.slice(0, 200),
            quantity: hoursOf(Number(l.minutes)),
            unitPriceMinor: Number(l.rate),
            listedUnitPriceMinor: Number(l.rate),
            unitCostMinor: null,
            discountPercent: 0,
            taxRatePercent: basics.standardTaxRatePercent,
            creditedLineId: null,
          });
        }
        const customer = job.customerId ? await customerFields(manager, shopId, { customerId: job.customerId }) : { customerId: null, customerName: 'Customer', customerEmail: null, customerAddress: null };
        const row = await newDraft(manager, shopId, { source: 'job', jobId, vehicleId: job.vehicleId, ...customer, notes: `Job ${job.number}: ${job.title} (${job.marque} ${job.model})`.slice(0, 1000) }, actor, at);
        await replaceLines(manager, row, lines, at);
        await recordAudit(manager, { shopId, actor, action: 'sales.invoice_created', entity: 'invoice', entityId: row.id, changes: { source: { before: null, after: 'job' }, job: { before: null, after: job.number }, lines: { before: null, after: lineAudit(lines) } }, at });
        return row.id;
      });
    },

    /** A draft for the sale of a shop-stock vehicle; it is marked sold when the invoice is issued. */
    async createFromVehicle(shopId: string, input: VehicleSaleInput, actor: AuditActor): Promise<string> {
      const at = clock.now();
      return db.write(async (manager) => {
        const vehicle = await shopScoped(manager, VehicleEntity, shopId).findOne({ id: input.vehicleId });
        if (!vehicle) throw notFound('No such vehicle in this shop.');
        if (vehicle.kind !== 'shop_stock') throw conflict('not_shop_stock', 'Only a shop-stock vehicle is sold on an invoice here.');
        if (vehicle.status === 'sold') throw conflict('vehicle_sold', 'This vehicle is already sold.');
        const customer = await customerFields(manager, shopId, input);
        const basics = await shopBasics(manager, shopId);
        const lines: DraftLine[] = [
          {
            kind: 'vehicle',
            partId: null,
            description: [vehicle.year, vehicle.marque, vehicle.model, vehicle.frameNumber ? `frame ${vehicle.frameNumber}` : null].filter(Boolean).join(' ').slice(0, 200),
            quantity: '1',
            unitPriceMinor: input.priceMinor,
            listedUnitPriceMinor: vehicle.askingPriceMinor,
            unitCostMinor: vehicle.acquisitionCostMinor,
            discountPercent: 0,
            taxRatePercent: input.taxRatePercent ?? basics.standardTaxRatePercent,
            creditedLineId: null,
          },
        ];
        const row = await newDraft(manager, shopId, { source: 'vehicle', vehicleId: vehicle.id, ...customer }, actor, at);
        await replaceLines(manager, row, lines, at);
        await recordAudit(manager, { shopId, actor, action: 'sales.invoice_created', entity: 'invoice', entityId: row.id, changes: { source: { before: null, after: 'vehicle' }, vehicle: { before: null, after: lines[0]!.description }, priceMinor: { before: null, after: input.priceMinor } }, at });
        return row.id;
      });
    },

    /** A counter sale: stock issued and the invoice made (and by default issued) in one transaction. */
    async counterSale(shopId: string, input: CounterInput, actor: AuditActor): Promise<{ invoiceId: string; emailed: Promise<boolean> | null }> {
      const at = clock.now();
      const result = await db.write((manager) => counterSaleInTx(manager, shopId, input, actor, at));
      return { invoiceId: result.id, emailed: result.email ? emailInvoice(shopId, result.id, actor) : null };
    },

    async update(shopId: string, invoiceId: string, input: UpdateInput, actor: AuditActor): Promise<void> {
      const at = clock.now();
      await db.write(async (manager) => {
        const row = await invoiceRow(manager, shopId, invoiceId);
        if (row.status !== 'draft') throw conflict('issued_is_final', 'An issued invoice cannot be changed; correct it with a credit note.');
        if (row.kind !== 'invoice') throw conflict('issued_is_final', 'A credit note cannot be changed.');
        const changes: Record<string, { before: unknown; after: unknown }> = {};
        const patch: Partial<InvoiceRow> = {};
        if (input.customerId !== undefined || input.customerName !== undefined || input.customerEmail !== undefined || input.customerAddress !== undefined) {
          const c = await customerFields(manager, shopId, {
            customerId: input.customerId !== undefined ? input.customerId : row.customerId,
            customerName: input.customerName ?? (input.customerId ? undefined : row.customerName),
            customerEmail: input.customerEmail !== undefined ? input.customerEmail : input.customerId ? undefined : row.customerEmail,
            customerAddress: input.customerAddress !== undefined ? input.customerAddress : input.customerId ? undefined : row.customerAddress,
          });
          Object.assign(patch, c);
          for (const [k, v] of Object.entries(c)) if (row[k as keyof InvoiceRow] !== v) changes[k] = { before: row[k as keyof InvoiceRow], after: v };
        }
        if (input.notes !== undefined) {
          patch.notes = input.notes;
          changes['notes'] = { before: row.notes, after: input.notes };
        }
        if (Object.keys(patch).length) await shopScoped(manager, InvoiceEntity, shopId).update({ id: invoiceId }, { ...patch, updatedAt: at });
        if (input.lines) {
          const basics = await shopBasics(manager, shopId);
          const before = await shopScoped(manager, InvoiceLineEntity, shopId).find({ invoiceId }, { position: 'ASC' });
          const lines = await resolveLines(manager, shopId, input.lines, basics.standardTaxRatePercent);
          // Keep the recorded cost of part lines already on the draft (they came from the job's stock movements).
          for (const l of lines) {
            const old = before.find((b) => b.partId && b.partId === l.partId);
            if (old && old.unitCostMinor !== null) l.unitCostMinor = old.unitCostMinor;
          }
          await replaceLines(manager, row, lines, at);
          changes['lines'] = { before: lineAudit(before.map((b) => ({ ...b, discountPercent: Number(b.discountPercent), taxRatePercent: Number(b.taxRatePercent) }))), after: lineAudit(lines) };
        }
        await recordAudit(manager, { shopId, actor, action: 'sales.invoice_updated', entity: 'invoice', entityId: invoiceId, changes, at });
      });
    },

    async remove(shopId: string, invoiceId: string, actor: AuditActor): Promise<void> {
      const at = clock.now();
      await db.write(async (manager) => {
        const row = await invoiceRow(manager, shopId, invoiceId);
        if (row.status !== 'draft') throw conflict('issued_is_final', 'An issued invoice is never deleted; correct it with a credit note.');
        if (row.source === 'counter') throw conflict('counter_sale', 'The stock of this counter sale is already issued: issue the invoice, then credit it if the sale is undone.');
        const [paid] = await manager.query<Array<{ n: number }>>(`SELECT COUNT(*) AS n FROM invoice_payments WHERE shop_id = ? AND invoice_id = ?`, [shopId, invoiceId]);
        if (Number(paid?.n ?? 0) > 0) throw conflict('has_payments', 'A deposit is recorded on this draft: issue it instead.');
        await manager.query(`DELETE FROM invoice_card_sessions WHERE shop_id = ? AND invoice_id = ?`, [shopId, invoiceId]);
        await manager.query(`DELETE FROM invoice_lines WHERE shop_id = ? AND invoice_id = ?`, [shopId, invoiceId]);
        await manager.query(`DELETE FROM invoices WHERE shop_id = ? AND id = ?`, [shopId, invoiceId]);
        await recordAudit(manager, { shopId, actor, action: 'sales.draft_deleted', entity: 'invoice', entityId: invoiceId, changes: { customer: { before: row.customerName, after: null }, grossMinor: { before: row.grossMinor, after: null } }, at });
      });
    },

    /** Issues a draft (numbered without gaps), then e-mails it when the customer has an address. */
    async issue(shopId: string, invoiceId: string, actor: AuditActor, sendEmail: boolean): Promise<{ emailed: Promise<boolean> | null }> {
      const at = clock.now();
      const row = await db.write((manager) => issueInTx(manager, shopId, invoiceId, actor, at));
      return { emailed: sendEmail && row.customerEmail ? emailInvoice(shopId, invoiceId, actor) : null };
    },

    /** A credit note against an issued invoice, in full or by lines; issued at once in its own series. */
    async creditNote(shopId: string, invoiceId: string, input: CreditInput, actor: AuditActor): Promise<{ creditNoteId: string; emailed: Promise<boolean> | null }> {
      const at = clock.now();
      const result = await db.write((manager) => creditNoteInTx(manager, shopId, invoiceId, input, actor, at));
      return { creditNoteId: result.id, emailed: result.email ? emailInvoice(shopId, result.id, actor) : null };
    },

    /** Cash or bank transfer, on an issued invoice or as a deposit on a draft; never more than is due. */
    async recordPayment(shopId: string, invoiceId: string, input: PaymentInput, actor: AuditActor): Promise<void> {
      const at = clock.now();
      await db.write((manager) => recordPaymentInTx(manager, shopId, invoiceId, input, actor, at));
    },

    pdf: pdfOf,
    email: emailInvoice,

    /** Staff start a card payment (e.g. at the counter); the browser goes to Stripe's checkout page. */
    cardCheckout(shopId: string, invoiceId: string, amountMinor: number | undefined, actor: AuditActor) {
      const page = `${base}/shops/${shopId}/sales/invoices/${invoiceId}`;
      return checkoutFor(shopId, invoiceId, amountMinor, actor, `${page}?paid=card`, page);
    },

    /** The customer's pay link (no account): a fresh Checkout session for what is due. */
    async payLink(token: string): Promise<{ url: string } | { done: true; number: string | null; currency: string }> {
      const [row] = await db.reader.query<Array<{ id: string; shopId: string }>>(`SELECT id, shop_id AS shopId FROM invoices WHERE pay_token = ? AND status = 'issued' AND kind = 'invoice'`, [token]);
      if (!row) throw notFound('This payment link is not valid.');
      const invoice = await invoiceRow(db.reader, row.shopId, row.id);
      const settled = (await settledOf(db.reader, row.shopId, [row.id])).get(row.id)!;
      if (paymentState(invoice, settled.paid, settled.credited).dueMinor <= 0) return { done: true, number: formatInvoiceNumber('invoice', invoice.number), currency: invoice.currency };
      const back = `${base}/api/pay/${token}/done`;
      const { url } = await checkoutFor(row.shopId, row.id, undefined, null, back, back);
      return { url };
    },

    async payLinkState(token: string): Promise<{ number: string | null; dueMinor: number; currency: string; shopName: string }> {
      const [row] = await db.reader.query<Array<{ id: string; shopId: string }>>(`SELECT id, shop_id AS shopId FROM invoices WHERE pay_token = ? AND status = 'issued' AND kind = 'invoice'`, [token]);
      if (!row) throw notFound('This payment link is not valid.');
      const invoice = await invoiceRow(db.reader, row.shopId, row.id);
      const settled = (await settledOf(db.reader, row.shopId, [row.id])).get(row.id)!;
      return { number: formatInvoiceNumber('invoice', invoice.number), dueMinor: paymentState(invoice, settled.paid, settled.credited).dueMinor, currency: invoice.currency, shopName: (await shopBasics(db.reader, row.shopId)).shopName };
    },
  };
}

export type SalesService = ReturnType<typeof createSalesService>;
