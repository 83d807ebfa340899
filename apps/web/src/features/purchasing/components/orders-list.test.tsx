import { purchaseOrderListLimit, type Supplier } from '@tappet/contracts';
import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, ownerOfA, shopA } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';
import type { OrderSummary } from '../api/get-orders';

const slow = { timeout: 5000 };
afterEach(() => vi.unstubAllGlobals());

const marrick = 'bbbbbbbb-0000-4000-8000-000000000001';
const tolland = 'bbbbbbbb-0000-4000-8000-000000000002';

function supplier(id: string, name: string): Supplier {
  return { id, name, email: null, currency: 'GBP', leadTimeDays: 7, leadTimeSdDays: null, minOrderValueMinor: 0, notes: null, active: true, listingCount: 3, openOrderCount: 1, createdAt: '2026-01-02T09:00:00.000Z', updatedAt: '2026-01-02T09:00:00.000Z' };
}

function order(number: number, supplierId: string, supplierName: string): OrderSummary {
  return {
    id: `cccccccc-0000-4000-8000-${String(number).padStart(12, '0')}`,
    number,
    reference: `PO-${String(number).padStart(6, '0')}`,
    supplierId,
    supplierName,
    supplierEmail: null,
    status: 'sent',
    currency: 'GBP',
    shopCurrency: 'GBP',
    exchangeRate: '1',
    totalMinor: 12_500,
    totalShopMinor: 12_500,
    note: null,
    approvalRequestedAt: null,
    approvedAt: null,
    rejectionReason: null,
    sentAt: '2026-02-01T09:00:00.000Z',
    closedReason: null,
    createdAt: '2026-02-01T09:00:00.000Z',
    updatedAt: '2026-02-01T09:00:00.000Z',
    lineCount: 2,
  };
}

const api = `/shops/${shopA}/purchasing`;

function install() {
  return installFakeApi({
    'GET /me': () => ({ body: ownerOfA() }),
    'POST /me/active-shop': () => ({ body: ownerOfA() }),
    [`GET ${api}/suppliers`]: () => ({ body: { suppliers: [supplier(marrick, 'Marrick Spares'), supplier(tolland, 'Tolland Fittings')] } }),
    // More orders than one answer holds: the API sends the newest and says so.
    [`GET ${api}/orders`]: () => ({ body: { orders: [order(812, marrick, 'Marrick Spares'), order(811, tolland, 'Tolland Fittings')], truncated: true } }),
    [`GET ${api}/orders?supplierId=${tolland}`]: () => ({ body: { orders: [order(811, tolland, 'Tolland Fittings')], truncated: false } }),
    [`GET ${api}/orders?status=sent&supplierId=${tolland}`]: () => ({ body: { orders: [order(811, tolland, 'Tolland Fittings')] } }),
  });
}

describe('the purchase orders list', () => {
  it('says when it shows only the newest orders, and narrows by supplier and state', async () => {
    const user = userEvent.setup();
    const { requests } = install();
    renderApp(`/shops/${shopA}/purchasing/orders`);
    const table = await screen.findByRole('table', { name: 'Purchase orders' }, slow);
    expect(within(table).getByRole('link', { name: 'PO-000812' })).toBeInTheDocument();
    expect(screen.getByText(`Showing the newest ${purchaseOrderListLimit} orders. Pick a state or a supplier to see older ones.`)).toHaveAttribute('role', 'status');

    const suppliers = screen.getByRole('combobox', { name: 'Supplier' });
    await vi.waitFor(() => expect(suppliers).toBeEnabled());
    await user.selectOptions(suppliers, 'Tolland Fittings');
    await vi.waitFor(() => expect(screen.queryByRole('link', { name: 'PO-000812' })).not.toBeInTheDocument());
    expect(screen.getByRole('link', { name: 'PO-000811' })).toBeInTheDocument();
    expect(screen.queryByText(/Showing the newest/)).not.toBeInTheDocument();

    await user.selectOptions(screen.getByRole('combobox', { name: 'State' }), 'sent');
    await vi.waitFor(() => expect(requests.some((r) => r.path === `${api}/orders?status=sent&supplierId=${tolland}`)).toBe(true));
    expect(await screen.findByRole('link', { name: 'PO-000811' })).toBeInTheDocument();
  }, 20_000);
});
