// The part page's response schemas, loaded on demand: the page's data is asked for before its
// code has loaded, from the router, and zod stays out of the first download (docs/decisions/022-first-load.md).
export { lineageGraphResponseSchema, partDetailResponseSchema } from '@tappet/contracts';
