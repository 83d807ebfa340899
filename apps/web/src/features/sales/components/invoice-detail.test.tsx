import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { Invoice, ShopRole } from '@tappet/contracts';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, meFixture, shopA } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';

const slow = { timeout: 15_000 };
const invoiceId = '44444444-4444-4444-8444-444444444444';

function draft(overrides: Partial<Invoice> = {}): Invoice {
  return {
    id: invoiceId, kind: 'invoice', status: 'draft', paymentStatus: 'unpaid', number: null, source: 'job', customerId: null, customerName: 'Nell Ashcombe', currency: 'GBP',
    netMinor: 10550, taxMinor: 2053, grossMinor: 12603, paidMinor: 0, dueMinor: 12603, overpaidMinor: 0, issuedAt: null, createdAt: '2026-01-15T09:00:00.000Z',
    customerEmail: 'nell@ashcombe.test', customerAddress: null, notes: null, jobId: null, jobNumber: null, vehicleId: null, creditedInvoiceId: null, creditedInvoiceNumber: null,
    creditReason: null, creditNotes: [], taxRounding: 'per-line', creditedMinor: 0, emailedAt: null, payments: [],
    lines: [
      { id: 'l1', position: 1, kind: 'labour', partId: null, partNumber: null, description: 'Clutch adjustment', quantity: '1.5', unitPriceMinor: 6000, listedUnitPriceMinor: 6000, priceOverridden: false, discountPercent: 0, taxRatePercent: 20, netMinor: 9000, taxMinor: 1800, grossMinor: 10800, creditedLineId: null },
      { id: 'l2', position: 2, kind: 'other', partId: null, partNumber: null, description: 'Workshop manual reprint', quantity: '1', unitPriceMinor: 1550, listedUnitPriceMinor: 1800, priceOverridden: true, discountPercent: 0, taxRatePercent: 5, netMinor: 1550, taxMinor: 78, grossMinor: 1628, creditedLineId: null },
    ],
    taxByRate: [
      { ratePercent: 20, netMinor: 9000, taxMinor: 1800 },
      { ratePercent: 5, netMinor: 1550, taxMinor: 78 },
    ],
    ...overrides,
  } as Invoice;
}

const me = (role: ShopRole) => meFixture({}, [{ shopId: shopA, shopName: 'Harbour Works', role, spendingLimitMinor: null }]);

afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

describe('invoice page', () => {
  it('shows tax per rate and a hand-set price, and issues only after confirmation', async () => {
    const user = userEvent.setup();
    const { requests } = installFakeApi({
      'GET /me': () => ({ body: me('owner') }),
      [`GET /shops/${shopA}/sales/invoices/${invoiceId}`]: () => ({ body: draft() }),
      [`POST /shops/${shopA}/sales/invoices/${invoiceId}/issue`]: () => ({ body: { ...draft({ status: 'issued', number: 'INV-00007', issuedAt: '2026-01-16T09:00:00.000Z' }), emailed: true } }),
    });
    renderApp(`/shops/${shopA}/sales/invoices/${invoiceId}`);
    const totals = await screen.findByRole('region', { name: 'Totals' }, slow);
    expect(totals).toHaveTextContent('Tax at 20 % on £90.00');
    expect(totals).toHaveTextContent('Tax at 5 % on £15.50');
    expect(within(screen.getByRole('table', { name: /Lines of/ })).getByText(/price set by hand, listed £18.00/)).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Issue invoice' }));
    const dialog = screen.getByRole('dialog', { name: 'Issue this invoice?' });
    expect(requests.some((r) => r.method === 'POST')).toBe(false);
    await user.click(within(dialog).getByRole('button', { name: 'Issue' }));
    await vi.waitFor(() => expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ sendEmail: true }));
  }, 20_000);

  it('lets a viewer read but offers no issue, payment or credit', async () => {
    installFakeApi({
      'GET /me': () => ({ body: me('viewer') }),
      [`GET /shops/${shopA}/sales/invoices/${invoiceId}`]: () => ({ body: draft({ status: 'issued', number: 'INV-00007' }) }),
    });
    renderApp(`/shops/${shopA}/sales/invoices/${invoiceId}`);
    expect(await screen.findByRole('heading', { level: 1, name: 'Invoice INV-00007' }, slow)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Issue invoice' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Record payment' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Take card payment' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Credit note' })).not.toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'PDF' })).toHaveAttribute('href', `/api/shops/${shopA}/sales/invoices/${invoiceId}/pdf`);
  }, 20_000);

  it('says when an invoice is paid beyond its total, and what to do about it', async () => {
    installFakeApi({
      'GET /me': () => ({ body: me('owner') }),
      [`GET /shops/${shopA}/sales/invoices/${invoiceId}`]: () => ({ body: draft({ status: 'issued', number: 'INV-00007', paymentStatus: 'paid', paidMinor: 25206, dueMinor: 0, overpaidMinor: 12603 }) }),
    });
    renderApp(`/shops/${shopA}/sales/invoices/${invoiceId}`);
    const notice = await screen.findByText(/Paid £126.03 more than the total/, {}, slow);
    expect(notice.closest('[role="status"]')).toHaveTextContent(/Refund the difference/);
    const summary = screen.getByRole('region', { name: 'Summary' });
    expect(within(summary).getByText('Overpaid').nextElementSibling).toHaveTextContent('£126.03');
  }, 20_000);
});
