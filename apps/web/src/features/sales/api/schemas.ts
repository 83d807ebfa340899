// The sell prices' response schema, loaded on demand: the lookup's results show sell prices, and
// zod should not be in the lookup's first download (docs/decisions/024-mobile-first-load.md).
export { sellPricesResponseSchema } from '@tappet/contracts';
