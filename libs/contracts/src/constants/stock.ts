// Schema-free: screens import these values without pulling zod into their chunk (docs/decisions/024-mobile-first-load.md).

/** Condition belongs to the stock line: one genuine number can sit on the shelf as NOS and as used. */
export const stockConditions = ['new', 'nos', 'used_good', 'used_fair', 'reconditioned', 'core'] as const;
export type StockCondition = (typeof stockConditions)[number];

/** Words for people. */
export const stockConditionLabels: Record<StockCondition, string> = {
  new: 'New',
  nos: 'New old stock',
  used_good: 'Used, good',
  used_fair: 'Used, fair',
  reconditioned: 'Reconditioned',
  core: 'Core (for exchange)',
};

/** `average`: moving weighted-average cost; `specific`: serialised items, each at its own cost. */
export const valuationMethods = ['average', 'specific'] as const;
export type ValuationMethod = (typeof valuationMethods)[number];

export const holdStatuses = ['active', 'released', 'issued'] as const;
