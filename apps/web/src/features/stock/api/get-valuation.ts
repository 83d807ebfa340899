import { valuationReportSchema, valueHistorySchema, type ValuationReport, type ValueHistory } from '@tappet/contracts';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { env } from '../../../config/env';
import { api } from '../../../lib/api-client';
import { searchOf, stockApi, stockKey } from './keys';

/** GET /api/shops/:shopId/stock/valuation: stock value by category, origin, condition and bin. */
export function getValuation(shopId: string, signal?: AbortSignal): Promise<ValuationReport> {
  return api.get(`${stockApi(shopId)}/valuation`, { schema: valuationReportSchema, signal });
}

export function valuationQueryOptions(shopId: string) {
  return queryOptions({ queryKey: [...stockKey(shopId), 'valuation'], queryFn: ({ signal }) => getValuation(shopId, signal) });
}

export function useValuation(shopId: string, options: { enabled?: boolean } = {}) {
  return useQuery({ ...valuationQueryOptions(shopId), enabled: options.enabled ?? true });
}

/** GET /api/shops/:shopId/stock/valuation/history: value at each month end and today. */
export function getValueHistory(shopId: string, months: number, signal?: AbortSignal): Promise<ValueHistory> {
  return api.get(`${stockApi(shopId)}/valuation/history${searchOf({ months })}`, { schema: valueHistorySchema, signal });
}

export function valueHistoryQueryOptions(shopId: string, months = 24) {
  return queryOptions({ queryKey: [...stockKey(shopId), 'valuation', 'history', months], queryFn: ({ signal }) => getValueHistory(shopId, months, signal) });
}

export function useValueHistory(shopId: string, months = 24) {
  return useQuery(valueHistoryQueryOptions(shopId, months));
}

/** The CSV export's URL (a plain download link: the session cookie goes with it). */
export function valuationCsvHref(shopId: string): string {
  return `${env.apiBaseUrl}${stockApi(shopId)}/valuation.csv`;
}
