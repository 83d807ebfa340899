import { Between, In } from 'typeorm';
import type { z } from 'zod';
import { multiplyMinorUnits } from '@tappet/domain';
import { unpaidAgeBuckets, type MarginPeriodRow, type MarginsByPeriod, type SalesByPeriod, type SalesPeriodRow, type salesReportQuerySchema, type UnpaidByAge, type UnpaidInvoiceRow } from '@tappet/contracts';
import type { Database } from '../../db/write-lock';
import type { Clock } from '../../lib/clock';
import { csvLine } from '../audit/csv';
import { InvoiceEntity, InvoiceLineEntity, PaymentEntity, type InvoiceRow } from '../sales/sales.entity';
import { shopBasics } from '../sales/sales.settings';
import { ageBucket, ageInDays, defaultFrom, periodLabel, periodStart, periodStarts } from './periods';

export type ReportQuery = z.output<typeof salesReportQuerySchema>;

const dayOf = (d: Date | string) => new Date(d).toISOString().slice(0, 10);
const major = (minor: number) => (minor / 100).toFixed(2);

/**
 * Sales reports over the sales module's tables (read only): issued invoices and credit notes by
 * the day they were issued (UTC), gross margin on parts lines (net less the unit cost recorded on
 * the line at issue × quantity) and labour lines (no wage cost is recorded, so all of it), and
 * issued invoices not yet settled by how long ago they were issued. A credit note counts, with
 * the opposite sign, in the period it was issued.
 */
export function createSalesReportsService(deps: { db: Database; clock: Clock }) {
  const { db, clock } = deps;

  function windowOf(q: ReportQuery) {
    const to = q.to ?? dayOf(clock.now());
    const from = q.from ?? defaultFrom(to, q.period);
    return { from, to, starts: periodStarts(from, to, q.period) };
  }

  async function issuedIn(shopId: string, from: string, to: string): Promise<InvoiceRow[]> {
    const end = new Date(Date.parse(`${to}T00:00:00Z`) + 86_400_000 - 1);
    return db.reader.find(InvoiceEntity, { where: { shopId, status: 'issued', issuedAt: Between(new Date(`${from}T00:00:00Z`), end) } });
  }

  async function sales(shopId: string, q: ReportQuery): Promise<SalesByPeriod> {
    const { from, to, starts } = windowOf(q);
    const rows = new Map<string, SalesPeriodRow>(starts.map((s) => [s, { start: s, label: periodLabel(s, q.period), invoices: 0, creditNotes: 0, netMinor: 0, taxMinor: 0, grossMinor: 0 }]));
    for (const inv of await issuedIn(shopId, from, to)) {
      const row = rows.get(periodStart(dayOf(inv.issuedAt!), q.period));
      if (!row) continue;
      const sign = inv.kind === 'credit_note' ? -1 : 1;
      if (sign < 0) row.creditNotes += 1;
      else row.invoices += 1;
      row.netMinor += sign * inv.netMinor;
      row.taxMinor += sign * inv.taxMinor;
      row.grossMinor += sign * inv.grossMinor;
    }
    const list = [...rows.values()];
    const sum = (k: 'netMinor' | 'taxMinor' | 'grossMinor') => list.reduce((s, r) => s + r[k], 0);
    return { currency: (await shopBasics(db.reader, shopId)).currency, period: q.period, from, to, rows: list, totals: { netMinor: sum('netMinor'), taxMinor: sum('taxMinor'), grossMinor: sum('grossMinor') } };
  }

  async function margins(shopId: string, q: ReportQuery): Promise<MarginsByPeriod> {
    const { from, to, starts } = windowOf(q);
    const empty = () => ({ partsNetMinor: 0, partsCostMinor: 0, partsMarginMinor: 0, partsWithoutCost: 0, labourNetMinor: 0, labourMarginMinor: 0 });
    const rows = new Map<string, MarginPeriodRow>(starts.map((s) => [s, { start: s, label: periodLabel(s, q.period), ...empty() }]));
    const invoices = await issuedIn(shopId, from, to);
    const lines = invoices.length ? await db.reader.find(InvoiceLineEntity, { where: { shopId, invoiceId: In(invoices.map((i) => i.id)), kind: In(['part', 'labour']) } }) : [];
    const invoiceById = new Map(invoices.map((i) => [i.id, i]));
    for (const l of lines) {
      const inv = invoiceById.get(l.invoiceId)!;
      const row = rows.get(periodStart(dayOf(inv.issuedAt!), q.period));
      if (!row) continue;
      const sign = inv.kind === 'credit_note' ? -1 : 1;
      if (l.kind === 'labour') {
        row.labourNetMinor += sign * l.netMinor;
        row.labourMarginMinor += sign * l.netMinor;
        continue;
      }
      const cost = l.unitCostMinor === null ? 0 : multiplyMinorUnits(l.unitCostMinor, l.quantity);
      if (l.unitCostMinor === null) row.partsWithoutCost += 1;
      row.partsNetMinor += sign * l.netMinor;
      row.partsCostMinor += sign * cost;
      row.partsMarginMinor += sign * (l.netMinor - cost);
    }
    const list = [...rows.values()];
    const totals = empty();
    for (const r of list) for (const k of Object.keys(totals) as Array<keyof typeof totals>) totals[k] += r[k];
    return { currency: (await shopBasics(db.reader, shopId)).currency, period: q.period, from, to, rows: list, totals };
  }

  async function unpaid(shopId: string): Promise<UnpaidByAge> {
    const asOf = dayOf(clock.now());
    const invoices = await db.reader.find(InvoiceEntity, { where: { shopId, status: 'issued', kind: 'invoice' }, order: { issuedAt: 'ASC' } });
    const ids = invoices.map((i) => i.id);
    const paid = new Map<string, number>();
    const credited = new Map<string, number>();
    if (ids.length) {
      for (const p of await db.reader.find(PaymentEntity, { where: { shopId, invoiceId: In(ids) } })) paid.set(p.invoiceId, (paid.get(p.invoiceId) ?? 0) + p.amountMinor);
      for (const c of await db.reader.find(InvoiceEntity, { where: { shopId, status: 'issued', kind: 'credit_note', creditedInvoiceId: In(ids) } })) credited.set(c.creditedInvoiceId!, (credited.get(c.creditedInvoiceId!) ?? 0) + c.grossMinor);
    }
    const rows: UnpaidInvoiceRow[] = [];
    for (const inv of invoices) {
      const due = inv.grossMinor - (paid.get(inv.id) ?? 0) - (credited.get(inv.id) ?? 0);
      if (due <= 0) continue;
      const issuedOn = dayOf(inv.issuedAt!);
      const ageDays = ageInDays(issuedOn, asOf);
      rows.push({ invoiceId: inv.id, number: inv.number === null ? null : `INV-${String(inv.number).padStart(5, '0')}`, customerName: inv.customerName, issuedOn, ageDays, bucket: ageBucket(ageDays), grossMinor: inv.grossMinor, dueMinor: due });
    }
    const buckets = unpaidAgeBuckets.map((bucket) => {
      const inBucket = rows.filter((r) => r.bucket === bucket);
      return { bucket, count: inBucket.length, dueMinor: inBucket.reduce((s, r) => s + r.dueMinor, 0) };
    });
    return { currency: (await shopBasics(db.reader, shopId)).currency, asOf, buckets, invoices: rows, totalDueMinor: rows.reduce((s, r) => s + r.dueMinor, 0) };
  }

  return {
    sales,
    margins,
    unpaid,
    async salesCsv(shopId: string, q: ReportQuery): Promise<string> {
      const r = await sales(shopId, q);
      return csvLine(['period_start', 'period', 'invoices', 'credit_notes', `net_${r.currency}`, `tax_${r.currency}`, `gross_${r.currency}`]) + r.rows.map((x) => csvLine([x.start, x.label, x.invoices, x.creditNotes, major(x.netMinor), major(x.taxMinor), major(x.grossMinor)])).join('');
    },
    async marginsCsv(shopId: string, q: ReportQuery): Promise<string> {
      const r = await margins(shopId, q);
      return (
        csvLine(['period_start', 'period', `parts_net_${r.currency}`, `parts_cost_${r.currency}`, `parts_margin_${r.currency}`, 'parts_without_cost', `labour_net_${r.currency}`, `labour_margin_${r.currency}`]) +
        r.rows.map((x) => csvLine([x.start, x.label, major(x.partsNetMinor), major(x.partsCostMinor), major(x.partsMarginMinor), x.partsWithoutCost, major(x.labourNetMinor), major(x.labourMarginMinor)])).join('')
      );
    },
    async unpaidCsv(shopId: string): Promise<string> {
      const r = await unpaid(shopId);
      return csvLine(['invoice', 'customer', 'issued_on', 'age_days', 'age_bucket', `gross_${r.currency}`, `due_${r.currency}`]) + r.invoices.map((x) => csvLine([x.number, x.customerName, x.issuedOn, x.ageDays, x.bucket, major(x.grossMinor), major(x.dueMinor)])).join('');
    },
  };
}

export type SalesReportsService = ReturnType<typeof createSalesReportsService>;
