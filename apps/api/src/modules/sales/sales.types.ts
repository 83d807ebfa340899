import type { invoiceKinds, invoiceSources, invoiceStatuses, lineKinds, paymentMethods } from '@tappet/contracts';

export type InvoiceKind = (typeof invoiceKinds)[number];
export type InvoiceStatus = (typeof invoiceStatuses)[number];
export type InvoiceSource = (typeof invoiceSources)[number];
export type LineKind = (typeof lineKinds)[number];
export type PaymentMethod = (typeof paymentMethods)[number];
