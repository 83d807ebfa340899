import { divideRoundHalfAway } from './rounding';
import { parseDecimal, toSafeMinorUnits } from '../money/money';

/**
 * How a computed sell price is rounded: `up-to-N` rounds the unit price up to the next multiple of
 * N minor units; `whole-minus-1` to the smallest price ending one minor unit below a whole major
 * unit that is not below the computed price (12.34 → 12.99; 13.00 → 13.99; 12.99 stays).
 * Rounding only ever goes up, so a rounded price never falls below cost plus the markup.
 */
export const priceRoundings = ['none', 'up-to-5', 'up-to-10', 'up-to-50', 'up-to-100', 'whole-minus-1'] as const;
export type PriceRounding = (typeof priceRoundings)[number];

/** A shop's rules for sell prices. */
export interface PricingRules {
  /** Use a part's list price when it has one. */
  useListPrice: boolean;
  /** Cost plus this percent when no category or origin rule applies. */
  defaultMarkupPercent: number;
  /** Category (compared trimmed and case-insensitively) → markup percent. Checked first. */
  categoryMarkups: Record<string, number>;
  /** Part origin ('genuine' | 'reproduction' | 'pattern') → markup percent. Checked after the category. */
  originMarkups: Partial<Record<string, number>>;
  rounding: PriceRounding;
}

export const defaultPricingRules: PricingRules = {
  useListPrice: true,
  defaultMarkupPercent: 40,
  categoryMarkups: {},
  originMarkups: {},
  rounding: 'none',
};

export interface PricingInput {
  listPriceMinor: number | null;
  /** Unit cost (moving average) in minor units; may carry a fraction of a minor unit. */
  unitCostMinor: number | null;
  category: string | null;
  origin: string | null;
}

export type PriceBasis = 'list' | 'category-markup' | 'origin-markup' | 'default-markup' | 'no-price';

export interface SellPrice {
  unitMinor: number | null;
  basis: PriceBasis;
  /** The markup applied, for the markup bases. */
  markupPercent: number | null;
}

/** `minor` rounded up by the shop's rounding (minor units per major unit: 100 for two decimals). */
export function roundSellPrice(minor: number, rounding: PriceRounding, minorPerMajor = 100): number {
  if (minor <= 0) return minor;
  switch (rounding) {
    case 'none':
      return minor;
    case 'whole-minus-1': {
      const candidate = Math.ceil((minor + 1) / minorPerMajor) * minorPerMajor - 1;
      return candidate;
    }
    default: {
      const step = Number(rounding.slice('up-to-'.length));
      return Math.ceil(minor / step) * step;
    }
  }
}

function markupFor(input: PricingInput, rules: PricingRules): { basis: PriceBasis; percent: number } {
  const category = input.category?.trim().toLowerCase();
  if (category) {
    for (const [name, percent] of Object.entries(rules.categoryMarkups)) {
      if (name.trim().toLowerCase() === category) return { basis: 'category-markup', percent };
    }
  }
  const byOrigin = input.origin ? rules.originMarkups[input.origin] : undefined;
  if (byOrigin !== undefined) return { basis: 'origin-markup', percent: byOrigin };
  return { basis: 'default-markup', percent: rules.defaultMarkupPercent };
}

/**
 * A part's unit sell price under the shop's rules: its list price when it has one and the shop
 * uses list prices; otherwise cost plus the markup of its category, else its origin, else the
 * default — computed exactly, rounded half away from zero to a minor unit, then up by the shop's
 * rounding. No list price and no cost → no price (the line must be priced by hand).
 */
export function sellPrice(input: PricingInput, rules: PricingRules, minorPerMajor = 100): SellPrice {
  if (rules.useListPrice && input.listPriceMinor !== null) {
    return { unitMinor: input.listPriceMinor, basis: 'list', markupPercent: null };
  }
  if (input.unitCostMinor === null) return { unitMinor: null, basis: 'no-price', markupPercent: null };
  const { basis, percent } = markupFor(input, rules);
  const cost = parseDecimal(input.unitCostMinor);
  const factor = parseDecimal(percent);
  // cost × (100 + percent) / 100, on exact decimals.
  const hundred = 100n * 10n ** BigInt(factor.scale);
  const numerator = cost.coefficient * (hundred + factor.coefficient);
  const denominator = 10n ** BigInt(cost.scale) * hundred;
  const exact = toSafeMinorUnits(divideRoundHalfAway(numerator, denominator));
  return { unitMinor: roundSellPrice(exact, rules.rounding, minorPerMajor), basis, markupPercent: percent };
}
