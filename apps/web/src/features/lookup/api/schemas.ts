// The lookup screen's response schemas, loaded on demand so zod is not in the screen's first
// download (docs/decisions/022-first-load.md).
export { partListResponseSchema, partSearchResponseSchema } from '@tappet/contracts';
