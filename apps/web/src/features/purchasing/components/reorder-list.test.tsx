import type { PurchaseOrder, ReorderListResponse } from '@tappet/contracts';
import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { Me } from '../../../lib/auth';
import { installFakeApi, meFixture, ownerOfA, shopA } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';

const slow = { timeout: 5000 };
afterEach(() => vi.unstubAllGlobals());

const part = 'aaaaaaaa-0000-4000-8000-000000000011';
const older = 'aaaaaaaa-0000-4000-8000-000000000010';
const supplier = 'bbbbbbbb-0000-4000-8000-000000000001';
const orderId = 'cccccccc-0000-4000-8000-000000000001';

const list: ReorderListResponse = {
  generatedAt: '2026-01-15T09:00:00.000Z',
  settings: { demandWindowDays: 30, deadStockDays: 365, serviceLevel: 0.95, orderingCostMinor: 2500, holdingCostRatePercent: 25, currency: 'GBP' },
  suggestions: [
    {
      partId: part,
      partNumber: 'CR-4411',
      description: 'Clutch plate, friction, bonded',
      supplierId: supplier,
      supplierName: 'Marrick Spares',
      listingId: 'dddddddd-0000-4000-8000-000000000001',
      method: 'statistical',
      demand: { windowDays: 30, total: 60, meanPerDay: 2, sdPerDay: 0, fedBy: [{ partId: older, number: 'CR-4410', quantity: 60, ownDemandOnly: true }] },
      leadTime: { days: 7, sdDays: null },
      serviceLevel: 0.95,
      z: 1.6448536269514722,
      model: 'variable_demand',
      safetyStock: 0,
      reorderPoint: 14,
      eoq: 170.88,
      supply: { free: 0, onOrder: 0, substitutes: 14, position: 14 },
      wanted: 170.88,
      quantity: 174,
      packSize: 6,
      minOrderQty: 12,
      unitPriceMinor: 500,
      valueMinor: 87_000,
      currency: 'GBP',
      reasons: ['Demand includes issues under CR-4410, which resolve to CR-4411.', 'Rounded up from 170.88 to 174 for packs of 6 and a minimum order of 12.'],
      history: Array.from({ length: 30 }, (_, i) => ({ date: `2025-12-${String(i + 1).padStart(2, '0')}`, byNumber: { 'CR-4410': 2 } })),
    },
  ],
  specialOrders: [],
  groups: [{ supplierId: supplier, supplierName: 'Marrick Spares', currency: 'GBP', totalMinor: 87_000, minOrderValueMinor: 100_000, shortfallMinor: 13_000, partIds: [part], specialOrderIds: [] }],
  slowMovers: [],
  deadStock: [],
};

function draft(overrides: Partial<PurchaseOrder> = {}): PurchaseOrder {
  return {
    id: orderId,
    number: 7,
    reference: 'PO-000007',
    supplierId: supplier,
    supplierName: 'Marrick Spares',
    supplierEmail: 'orders@marrick-spares.test',
    status: 'draft',
    currency: 'GBP',
    shopCurrency: 'GBP',
    exchangeRate: '1',
    totalMinor: 87_000,
    totalShopMinor: 87_000,
    note: null,
    approvalRequestedAt: null,
    approvedAt: null,
    rejectionReason: null,
    sentAt: null,
    closedReason: null,
    createdAt: '2026-01-15T09:00:00.000Z',
    updatedAt: '2026-01-15T09:00:00.000Z',
    lines: [
      { id: 'eeeeeeee-0000-4000-8000-000000000001', position: 1, partId: part, partNumber: 'CR-4411', supplierNumber: null, description: 'Clutch plate', quantity: 174, receivedQuantity: 0, cancelledQuantity: 0, outstandingQuantity: 174, unitPriceMinor: 500, coreDepositMinor: 0, lineTotalMinor: 87_000, purpose: null, specialOrderId: null },
    ],
    receipts: [],
    ...overrides,
  };
}

function install(handlers: Parameters<typeof installFakeApi>[0], me: Me = ownerOfA()) {
  return installFakeApi({ 'GET /me': () => ({ body: me }), 'POST /me/active-shop': () => ({ body: me }), ...handlers });
}

describe('the reorder list', () => {
  it('explains a suggestion, shows the shortfall, and drafts an order for the chosen parts', async () => {
    const user = userEvent.setup();
    const { requests } = install({
      [`GET /shops/${shopA}/purchasing/reorder-list`]: () => ({ body: list }),
      [`POST /shops/${shopA}/purchasing/orders/from-reorder`]: () => ({ status: 201, body: { orders: [draft()], skipped: [] } }),
      [`GET /shops/${shopA}/purchasing/orders/${orderId}`]: () => ({ body: draft() }),
    });
    renderApp(`/shops/${shopA}/purchasing/reorder`);
    expect(await screen.findByRole('heading', { name: 'Marrick Spares' }, slow)).toBeInTheDocument();
    expect(screen.getByText('£130.00 short of the £1,000.00 minimum order')).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Explain CR-4411' }));
    expect(screen.getByText('Demand includes issues under CR-4410, which resolve to CR-4411.')).toBeInTheDocument();
    expect(screen.getByRole('img', { name: /Demand per week for CR-4411/ })).toBeInTheDocument();
    expect(screen.getByText(/its own stock covers only demand under this number/)).toBeInTheDocument();

    const draftButton = screen.getByRole('button', { name: 'Draft orders for 0 selected' });
    expect(draftButton).toBeDisabled();
    await user.click(screen.getByRole('checkbox', { name: 'Order CR-4411' }));
    await user.click(screen.getByRole('button', { name: 'Draft orders for 1 selected' }));
    expect(await screen.findByRole('heading', { name: 'Purchase order PO-000007' }, slow)).toBeInTheDocument();
    expect(requests.find((r) => r.method === 'POST' && r.path.endsWith('/from-reorder'))?.body).toEqual({ partIds: [part], specialOrderIds: [] });
  }, 20_000);

  it('lists a job’s special order and drafts it with the special order chosen', async () => {
    const user = userEvent.setup();
    const specialOrderId = 'ffffffff-0000-4000-8000-000000000001';
    const jobId = 'ffffffff-0000-4000-8000-000000000002';
    const withSpecial: ReorderListResponse = {
      ...list,
      suggestions: [],
      specialOrders: [
        {
          specialOrderId,
          jobId,
          jobNumber: 12,
          partId: part,
          partNumber: 'CR-4411',
          description: 'Clutch plate, friction, bonded',
          needed: 1,
          quantity: 6,
          free: 0,
          supplierId: supplier,
          supplierName: 'Marrick Spares',
          unitPriceMinor: 500,
          valueMinor: 3000,
          currency: 'GBP',
          requestedAt: '2026-01-14T10:00:00.000Z',
        },
      ],
      groups: [{ ...list.groups[0]!, partIds: [], specialOrderIds: [specialOrderId], totalMinor: 3000 }],
    };
    const { requests } = install({
      [`GET /shops/${shopA}/purchasing/reorder-list`]: () => ({ body: withSpecial }),
      [`POST /shops/${shopA}/purchasing/orders/from-reorder`]: () => ({ status: 201, body: { orders: [draft()], skipped: [] } }),
      [`GET /shops/${shopA}/purchasing/orders/${orderId}`]: () => ({ body: draft() }),
    });
    renderApp(`/shops/${shopA}/purchasing/reorder`);
    expect(await screen.findByRole('heading', { name: 'Special orders for jobs' }, slow)).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Job 12' })).toBeInTheDocument();
    expect(screen.getByText('rounded up to the pack')).toBeInTheDocument();
    await user.click(screen.getByRole('checkbox', { name: 'Order CR-4411 for job 12' }));
    await user.click(screen.getByRole('button', { name: 'Draft orders for 1 selected' }));
    expect(await screen.findByRole('heading', { name: 'Purchase order PO-000007' }, slow)).toBeInTheDocument();
    expect(requests.find((r) => r.method === 'POST' && r.path.endsWith('/from-reorder'))?.body).toEqual({ partIds: [], specialOrderIds: [specialOrderId] });
  }, 20_000);
});

describe('an order page', () => {
  it('offers a buyer over the limit approval, not sending', async () => {
    const buyer = meFixture({}, [{ shopId: shopA, shopName: 'Harbour Works', role: 'buyer', spendingLimitMinor: 50_000 }]);
    install({ [`GET /shops/${shopA}/purchasing/orders/${orderId}`]: () => ({ body: draft() }) }, buyer);
    renderApp(`/shops/${shopA}/purchasing/orders/${orderId}`);
    expect(await screen.findByRole('button', { name: 'Ask for approval' }, slow)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Send to supplier' })).not.toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Approve' })).not.toBeInTheDocument();
  });

  it('changes the lines of a draft: a quantity, a price, a line removed and one added', async () => {
    const user = userEvent.setup();
    const second = 'aaaaaaaa-0000-4000-8000-000000000012';
    const twoLines = draft({
      lines: [
        draft().lines[0]!,
        { ...draft().lines[0]!, id: 'eeeeeeee-0000-4000-8000-000000000002', position: 2, partId: older, partNumber: 'CR-4410', quantity: 2, outstandingQuantity: 2, lineTotalMinor: 1000 },
      ],
    });
    const { requests } = install({
      [`GET /shops/${shopA}/purchasing/orders/${orderId}`]: () => ({ body: twoLines }),
      [`GET /shops/${shopA}/purchasing/suppliers/${supplier}/listings`]: () => ({ body: { listings: [] } }),
      [`GET /shops/${shopA}/lineage/resolve?number=GS-7`]: () => ({
        body: {
          query: 'GS-7',
          part: { id: second, number: 'GS-7', key: 'GS7', description: 'Gasket set', origin: 'genuine', maker: null, category: null, unit: 'each', status: 'available', notes: null, supplierNumbers: [], createdAt: '2026-01-01T00:00:00.000Z', updatedAt: '2026-01-01T00:00:00.000Z' },
          current: [],
          canFill: [],
          problems: [],
        },
      }),
      [`PATCH /shops/${shopA}/purchasing/orders/${orderId}`]: () => ({ body: twoLines }),
    });
    renderApp(`/shops/${shopA}/purchasing/orders/${orderId}`);
    await user.click(await screen.findByRole('button', { name: 'Change lines…' }, slow));
    const dialog = await screen.findByRole('dialog', { name: 'Change PO-000007' });
    expect(dialog).toBeInTheDocument();
    const qty = screen.getByLabelText('Quantity, line 1');
    await user.clear(qty);
    await user.type(qty, '180');
    const price = screen.getByLabelText('Unit price (GBP), line 1');
    await user.clear(price);
    await user.type(price, '4.75');
    await user.click(screen.getByRole('button', { name: 'Remove line 2' }));
    await user.click(screen.getByRole('button', { name: 'Add a line' }));
    await user.type(screen.getByLabelText('Part number, line 2'), 'GS-7');
    // A hand-written line for a part the supplier does not list needs its price.
    await user.type(screen.getByLabelText('Quantity, line 2'), '3');
    await user.click(screen.getByRole('button', { name: 'Save lines' }));
    expect(await screen.findByText('Marrick Spares does not list this part: enter its price.')).toBeInTheDocument();
    expect(requests.some((r) => r.method === 'PATCH')).toBe(false);
    await user.type(screen.getByLabelText('Unit price (GBP), line 2'), '12.00');
    await user.click(screen.getByRole('button', { name: 'Save lines' }));
    await vi.waitFor(() => expect(requests.some((r) => r.method === 'PATCH')).toBe(true));
    expect(requests.find((r) => r.method === 'PATCH')?.body).toEqual({
      lines: [
        { partId: part, quantity: 180, unitPriceMinor: 475, coreDepositMinor: 0, purpose: null, specialOrderId: null },
        { partId: second, quantity: 3, unitPriceMinor: 1200, coreDepositMinor: 0, purpose: null, specialOrderId: null },
      ],
      note: null,
    });
  }, 20_000);

  it('picks the line a scanned code names on the receiving form', async () => {
    const user = userEvent.setup();
    const sent = draft({ status: 'sent', lines: [{ ...draft().lines[0]!, supplierNumber: 'MARRICK 411' }] });
    install({
      [`GET /shops/${shopA}/purchasing/orders/${orderId}`]: () => ({ body: sent }),
      [`GET /shops/${shopA}/purchasing/suppliers/${supplier}/listings`]: () => ({ body: { listings: [] } }),
      [`GET /shops/${shopA}/stock/bins`]: () => ({ body: { bins: [{ id: 'abababab-0000-4000-8000-000000000001', code: 'C-07', description: null, active: true, onHand: 0, lineCount: 0 }] } }),
    });
    renderApp(`/shops/${shopA}/purchasing/orders/${orderId}`);
    await user.click(await screen.findByRole('button', { name: 'Receive goods…' }, slow));
    const scan = await screen.findByLabelText('Scan or type a part number');
    await user.type(scan, 'marrick-411{Enter}');
    expect(screen.getByText('CR-4411: 174 outstanding.')).toBeInTheDocument();
    expect(screen.getByLabelText('Quantity of CR-4411 received')).toHaveFocus();
    await user.type(screen.getByLabelText('Scan or type a part number'), 'XX-1{Enter}');
    expect(screen.getByText('Nothing outstanding on PO-000007 matches XX-1.')).toBeInTheDocument();
    // The dialog is still open: Enter in the scan field never submits the receipt.
    expect(screen.getByRole('dialog', { name: 'Receive against PO-000007' })).toBeInTheDocument();
  }, 20_000);

  it('lets the same buyer send an order within the limit', async () => {
    const buyer = meFixture({}, [{ shopId: shopA, shopName: 'Harbour Works', role: 'buyer', spendingLimitMinor: 50_000 }]);
    install({ [`GET /shops/${shopA}/purchasing/orders/${orderId}`]: () => ({ body: draft({ totalMinor: 3000, totalShopMinor: 3000 }) }) }, buyer);
    renderApp(`/shops/${shopA}/purchasing/orders/${orderId}`);
    expect(await screen.findByRole('button', { name: 'Send to supplier' }, slow)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Ask for approval' })).not.toBeInTheDocument();
  });
});
