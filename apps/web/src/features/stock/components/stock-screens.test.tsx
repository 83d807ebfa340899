import type { StockListResponse } from '@tappet/contracts';
import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, meFixture, ownerOfA, shopA, type RecordedRequest } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';
import type { Me } from '../../../lib/auth';

const slow = { timeout: 5000 };
afterEach(() => vi.unstubAllGlobals());

const partId = 'aaaaaaaa-0000-4000-8000-000000000011';
const binA = 'cccccccc-0000-4000-8000-000000000001';
const binB = 'cccccccc-0000-4000-8000-000000000002';

const lines: StockListResponse = {
  lines: [{ partId, partNumber: '70-4411', partDescription: 'Footrest hanger', category: 'Frame & forks', origin: 'genuine', binId: binA, binCode: 'B-04', condition: 'new', onHand: 3, held: 1, free: 2 }],
  total: 1,
  page: 1,
  pageSize: 200,
};

type Handler = (request: RecordedRequest) => { status?: number; body?: unknown };

/** The fake API of a shop with one stock line and two bins; routes match without their query string. */
function installStockApi(extra: Record<string, Handler> = {}, me: Me = ownerOfA()) {
  const all: Record<string, Handler> = {
    'GET /me': () => ({ body: me }),
    'POST /me/active-shop': () => ({ body: me }),
    [`GET /shops/${shopA}/stock`]: () => ({ body: lines }),
    [`GET /shops/${shopA}/stock/bins`]: () => ({
      body: {
        bins: [
          { id: binA, code: 'B-04', description: 'Aisle B, shelf 4', active: true, onHand: 3, lineCount: 1 },
          { id: binB, code: 'C-01', description: null, active: true, onHand: 0, lineCount: 0 },
        ],
      },
    }),
    [`GET /shops/${shopA}/stock/valuation`]: () => ({ body: { currency: 'GBP', totalMinor: 4350, totalQuantity: 3, byCategory: [], byOrigin: [], byCondition: [], byBin: [] } }),
    ...extra,
  };
  return installFakeApi(new Proxy(all, { get: (target, key) => (typeof key === 'string' ? (target[key] ?? target[key.split('?')[0] ?? key]) : undefined) }));
}

const posts = (requests: RecordedRequest[], path: string) => requests.filter((r) => r.method === 'POST' && r.path === `/shops/${shopA}/stock${path}`);

describe('the stock screen', () => {
  it('receives stock typed by number, turning 12.50 into minor units, after saying what was missing', async () => {
    const user = userEvent.setup();
    const { requests } = installStockApi({
      [`GET /shops/${shopA}/lineage/resolve`]: () => ({ body: { query: '70-4411', part: { id: partId, number: '70-4411', key: '704411', description: 'Footrest hanger', origin: 'genuine', maker: null, category: null, unit: 'each', status: 'available', notes: null, supplierNumbers: [], createdAt: '2026-01-01T00:00:00.000Z', updatedAt: '2026-01-01T00:00:00.000Z' }, current: [], canFill: [], problems: [] } }),
      [`POST /shops/${shopA}/stock/receipts`]: () => ({ status: 201, body: { movements: [] } }),
    });
    renderApp(`/shops/${shopA}/stock`);
    await user.click(await screen.findByRole('button', { name: 'Receive stock' }, slow));
    const dialog = screen.getByRole('dialog', { name: 'Receive stock' });
    await user.click(within(dialog).getByRole('button', { name: 'Receive' }));
    expect(within(dialog).getByLabelText('Part number')).toHaveAccessibleDescription(/Enter the part number\./);
    expect(within(dialog).getByLabelText('Bin')).toHaveAccessibleDescription(/Choose a bin\./);
    expect(within(dialog).getByLabelText('Unit cost (GBP)')).toHaveAccessibleDescription(/Enter the unit cost\./);
    expect(posts(requests, '/receipts')).toHaveLength(0);

    await user.type(within(dialog).getByLabelText('Part number'), '70 4411');
    await user.selectOptions(within(dialog).getByLabelText('Bin'), 'B-04 — Aisle B, shelf 4');
    await user.type(within(dialog).getByLabelText('Quantity'), '3');
    await user.type(within(dialog).getByLabelText('Unit cost (GBP)'), '12.50');
    await user.click(within(dialog).getByRole('button', { name: 'Receive' }));
    await vi.waitFor(() => expect(posts(requests, '/receipts')).toHaveLength(1));
    expect(posts(requests, '/receipts')[0]!.body).toEqual({ partId, binId: binA, condition: 'new', quantity: 3, unitCostMinor: 1250, reference: null, note: null });
  }, 20_000);

  it('asks why before adjusting, and shows a refusal from the ledger in words', async () => {
    const user = userEvent.setup();
    const { requests } = installStockApi({
      [`POST /shops/${shopA}/stock/issues`]: () => ({ status: 409, body: { error: { code: 'conflict', message: 'Only 2 of 70-4411 free in that bin and condition.', details: { reason: 'insufficient_free_stock', free: 2 } } } }),
    });
    renderApp(`/shops/${shopA}/stock`);
    await user.click(await screen.findByRole('button', { name: 'More' }, slow));
    await user.click(screen.getByRole('menuitem', { name: 'Adjust 70-4411 from B-04' }));
    let dialog = screen.getByRole('dialog', { name: 'Adjust stock' });
    await user.type(within(dialog).getByLabelText('Change'), '-1');
    await user.click(within(dialog).getByRole('button', { name: 'Adjust' }));
    expect(within(dialog).getByLabelText('Reason')).toHaveAccessibleDescription(/Say why the stock is adjusted/);
    expect(posts(requests, '/adjustments')).toHaveLength(0);
    await user.keyboard('{Escape}');

    await user.click(screen.getByRole('button', { name: 'Issue 70-4411 from B-04' }));
    dialog = screen.getByRole('dialog', { name: 'Issue stock' });
    await user.type(within(dialog).getByLabelText('Quantity'), '3');
    await user.click(within(dialog).getByRole('button', { name: 'Issue' }));
    expect(await within(dialog).findByText('Only 2 of 70-4411 free in that bin and condition.')).toBeInTheDocument();
    expect(within(dialog).getByLabelText('Quantity')).toHaveValue('3');
  }, 20_000);

  it('shows a viewer the stock but no way to move it', async () => {
    installStockApi({}, meFixture({}, [{ shopId: shopA, shopName: 'Harbour Works', role: 'viewer', spendingLimitMinor: null }]));
    renderApp(`/shops/${shopA}/stock`);
    const table = await screen.findByRole('table', { name: 'Stock per part, bin and condition' }, slow);
    expect(within(table).getByText('70-4411')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Receive stock' })).not.toBeInTheDocument();
    expect(within(table).queryAllByRole('button', { name: /Issue|Hold|More/ })).toEqual([]);
  });
});

describe('the held stock screen', () => {
  const hold = (n: number) => ({
    id: `dddddddd-0000-4000-8000-${String(n).padStart(12, '0')}`,
    partId,
    partNumber: '70-4411',
    partDescription: 'Footrest hanger',
    binId: binA,
    binCode: 'B-04',
    condition: 'new' as const,
    quantity: 1,
    purpose: `Job ${n}`,
    jobId: null,
    status: 'active' as const,
    createdAt: '2026-01-15T09:00:00.000Z',
    createdByName: 'Pat Example',
    closedAt: null,
  });

  it('pages through the API, keeps the page in the address, and says how many holds there are', async () => {
    const user = userEvent.setup();
    const { requests } = installStockApi({
      [`GET /shops/${shopA}/stock/holds`]: (r) => {
        const page = Number(new URLSearchParams(r.path.split('?')[1]).get('page'));
        const rows = Array.from({ length: page === 1 ? 50 : 10 }, (_, i) => hold((page - 1) * 50 + i + 1));
        return { body: { holds: rows, total: 60, page, pageSize: 50 } };
      },
    });
    const { router } = renderApp(`/shops/${shopA}/stock/holds`);
    const nav = await screen.findByRole('navigation', { name: 'Pages of held stock' }, slow);
    expect(within(nav).getByRole('status')).toHaveTextContent('Holds 1–50 of 60');
    expect(requests.some((r) => r.path === `/shops/${shopA}/stock/holds?status=active&page=1&pageSize=50`)).toBe(true);
    await user.click(within(nav).getByRole('button', { name: 'Next page' }));
    await vi.waitFor(() => expect(within(nav).getByRole('status')).toHaveTextContent('Holds 51–60 of 60'));
    expect(router.state.location.search).toBe('?page=2');
    const table = screen.getByRole('table', { name: 'Stock held, longest held first' });
    expect(table).toHaveTextContent('Job 60');
    // One page of many keeps the API's order: no sort buttons that would sort this page alone.
    expect(within(table).queryAllByRole('button', { name: /sort/i })).toEqual([]);
    expect(within(table).getAllByRole('columnheader').every((h) => !h.hasAttribute('aria-sort'))).toBe(true);
  });

  it('offers the first page when the page asked for has no holds left', async () => {
    const user = userEvent.setup();
    installStockApi({
      [`GET /shops/${shopA}/stock/holds`]: (r) => {
        const page = Number(new URLSearchParams(r.path.split('?')[1]).get('page'));
        return { body: { holds: page === 1 ? [hold(1)] : [], total: 1, page, pageSize: 50 } };
      },
    });
    const { router } = renderApp(`/shops/${shopA}/stock/holds?page=3`);
    expect(await screen.findByText('No holds on this page', undefined, slow)).toBeInTheDocument();
    expect(screen.getByText('1 hold is active in all.')).toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Show the first page' }));
    await vi.waitFor(() => expect(router.state.location.search).toBe(''));
    expect(await screen.findByRole('table', { name: 'Stock held, longest held first' })).toHaveTextContent('Job 1');
  });
});

describe('the stock list, paged by the API', () => {
  it('asks for 50 lines a page, turns pages in the address, and keeps the API’s order', async () => {
    const user = userEvent.setup();
    const line = (n: number) => ({ ...lines.lines[0]!, partId: `aaaaaaaa-0000-4000-8000-${String(n).padStart(12, '0')}`, partNumber: `70-${4400 + n}` });
    const { requests } = installStockApi({
      [`GET /shops/${shopA}/stock`]: (r) => {
        const page = Number(new URLSearchParams(r.path.split('?')[1]).get('page'));
        return { body: { lines: Array.from({ length: page === 1 ? 50 : 5 }, (_, i) => line((page - 1) * 50 + i + 1)), total: 55, page, pageSize: 50 } };
      },
    });
    const { router } = renderApp(`/shops/${shopA}/stock`);
    const nav = await screen.findByRole('navigation', { name: 'Pages of stock lines' }, slow);
    expect(within(nav).getByRole('status')).toHaveTextContent('Lines 1–50 of 55');
    expect(requests.some((r) => r.path === `/shops/${shopA}/stock?page=1&pageSize=50`)).toBe(true);
    const table = screen.getByRole('table', { name: 'Stock per part, bin and condition' });
    expect(within(table).getAllByRole('columnheader').every((h) => !h.hasAttribute('aria-sort'))).toBe(true);
    await user.click(within(nav).getByRole('button', { name: 'Next page' }));
    await vi.waitFor(() => expect(within(nav).getByRole('status')).toHaveTextContent('Lines 51–55 of 55'));
    expect(router.state.location.search).toBe('?page=2');
    expect(table).toHaveTextContent('70-4455');
  });
});
