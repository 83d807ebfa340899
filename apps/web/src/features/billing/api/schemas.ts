// The billing buttons' response schema, loaded on demand: the buttons are on every shop screen's
// notice, and zod should not be in their first download (docs/decisions/022-first-load.md).
export { redirectResponseSchema } from '@tappet/contracts';
