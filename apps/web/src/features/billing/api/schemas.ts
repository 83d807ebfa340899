// The billing notice's response schemas, loaded on demand: the notice and its buttons are on every
// shop screen, and zod should not be in their first download (docs/decisions/022-first-load.md).
export { billingStatusSchema, redirectResponseSchema } from '@tappet/contracts';
