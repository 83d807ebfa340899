import { divideRoundHalfAway } from './rounding';
import { parseDecimal, toSafeMinorUnits } from '../money/money';

/**
 * Where tax is rounded on a document (decision 015):
 * - `per-line`: each line's tax is rounded to a minor unit, and the document's tax is their sum;
 * - `per-document`: the lines' nets are summed per tax rate and each rate's tax is rounded once.
 * Both round half away from zero. The two can differ by a minor unit or so per line; a shop picks
 * the one its tax authority and accountant expect.
 */
export const taxRoundings = ['per-line', 'per-document'] as const;
export type TaxRounding = (typeof taxRoundings)[number];

export interface DocumentLineInput {
  /** Decimal quantity (parts or hours), as text or a number; negative on a credit line. */
  quantity: string | number;
  unitPriceMinor: number;
  /** 0–100; optional. */
  discountPercent?: number;
  taxRatePercent: number;
}

export interface DocumentLineTotals {
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
}

export interface DocumentTotals {
  lines: DocumentLineTotals[];
  netMinor: number;
  taxMinor: number;
  grossMinor: number;
  /** One entry per tax rate used, in order of first use. */
  taxByRate: { ratePercent: number; netMinor: number; taxMinor: number }[];
}

/** A line's net: quantity × unit price × (1 − discount), exact, rounded once. */
export function lineNetMinor(line: Pick<DocumentLineInput, 'quantity' | 'unitPriceMinor' | 'discountPercent'>): number {
  if (!Number.isSafeInteger(line.unitPriceMinor)) throw new RangeError('The unit price must be whole minor units.');
  const quantity = parseDecimal(line.quantity);
  const discount = parseDecimal(line.discountPercent ?? 0);
  if (discount.coefficient < 0n || discount.coefficient > 100n * 10n ** BigInt(discount.scale)) {
    throw new RangeError('A discount is 0 to 100 percent.');
  }
  const hundred = 100n * 10n ** BigInt(discount.scale);
  const numerator = BigInt(line.unitPriceMinor) * quantity.coefficient * (hundred - discount.coefficient);
  const denominator = 10n ** BigInt(quantity.scale) * hundred;
  return toSafeMinorUnits(divideRoundHalfAway(numerator, denominator));
}

function taxOn(netMinor: number, ratePercent: number): number {
  const rate = parseDecimal(ratePercent);
  if (rate.coefficient < 0n) throw new RangeError('A tax rate cannot be negative.');
  return toSafeMinorUnits(divideRoundHalfAway(BigInt(netMinor) * rate.coefficient, 100n * 10n ** BigInt(rate.scale)));
}

/** Net, tax and gross of a document's lines, with tax per rate, under the shop's tax rounding. */
export function documentTotals(lines: readonly DocumentLineInput[], rounding: TaxRounding): DocumentTotals {
  const byRate = new Map<number, { netMinor: number; lineTaxMinor: number }>();
  const lineTotals = lines.map((line) => {
    const netMinor = lineNetMinor(line);
    const taxMinor = taxOn(netMinor, line.taxRatePercent);
    const entry = byRate.get(line.taxRatePercent) ?? { netMinor: 0, lineTaxMinor: 0 };
    entry.netMinor += netMinor;
    entry.lineTaxMinor += taxMinor;
    byRate.set(line.taxRatePercent, entry);
    return { netMinor, taxMinor, grossMinor: netMinor + taxMinor };
  });
  const taxByRate = [...byRate].map(([ratePercent, entry]) => ({
    ratePercent,
    netMinor: entry.netMinor,
    taxMinor: rounding === 'per-line' ? entry.lineTaxMinor : taxOn(entry.netMinor, ratePercent),
  }));
  const netMinor = taxByRate.reduce((sum, r) => sum + r.netMinor, 0);
  const taxMinor = taxByRate.reduce((sum, r) => sum + r.taxMinor, 0);
  for (const total of [netMinor, taxMinor, netMinor + taxMinor]) {
    if (!Number.isSafeInteger(total)) throw new RangeError('The document total is too large.');
  }
  return { lines: lineTotals, netMinor, taxMinor, grossMinor: netMinor + taxMinor, taxByRate };
}
