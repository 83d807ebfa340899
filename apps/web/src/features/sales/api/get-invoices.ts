import { invoiceListResponseSchema, type InvoiceListResponse } from '@tappet/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { salesApi, salesKey } from './keys';

export interface InvoiceFilters {
  status?: 'draft' | 'issued' | 'unpaid' | 'part_paid' | 'paid';
  kind?: 'invoice' | 'credit_note';
  q?: string;
  from?: string;
  to?: string;
  page?: number;
}

/** GET /api/shops/:shopId/sales/invoices: invoices and credit notes, filtered. */
export function getInvoices(shopId: string, filters: InvoiceFilters, signal?: AbortSignal): Promise<InvoiceListResponse> {
  const query = new URLSearchParams();
  for (const [k, v] of Object.entries(filters)) if (v !== undefined && v !== '') query.set(k, String(v));
  query.set('pageSize', '50');
  return api.get(`${salesApi(shopId)}/invoices?${query.toString()}`, { schema: invoiceListResponseSchema, signal });
}

export function invoicesQueryOptions(shopId: string, filters: InvoiceFilters) {
  return queryOptions({ queryKey: [...salesKey(shopId), 'invoices', filters], queryFn: ({ signal }) => getInvoices(shopId, filters, signal), placeholderData: keepPreviousData });
}

export function useInvoices(shopId: string, filters: InvoiceFilters) {
  return useQuery(invoicesQueryOptions(shopId, filters));
}
