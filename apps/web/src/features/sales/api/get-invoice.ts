import { invoiceSchema, type Invoice } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { salesApi, salesKey } from './keys';

/** GET /api/shops/:shopId/sales/invoices/:invoiceId: lines, tax per rate, payments, paid and due. */
export function getInvoice(shopId: string, invoiceId: string, signal?: AbortSignal): Promise<Invoice> {
  return api.get(`${salesApi(shopId)}/invoices/${encodeURIComponent(invoiceId)}`, { schema: invoiceSchema, signal });
}

export function invoiceQueryOptions(shopId: string, invoiceId: string) {
  return queryOptions({ queryKey: [...salesKey(shopId), 'invoice', invoiceId], queryFn: ({ signal }) => getInvoice(shopId, invoiceId, signal) });
}

export function useInvoice(shopId: string, invoiceId: string, options: { refetchInterval?: number | false } = {}) {
  return useQuery({ ...invoiceQueryOptions(shopId, invoiceId), refetchInterval: options.refetchInterval });
}

/** The URL of the PDF (opened in a new tab). */
export function invoicePdfHref(shopId: string, invoiceId: string): string {
  return `/api${salesApi(shopId)}/invoices/${encodeURIComponent(invoiceId)}/pdf`;
}
