/* eslint-disable @nx/enforce-module-boundaries -- the seed writes through the API's own data layer
   (the sales module's in-transaction functions); see docs/decisions/002-module-boundaries.md. */
import type { EntityManager } from 'typeorm';
import { saveSalesSettings } from '../apps/api/src/modules/sales/sales.settings';
import { counterSaleInTx, createInvoiceInTx, creditNoteInTx, issueInTx, recordPaymentInTx } from '../apps/api/src/modules/sales/sales.service';

/**
 * Sales in one demo shop (inside the caller's write, after stock, vehicles and jobs): pricing rules,
 * invoices in every state (a draft, issued unpaid, part paid, paid), a counter sale of parts from
 * stock, and a credit note correcting one line of an invoice. Customers and names are invented.
 */
export async function seedSalesDemo(manager: EntityManager, shopId: string, people: { owner: string }, at: Date): Promise<void> {
  const daysAgo = (n: number, hour = 10) => new Date(Date.UTC(at.getUTCFullYear(), at.getUTCMonth(), at.getUTCDate() - n, hour, 15));
  const day = (n: number) => daysAgo(n).toISOString().slice(0, 10);
  const actor = { userId: people.owner, ip: null };
  await saveSalesSettings(
    manager,
    shopId,
    { pricingRules: { useListPrice: true, defaultMarkupPercent: 40, categoryMarkups: { Electrical: 45 }, originMarkups: { reproduction: 30 }, rounding: 'up-to-5' }, taxRounding: 'per-line', extraTaxRates: [{ name: 'Zero', ratePercent: 0 }] },
    actor,
    daysAgo(30),
  );
  const customers = await manager.query<Array<{ id: string }>>(`SELECT id FROM customers WHERE shop_id = ? ORDER BY created_at, id LIMIT 3`, [shopId]);
  const customer = (i: number) => (customers[i % Math.max(1, customers.length)] ? { customerId: customers[i % customers.length]!.id } : { customerId: null, customerName: 'Wren Haldane' });
  const invoice = (i: number, lines: Array<{ description: string; quantity: string; unitPriceMinor: number; kind?: 'labour' | 'other' }>, notes: string | null, n: number) =>
    createInvoiceInTx(
      manager,
      shopId,
      { ...customer(i), notes, lines: lines.map((l) => ({ kind: l.kind ?? 'other', partId: null, description: l.description, quantity: l.quantity, unitPriceMinor: l.unitPriceMinor, discountPercent: 0 })) },
      actor,
      daysAgo(n),
    );

  // Paid in full by bank transfer.
  const paid = await invoice(0, [{ kind: 'labour', description: 'Strip and rebuild the gearbox', quantity: '6.5', unitPriceMinor: 6000 }, { description: 'Gearbox gasket and seal kit', quantity: '1', unitPriceMinor: 3450 }], 'Gearbox rebuild', 21);
  await issueInTx(manager, shopId, paid, actor, daysAgo(20));
  const [gross] = await manager.query<Array<{ gross: number }>>(`SELECT gross_minor AS gross FROM invoices WHERE shop_id = ? AND id = ?`, [shopId, paid]);
  await recordPaymentInTx(manager, shopId, paid, { method: 'bank_transfer', amountMinor: Number(gross!.gross), receivedOn: day(14), reference: 'BACS 20417' }, actor, daysAgo(14));

  // Part paid: a deposit in cash, the rest still due.
  const partPaid = await invoice(1, [{ kind: 'labour', description: 'Frame straightening and paint preparation', quantity: '12', unitPriceMinor: 6000 }, { description: 'Two-pack primer and topcoat', quantity: '1', unitPriceMinor: 18500 }], 'Frame restoration', 12);
  await recordPaymentInTx(manager, shopId, partPaid, { method: 'cash', amountMinor: 30000, receivedOn: day(12), reference: 'Deposit' }, actor, daysAgo(12));
  await issueInTx(manager, shopId, partPaid, actor, daysAgo(6));

  // Issued, unpaid.
  const unpaid = await invoice(2, [{ kind: 'labour', description: 'Carburettor balance and tune', quantity: '1.5', unitPriceMinor: 6000 }], 'Tune-up', 4);
  await issueInTx(manager, shopId, unpaid, actor, daysAgo(3));

  // Issued, then one line corrected by a credit note.
  const credited = await invoice(0, [{ kind: 'labour', description: 'Wiring loom fault finding', quantity: '3', unitPriceMinor: 6000 }, { description: 'Headlamp relay', quantity: '2', unitPriceMinor: 1250 }], 'Electrical fault', 9);
  await issueInTx(manager, shopId, credited, actor, daysAgo(8));
  const lines = await manager.query<Array<{ id: string }>>(`SELECT id FROM invoice_lines WHERE shop_id = ? AND invoice_id = ? ORDER BY position`, [shopId, credited]);
  if (lines[1]) await creditNoteInTx(manager, shopId, credited, { lines: [{ lineId: lines[1].id, quantity: '1' }], reason: 'One relay returned unused' }, actor, daysAgo(7));

  // A counter sale of a part with free stock (average-cost pool), issued at once.
  const [line] = await manager.query<Array<{ partId: string; binId: string; condition: string }>>(
    `SELECT l.part_id AS partId, l.bin_id AS binId, l.condition FROM stock_lines l
     JOIN stock_pools sp ON sp.shop_id = l.shop_id AND sp.part_id = l.part_id AND sp.condition = l.condition
     WHERE l.shop_id = ? AND l.on_hand - l.held >= 2 AND sp.method = 'average' AND sp.value_minor > 0 ORDER BY l.part_id, l.bin_id LIMIT 1`,
    [shopId],
  );
  if (line) await counterSaleInTx(manager, shopId, { customerId: null, customerName: 'Counter sale', customerEmail: null, issue: true, lines: [{ partId: line.partId, binId: line.binId, condition: line.condition, quantity: 2, discountPercent: 0 }] }, actor, daysAgo(2));

  // A draft still being put together.
  await invoice(1, [{ kind: 'labour', description: 'Wheel rebuild, rear', quantity: '2', unitPriceMinor: 6000 }], 'Wheel rebuild (draft)', 1);
}
