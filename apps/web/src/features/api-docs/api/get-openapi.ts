import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { openApiDocumentSchema, type OpenApiDocument } from '../lib/openapi';

/** GET /api/openapi.json: the API's OpenAPI 3 document, generated from the shared contracts. */
export function getOpenApi(signal?: AbortSignal): Promise<OpenApiDocument> {
  return api.get('/openapi.json', { schema: openApiDocumentSchema, signal });
}

// Not shop data: the same document for everyone, so no shop prefix.
export function openApiQueryOptions() {
  return queryOptions({ queryKey: ['openapi'], queryFn: ({ signal }) => getOpenApi(signal), staleTime: 10 * 60_000 });
}

export function useOpenApi() {
  return useQuery(openApiQueryOptions());
}
