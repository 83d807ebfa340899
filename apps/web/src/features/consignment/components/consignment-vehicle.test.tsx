import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ConsignmentVehicle } from '@tappet/contracts';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, meFixture, shopA } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';

const slow = { timeout: 15_000 };
const vehicleId = '55555555-5555-4555-8555-555555555555';
const me = () => meFixture({}, [{ shopId: shopA, shopName: 'Harbour Works', role: 'owner', spendingLimitMinor: null }]);

function consigned(overrides: Partial<ConsignmentVehicle> = {}): ConsignmentVehicle {
  return {
    vehicleId,
    vehicle: 'Harrow Tourer 500 (1959)',
    kind: 'consignment',
    status: 'ready',
    statusSince: '2026-01-17T10:00:00.000Z',
    askingPriceMinor: 800_000,
    currency: 'GBP',
    consignor: { id: '66666666-6666-4666-8666-666666666666', name: 'Marit Solvang', email: null },
    terms: { commissionKind: 'fixed', commissionPercent: null, commissionFixedMinor: 50_000, agreedOn: '2026-01-15', note: null, updatedAt: '2026-01-15T09:00:00.000Z' },
    work: [],
    settlement: null,
    ...overrides,
  };
}

afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

describe('settling a consigned vehicle', () => {
  it('takes the day a vehicle was recorded sold as the sale date, says so, and sends it', async () => {
    const user = userEvent.setup();
    const { requests } = installFakeApi({
      'GET /me': () => ({ body: me() }),
      [`GET /shops/${shopA}/consignment/vehicles/${vehicleId}`]: () => ({ body: consigned({ status: 'sold', statusSince: '2026-01-19T10:00:00.000Z' }) }),
      [`POST /shops/${shopA}/consignment/vehicles/${vehicleId}/settlement`]: () => ({ status: 400, body: { error: { code: 'bad_request', message: 'Stopped here by the test.' } } }),
    });
    renderApp(`/shops/${shopA}/consignment/${vehicleId}`);
    const form = await screen.findByRole('form', { name: 'Settle the sale' }, slow);
    const soldOn = within(form).getByLabelText('Sold on');
    expect(soldOn).toHaveValue('2026-01-19');
    expect(soldOn).toHaveAttribute('max', '2026-01-19');
    expect(form).toHaveTextContent('Recorded as sold on 2026-01-19 on the vehicle’s page: the sale date cannot be later.');

    await user.clear(soldOn);
    await user.type(soldOn, '2026-01-18');
    await user.click(within(form).getByRole('button', { name: 'Settle the sale…' }));
    const dialog = screen.getByRole('alertdialog', { name: 'Settle this sale?' });
    // Already sold: the confirmation does not promise to record the sale again.
    expect(dialog).not.toHaveTextContent('recorded as sold');
    await user.click(within(dialog).getByRole('button', { name: /^Settle$/ }));
    await vi.waitFor(() => expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ salePriceMinor: 800_000, soldOn: '2026-01-18', note: null }));
  }, 20_000);

  it('offers today and no sold-day hint for a vehicle that is ready, and promises to record the sale', async () => {
    const user = userEvent.setup();
    installFakeApi({
      'GET /me': () => ({ body: me() }),
      [`GET /shops/${shopA}/consignment/vehicles/${vehicleId}`]: () => ({ body: consigned() }),
    });
    renderApp(`/shops/${shopA}/consignment/${vehicleId}`);
    const form = await screen.findByRole('form', { name: 'Settle the sale' }, slow);
    const soldOn = within(form).getByLabelText('Sold on');
    expect(soldOn).toHaveValue(new Date().toISOString().slice(0, 10));
    expect(soldOn).not.toHaveAttribute('max');
    expect(form).not.toHaveTextContent('Recorded as sold');
    await user.click(within(form).getByRole('button', { name: 'Settle the sale…' }));
    expect(screen.getByRole('alertdialog', { name: 'Settle this sale?' })).toHaveTextContent(`The vehicle is recorded as sold on ${new Date().toISOString().slice(0, 10)}.`);
  }, 20_000);
});
