import { listingListResponseSchema, type Listing } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { purchasingApi, purchasingKey } from './keys';

/** GET /api/shops/:shopId/purchasing/suppliers/:supplierId/listings. */
export function getListings(shopId: string, supplierId: string, signal?: AbortSignal): Promise<{ listings: Listing[] }> {
  return api.get(`${purchasingApi(shopId)}/suppliers/${encodeURIComponent(supplierId)}/listings`, { schema: listingListResponseSchema, signal });
}

export function listingsQueryOptions(shopId: string, supplierId: string) {
  return queryOptions({ queryKey: [...purchasingKey(shopId), 'listings', supplierId], queryFn: ({ signal }) => getListings(shopId, supplierId, signal) });
}

export function useListings(shopId: string, supplierId: string) {
  return useQuery({ ...listingsQueryOptions(shopId, supplierId), enabled: supplierId !== '' });
}
