import { varianceReportSchema, type VarianceReport } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { countsApi, countsKey } from './keys';

/** GET /api/shops/:shopId/counts/:countId/variances: quantity and value differences. */
export function getVariances(shopId: string, countId: string, signal?: AbortSignal): Promise<VarianceReport> {
  return api.get(`${countsApi(shopId)}/${encodeURIComponent(countId)}/variances`, { schema: varianceReportSchema, signal });
}

export function variancesQueryOptions(shopId: string, countId: string) {
  return queryOptions({ queryKey: [...countsKey(shopId), 'variances', countId], queryFn: ({ signal }) => getVariances(shopId, countId, signal) });
}

export function useVariances(shopId: string, countId: string) {
  return useQuery(variancesQueryOptions(shopId, countId));
}
