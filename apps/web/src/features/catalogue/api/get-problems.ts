import { catalogueProblemsResponseSchema } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';
import { shopApi } from './keys';

export type CatalogueProblems = z.infer<typeof catalogueProblemsResponseSchema>;

/** GET /api/shops/:shopId/catalogue/problems: every data problem of the shop's catalogue. */
export function getCatalogueProblems(shopId: string, signal?: AbortSignal): Promise<CatalogueProblems> {
  return api.get(`${shopApi(shopId)}/catalogue/problems`, { schema: catalogueProblemsResponseSchema, signal });
}

export function catalogueProblemsQueryOptions(shopId: string) {
  return queryOptions({
    queryKey: shopQueryKey(shopId, 'catalogue', 'problems'),
    queryFn: ({ signal }) => getCatalogueProblems(shopId, signal),
  });
}

export function useCatalogueProblems(shopId: string) {
  return useQuery(catalogueProblemsQueryOptions(shopId));
}
