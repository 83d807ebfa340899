import { supplierListResponseSchema, type Supplier } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { purchasingApi, purchasingKey } from './keys';

/** GET /api/shops/:shopId/purchasing/suppliers. */
export function getSuppliers(shopId: string, signal?: AbortSignal): Promise<{ suppliers: Supplier[] }> {
  return api.get(`${purchasingApi(shopId)}/suppliers`, { schema: supplierListResponseSchema, signal });
}

export function suppliersQueryOptions(shopId: string) {
  return queryOptions({ queryKey: [...purchasingKey(shopId), 'suppliers'], queryFn: ({ signal }) => getSuppliers(shopId, signal) });
}

export function useSuppliers(shopId: string) {
  return useQuery(suppliersQueryOptions(shopId));
}
