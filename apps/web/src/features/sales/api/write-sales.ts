import { cardCheckoutResponseSchema, invoiceSchema, salesSettingsSchema, type CardCheckoutResponse, type Invoice, type SalesSettings, type UpdateSalesSettings } from '@tappet/contracts';
import { z } from 'zod';
import { api, apiRequest } from '../../../lib/api-client';
import { salesApi } from './keys';

// The sales writes, one function per endpoint. Each success refreshes every sales query of the
// shop; counter sales move stock, so they refresh the stock queries too.

const invoice = (shopId: string, invoiceId: string) => `${salesApi(shopId)}/invoices/${encodeURIComponent(invoiceId)}`;
const withEmailed = invoiceSchema.extend({ emailed: z.boolean() });
export type InvoiceWithEmailed = z.infer<typeof withEmailed>;

export const updateSalesSettings = (shopId: string, input: UpdateSalesSettings) =>
  apiRequest<SalesSettings>(`${salesApi(shopId)}/settings`, { method: 'PUT', body: input, schema: salesSettingsSchema });
export const createInvoiceFromJob = (shopId: string, jobId: string) => api.post<Invoice>(`${salesApi(shopId)}/invoices/from-job`, { jobId }, { schema: invoiceSchema });
export const createInvoice = (shopId: string, input: Record<string, unknown>) => api.post<Invoice>(`${salesApi(shopId)}/invoices`, input, { schema: invoiceSchema });
export const updateInvoice = (shopId: string, input: { invoiceId: string; body: Record<string, unknown> }) => api.patch<Invoice>(invoice(shopId, input.invoiceId), input.body, { schema: invoiceSchema });
export const deleteDraft = (shopId: string, invoiceId: string) => api.delete<void>(invoice(shopId, invoiceId));
export const issueInvoice = (shopId: string, input: { invoiceId: string; sendEmail: boolean }) => api.post<InvoiceWithEmailed>(`${invoice(shopId, input.invoiceId)}/issue`, { sendEmail: input.sendEmail }, { schema: withEmailed });
export const creditInvoice = (shopId: string, input: { invoiceId: string; reason: string; lines?: Array<{ lineId: string; quantity: string }> }) =>
  api.post<InvoiceWithEmailed>(`${invoice(shopId, input.invoiceId)}/credit-notes`, { reason: input.reason, ...(input.lines ? { lines: input.lines } : {}) }, { schema: withEmailed });
export const recordPayment = (shopId: string, input: { invoiceId: string; method: 'cash' | 'bank_transfer'; amountMinor: number; receivedOn: string; reference: string | null }) =>
  api.post<Invoice>(`${invoice(shopId, input.invoiceId)}/payments`, { method: input.method, amountMinor: input.amountMinor, receivedOn: input.receivedOn, reference: input.reference }, { schema: invoiceSchema });
export const startCardCheckout = (shopId: string, input: { invoiceId: string; amountMinor?: number }) =>
  api.post<CardCheckoutResponse>(`${invoice(shopId, input.invoiceId)}/card-checkout`, input.amountMinor ? { amountMinor: input.amountMinor } : {}, { schema: cardCheckoutResponseSchema });
export const emailInvoice = (shopId: string, invoiceId: string) => api.post<{ emailed: boolean }>(`${invoice(shopId, invoiceId)}/email`);
export const counterSale = (shopId: string, input: Record<string, unknown>) => api.post<InvoiceWithEmailed>(`${salesApi(shopId)}/counter-sales`, input, { schema: withEmailed });

