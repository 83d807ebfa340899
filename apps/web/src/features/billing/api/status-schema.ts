// The billing notice's response schema, loaded on demand: the notice is on every shop screen, and
// zod should not be in their first download (docs/decisions/022-first-load.md).
export { billingStatusSchema } from '@tappet/contracts';
