import { In, type EntityManager } from 'typeorm';
import { divideRoundHalfEven, documentTotals, toSafeMinorUnits, type DocumentLineInput, type DocumentTotals } from '@tappet/domain';
import { PartEntity } from '../catalogue/catalogue.entity';
import { LabourEntryEntity } from '../jobs/jobs.entity';
import { sellPricesFor } from '../sales/pricing.service';
import { shopBasics, taxRoundingFor } from '../sales/sales.settings';
import { MovementEntity } from '../stock/stock.entity';

/** A line of what a job has used, priced as it would sell today. */
export interface JobValueLine extends DocumentLineInput {
  kind: 'part' | 'labour';
  description: string;
}

export interface JobValue {
  currency: string;
  lines: JobValueLine[];
  totals: DocumentTotals;
  /** Parts issued that have no sell price (neither list price nor cost): counted at 0. */
  unpricedPartIds: string[];
}

/**
 * What a job has used so far at sell prices: parts issued less parts returned (stock ledger rows
 * carrying the job), each at its current sell price from the shop's pricing rules; labour entries
 * at the rate recorded with them (minutes × rate ÷ 60, rounded half to even per entry,
 * decision 007); tax at the shop's standard rate under its tax rounding. This is the figure an
 * invoice made now would show, and what approval is measured against.
 */
export async function jobValue(manager: EntityManager, shopId: string, jobId: string): Promise<JobValue> {
  const basics = await shopBasics(manager, shopId);
  const rounding = await taxRoundingFor(manager, shopId);
  const movements = await manager.find(MovementEntity, { where: { shopId, jobId, kind: In(['issued', 'returned']) } });
  const quantityByPart = new Map<string, number>();
  for (const m of movements) quantityByPart.set(m.partId, (quantityByPart.get(m.partId) ?? 0) - m.quantityDelta);
  const partIds = [...quantityByPart].filter(([, q]) => q > 0).map(([id]) => id);
  const prices = partIds.length ? await sellPricesFor(manager, shopId, partIds) : new Map();
  const parts = partIds.length ? await manager.find(PartEntity, { where: { shopId, id: In(partIds) } }) : [];
  const partById = new Map(parts.map((p) => [p.id, p]));
  const lines: JobValueLine[] = [];
  const unpricedPartIds: string[] = [];
  for (const partId of partIds) {
    const unit = prices.get(partId)?.unitMinor ?? null;
    if (unit === null) unpricedPartIds.push(partId);
    const part = partById.get(partId);
    lines.push({ kind: 'part', description: part ? `${part.number} ${part.description}` : 'Part', quantity: quantityByPart.get(partId)!, unitPriceMinor: unit ?? 0, taxRatePercent: basics.standardTaxRatePercent });
  }
  const labour = await manager.find(LabourEntryEntity, { where: { shopId, jobId }, order: { workedOn: 'ASC', createdAt: 'ASC' } });
  for (const l of labour) {
    const amount = toSafeMinorUnits(divideRoundHalfEven(BigInt(l.minutes) * BigInt(l.rateMinorPerHour), 60n));
    lines.push({ kind: 'labour', description: `Labour ${l.workedOn}: ${l.description}`, quantity: 1, unitPriceMinor: amount, taxRatePercent: basics.standardTaxRatePercent });
  }
  return { currency: basics.currency, lines, totals: documentTotals(lines, rounding), unpricedPartIds };
}
