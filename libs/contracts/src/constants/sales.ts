// Schema-free: screens import these values without pulling zod into their chunk (docs/decisions/024-mobile-first-load.md).

/** Where a part's sell price comes from, in the order the pricing rules try them. */
export const sellPriceBases = ['list', 'category-markup', 'origin-markup', 'default-markup', 'no-price'] as const;
export type SellPriceBasis = (typeof sellPriceBases)[number];
