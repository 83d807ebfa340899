import type { CountDetail, VarianceReport } from '@tappet/contracts';
import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, meFixture, ownerOfA, shopA, type RecordedRequest } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';
import type { Me } from '../../../lib/auth';
import { codeKey, signed } from './count-words';

const slow = { timeout: 5000 };
afterEach(() => vi.unstubAllGlobals());

const countId = 'dddddddd-0000-4000-8000-000000000001';
const binA = 'cccccccc-0000-4000-8000-000000000001';
const line = (id: string, partNumber: string, countedQuantity: number | null) => ({
  id,
  partId: `aaaaaaaa-0000-4000-8000-00000000000${id.slice(-1)}`,
  partNumber,
  partDescription: `Part ${partNumber}`,
  category: null,
  binId: binA,
  binCode: 'B-04',
  condition: 'new' as const,
  serialised: false,
  frozenQuantity: 5,
  added: false,
  countedQuantity,
  movedSinceFreeze: countedQuantity === null ? null : 0,
  expectedQuantity: countedQuantity === null ? null : 5,
  variance: countedQuantity === null ? null : countedQuantity - 5,
  counted: countedQuantity === null ? null : { at: '2026-12-01T10:00:00.000Z', userId: null, name: 'Oskar' },
});
const detail: CountDetail = {
  id: countId,
  number: 4,
  status: 'open',
  scope: { bins: [{ id: binA, code: 'B-04' }], categories: [] },
  note: null,
  started: { at: '2026-12-01T09:00:00.000Z', userId: null, name: 'Ines' },
  closed: null,
  lineCount: 2,
  countedCount: 1,
  differenceCount: 1,
  lines: [line('eeeeeeee-0000-4000-8000-000000000001', '70-4411', 4), line('eeeeeeee-0000-4000-8000-000000000002', 'HC-210', null)],
};
const report: VarianceReport = {
  countId,
  status: 'open',
  currency: 'GBP',
  lines: [{ lineId: detail.lines[0]!.id, partId: detail.lines[0]!.partId, partNumber: '70-4411', partDescription: 'Part 70-4411', binCode: 'B-04', condition: 'new', serialised: false, expectedQuantity: 5, countedQuantity: 4, variance: -1, unitCostMinor: 650, valueDifferenceMinor: -650 }],
  uncountedCount: 1,
  totals: { over: 0, short: 1, valueOverMinor: 0, valueShortMinor: 650, netValueMinor: -650 },
  postedValueMinor: null,
};

function installCountApi(me: Me = ownerOfA()) {
  const handlers: Record<string, (r: RecordedRequest) => { status?: number; body?: unknown }> = {
    'GET /me': () => ({ body: me }),
    'POST /me/active-shop': () => ({ body: me }),
    [`GET /shops/${shopA}/counts/${countId}`]: () => ({ body: detail }),
    [`GET /shops/${shopA}/counts/${countId}/variances`]: () => ({ body: report }),
    [`GET /shops/${shopA}/settings`]: () => ({ status: 404, body: { error: { code: 'not_found', message: 'x' } } }),
    [`POST /shops/${shopA}/counts/${countId}/entries`]: () => ({ status: 201, body: { ...detail.lines[1], countedQuantity: 7, expectedQuantity: 5, movedSinceFreeze: 0, variance: 2, counted: { at: '2026-12-01T10:05:00.000Z', userId: null, name: 'Pat' } } }),
  };
  return installFakeApi(new Proxy(handlers, { get: (target, key) => (typeof key === 'string' ? (target[key] ?? target[key.split('?')[0] ?? key]) : undefined) }));
}

describe('count words', () => {
  it('compares codes on letters and digits only, and signs differences', () => {
    expect(codeKey(' hc-210 ')).toBe('HC210');
    expect(codeKey('70 4411')).toBe(codeKey('70-4411'));
    expect([signed(2), signed(-1), signed(0)]).toEqual(['+2', '−1', '0']);
  });
});

describe('the counting screen', () => {
  it('a scanned code (lower case, then Enter) puts the cursor in its line; saving sends a "set" entry', async () => {
    const user = userEvent.setup();
    const { requests } = installCountApi();
    renderApp(`/shops/${shopA}/counts/${countId}`);
    await user.type(await screen.findByRole('textbox', { name: 'Scan or type a part number' }, slow), 'hc210{Enter}');
    const field = screen.getByRole('textbox', { name: 'Counted HC-210, new' });
    await waitFor(() => expect(field).toHaveFocus());
    await user.type(field, '7{Enter}');
    await waitFor(() => expect(requests.filter((r) => r.method === 'POST')).toHaveLength(1));
    expect(requests.find((r) => r.method === 'POST')!.body).toEqual({ lineId: detail.lines[1]!.id, quantity: 7, mode: 'set' });
  });

  it('refuses a quantity that is not a whole number, beside the field, sending nothing', async () => {
    const user = userEvent.setup();
    const { requests } = installCountApi();
    renderApp(`/shops/${shopA}/counts/${countId}`);
    const field = await screen.findByRole('textbox', { name: 'Counted HC-210, new' }, slow);
    await user.type(field, '2.5{Enter}');
    expect(field).toHaveAccessibleDescription(/Enter a whole number, 0 or more\./);
    expect(requests.filter((r) => r.method === 'POST')).toHaveLength(0);
  });
});

describe('the differences', () => {
  it('shows the difference in quantity and value; a mechanic sees no post or abandon', async () => {
    installCountApi(meFixture({}, [{ shopId: shopA, shopName: 'Harbour Works', role: 'mechanic', spendingLimitMinor: null }]));
    renderApp(`/shops/${shopA}/counts/${countId}/differences`);
    const row = await screen.findByRole('row', { name: /70-4411/ }, slow);
    expect(row).toHaveTextContent('−1');
    expect(row).toHaveTextContent('short');
    expect(screen.queryByRole('button', { name: 'Post the count' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Abandon the count' })).toBeNull();
    expect(screen.getByText('The owner posts the count once it is done.')).toBeInTheDocument();
  });

  it('the owner is asked before posting', async () => {
    const user = userEvent.setup();
    installCountApi();
    renderApp(`/shops/${shopA}/counts/${countId}/differences`);
    await user.click(await screen.findByRole('button', { name: 'Post the count' }, slow));
    expect(screen.getByRole('alertdialog', { name: 'Post this count?' })).toHaveTextContent('1 line changes');
  });
});
