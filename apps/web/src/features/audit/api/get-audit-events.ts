import { auditEventListResponseSchema, type AuditEventListResponse } from '@tappet/contracts';
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { env } from '../../../config/env';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';

/** The audit log's filters as the screen holds them (empty strings mean "any"). */
export interface AuditFilters {
  actor: string;
  entity: string;
  /** yyyy-mm-dd */
  from: string;
  /** yyyy-mm-dd, that whole day included */
  to: string;
}

export const emptyAuditFilters: AuditFilters = { actor: '', entity: '', from: '', to: '' };

/** The filters as a query string (only those set), shared by the list and the CSV link. */
export function auditFilterSearch(filters: AuditFilters, extra: Record<string, string> = {}): string {
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries({ ...filters, ...extra })) if (value) search.set(key, value);
  return search.toString();
}

/** GET /api/shops/:shopId/audit-events with filters and a page. */
export function getAuditEvents(shopId: string, filters: AuditFilters, page: number, pageSize: number, signal?: AbortSignal): Promise<AuditEventListResponse> {
  const search = auditFilterSearch(filters, { page: String(page), pageSize: String(pageSize) });
  return api.get(`/shops/${encodeURIComponent(shopId)}/audit-events?${search}`, { schema: auditEventListResponseSchema, signal });
}

export function auditEventsQueryOptions(shopId: string, filters: AuditFilters, page: number, pageSize = 50) {
  return queryOptions({
    queryKey: shopQueryKey(shopId, 'audit-events', filters, page, pageSize),
    queryFn: ({ signal }) => getAuditEvents(shopId, filters, page, pageSize, signal),
    // The log grows all the time; keep it fresh but do not blank the table between pages.
    staleTime: 0,
    placeholderData: keepPreviousData,
  });
}

export function useAuditEvents(shopId: string, filters: AuditFilters, page: number, pageSize = 50) {
  return useQuery(auditEventsQueryOptions(shopId, filters, page, pageSize));
}

/** The CSV download URL for the same filters (a plain link: the browser sends the session cookie). */
export function auditCsvHref(shopId: string, filters: AuditFilters): string {
  const search = auditFilterSearch(filters);
  return `${env.apiBaseUrl}/shops/${encodeURIComponent(shopId)}/audit-events.csv${search ? `?${search}` : ''}`;
}
