import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MarginsByPeriod, ReportPeriod, SalesByPeriod, UnpaidByAge } from '@tappet/contracts';
import { env } from '../../../config/env';
import { api } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';

const base = (shopId: string) => `/shops/${encodeURIComponent(shopId)}/sales-reports`;
const key = (shopId: string) => shopQueryKey(shopId, 'sales-reports');
export interface ReportWindow {
  period: ReportPeriod;
  from?: string;
  to?: string;
}
const qs = (w: ReportWindow) => new URLSearchParams({ period: w.period, ...(w.from ? { from: w.from } : {}), ...(w.to ? { to: w.to } : {}) }).toString();

/** GET /api/shops/:shopId/sales-reports/sales */
export const useSalesByPeriod = (shopId: string, w: ReportWindow) =>
  useQuery(queryOptions({ queryKey: [...key(shopId), 'sales', w], queryFn: ({ signal }) => api.get<SalesByPeriod>(`${base(shopId)}/sales?${qs(w)}`, { signal }) }));
/** GET /api/shops/:shopId/sales-reports/margins (owners only) */
export const useMargins = (shopId: string, w: ReportWindow, enabled: boolean) =>
  useQuery({ ...queryOptions({ queryKey: [...key(shopId), 'margins', w], queryFn: ({ signal }) => api.get<MarginsByPeriod>(`${base(shopId)}/margins?${qs(w)}`, { signal }) }), enabled });
/** GET /api/shops/:shopId/sales-reports/unpaid */
export const useUnpaid = (shopId: string) => useQuery(queryOptions({ queryKey: [...key(shopId), 'unpaid'], queryFn: ({ signal }) => api.get<UnpaidByAge>(`${base(shopId)}/unpaid`, { signal }) }));

export const salesCsvHref = (shopId: string, w: ReportWindow) => `${env.apiBaseUrl}${base(shopId)}/sales.csv?${qs(w)}`;
export const marginsCsvHref = (shopId: string, w: ReportWindow) => `${env.apiBaseUrl}${base(shopId)}/margins.csv?${qs(w)}`;
export const unpaidCsvHref = (shopId: string) => `${env.apiBaseUrl}${base(shopId)}/unpaid.csv`;
