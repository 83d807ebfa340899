import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { VehicleDetail } from '@tappet/contracts';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, meFixture, ownerOfA, shopA } from '../../../testing/fake-api';
import type { Me } from '../../../lib/auth';
import { renderApp } from '../../../testing/render-app';
import { checkFiles, uploadLimits } from './files-panel';
import { formatOdometer } from './words';

const slow = { timeout: 5000 };
afterEach(() => vi.unstubAllGlobals());

const vehicleId = '44444444-4444-4444-8444-444444444444';

function vehicleFixture(overrides: Partial<VehicleDetail> = {}): VehicleDetail {
  return {
    id: vehicleId,
    kind: 'shop_stock',
    marque: 'Astley-Pike',
    model: 'Sprint 500',
    year: 1971,
    colour: 'Heron grey',
    frameNumber: 'AP5 10442',
    engineNumber: 'AP5E 10442',
    vin: null,
    vinCheck: 'not_checked',
    condition: 'complete_project',
    notes: null,
    customer: null,
    acquisitionCostMinor: 180000,
    askingPriceMinor: 420000,
    currency: 'GBP',
    status: 'arrived',
    statusSince: '2026-01-10T09:00:00.000Z',
    numbersMatching: null,
    numbersCheckedBy: null,
    numbersCheckedAt: null,
    numbersNote: null,
    latestOdometer: null,
    photoCount: 0,
    coverPhotoId: null,
    createdAt: '2026-01-10T09:00:00.000Z',
    updatedAt: '2026-01-10T09:00:00.000Z',
    odometerReadings: [],
    files: [],
    statusHistory: [],
    nextStatuses: ['assessing', 'in_work'],
    ...overrides,
  };
}

const settings = { name: 'Harbour Works', address: '', currency: 'GBP', distanceUnit: 'km', pressureUnit: 'psi', taxRatePercent: 20, labourRateMinorPerHour: 6000, serviceLevel: 0.95, orderingCostMinor: 2500, holdingCostRatePercent: 25, labelSheetFormat: 'a4-3x8' };

type Handler = Parameters<typeof installFakeApi>[0][string];

function installVehiclesApi(handlers: Record<string, Handler>, me: Me = ownerOfA()) {
  const all: Record<string, Handler> = {
    'GET /me': () => ({ body: me }),
    'POST /me/active-shop': () => ({ body: me }),
    [`GET /shops/${shopA}`]: () => ({ body: { id: shopA, name: 'Harbour Works', slug: 'harbour-works', createdAt: '2024-03-01T09:00:00.000Z' } }),
    [`GET /shops/${shopA}/settings`]: () => ({ body: settings }),
    [`GET /shops/${shopA}/customers`]: () => ({ body: { items: [], total: 0, page: 1, pageSize: 20 } }),
    [`GET /shops/${shopA}/vehicles`]: () => ({ body: { items: [vehicleFixture()], total: 1, page: 1, pageSize: 25, marques: ['Astley-Pike', 'Corran'] } }),
    ...handlers,
  };
  // Query strings do not pick a different handler.
  const routes = new Proxy(all, { get: (target, key) => (typeof key === 'string' ? (target[key] ?? target[key.split('?')[0] ?? key]) : undefined) });
  return installFakeApi(routes);
}

describe('odometer words', () => {
  it('shows a reading as read and in the shop’s unit, with the exact mile of NIST SP 811', () => {
    // Source: NIST SP 811, appendix B.8: 1 mi = 1.609344 km exactly; 23,110 mi = 37,191.94 km.
    expect(formatOdometer(23_110, 'mi', 'km')).toBe('23,110\u00a0mi (37,192\u00a0km)');
    expect(formatOdometer(1_000, 'km', 'mi')).toBe('1,000\u00a0km (621\u00a0mi)');
    expect(formatOdometer(5, 'km', 'km')).toBe('5\u00a0km');
  });
});

describe('upload checks before sending', () => {
  it('refuses more files than the limit and files over 15 MB, naming the file', () => {
    const small = new File(['x'], 'a.pdf', { type: 'application/pdf' });
    expect(checkFiles([small])).toBeNull();
    expect(checkFiles([])).toMatch(/at least one/);
    expect(checkFiles(Array.from({ length: uploadLimits.maxFiles + 1 }, () => small))).toMatch(/at most 10/);
    const big = new File(['x'], 'scan.pdf');
    Object.defineProperty(big, 'size', { value: uploadLimits.maxFileBytes + 1 });
    expect(checkFiles([big])).toMatch(/“scan.pdf” is larger than 15 MB/);
  });
});

describe('the vehicle list', () => {
  it('lists vehicles and filters by status through the address', async () => {
    const { requests } = installVehiclesApi({});
    const { router } = renderApp(`/shops/${shopA}/vehicles`);
    const table = await screen.findByRole('table', { name: 'Vehicles in the shop' }, slow);
    expect(within(table).getByRole('link', { name: '1971 Astley-Pike Sprint 500' })).toHaveAttribute('href', `/shops/${shopA}/vehicles/${vehicleId}`);
    // The kind is written under the vehicle's title, not in a column of its own.
    expect(within(table).getAllByRole('columnheader').map((h) => h.textContent)).toEqual(['Vehicle', 'Frame / engine', 'Owner / consignor', 'Status', 'Odometer']);
    expect(within(table).getAllByRole('row')[1]!.querySelector('td')).toHaveTextContent('1971 Astley-Pike Sprint 500Shop stock');
    await userEvent.selectOptions(screen.getByLabelText('Status'), 'in_work');
    await waitFor(() => expect(router.state.location.search).toBe('?status=in_work'));
    await waitFor(() => expect(requests.some((r) => r.path === `/shops/${shopA}/vehicles?status=in_work`)).toBe(true));
  }, 20_000);
});

describe('recording a vehicle', () => {
  it('shows a failing VIN check digit as a warning that must be ticked before the VIN is kept', async () => {
    const posted: unknown[] = [];
    installVehiclesApi({
      [`POST /shops/${shopA}/vehicles`]: (req) => {
        posted.push(req.body);
        const body = req.body as { acknowledgeCheckDigit?: boolean };
        if (!body.acknowledgeCheckDigit) {
          return {
            status: 400,
            body: { error: { code: 'validation_failed', message: 'The check digit of this VIN does not match: position 9 should be 4. Vehicles built for North America must carry a valid check digit.', details: [{ path: ['vin'], message: 'Position 9 should be 4 for this VIN.', warning: 'vin_check_digit', expected: '4' }] } },
          };
        }
        return { status: 201, body: vehicleFixture({ vin: '1G4AH59H55G118341', vinCheck: 'acknowledged_failure' }) };
      },
      [`GET /shops/${shopA}/vehicles/${vehicleId}`]: () => ({ body: vehicleFixture({ vin: '1G4AH59H55G118341', vinCheck: 'acknowledged_failure' }) }),
      [`GET /shops/${shopA}/vehicles/${vehicleId}/timeline`]: () => ({ body: { entries: [] } }),
      [`GET /shops/${shopA}/vehicles/${vehicleId}/fitment`]: () => ({ body: { parts: [], stockKnown: false } }),
    });
    renderApp(`/shops/${shopA}/vehicles`);
    await userEvent.click(await screen.findByRole('button', { name: 'Record a vehicle' }, slow));
    const dialog = await screen.findByRole('dialog', { name: 'Record a vehicle' });
    await userEvent.type(within(dialog).getByLabelText('Marque'), 'Velmark');
    await userEvent.type(within(dialog).getByLabelText('Model'), 'Tourer');
    await userEvent.type(within(dialog).getByLabelText('VIN', { exact: false }), '1G4AH59H55G118341');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Record vehicle' }));

    const alert = await within(dialog).findByRole('alert', {}, slow);
    expect(alert).toHaveTextContent('Position 9 of 1G4AH59H55G118341 should be 4');
    expect(posted).toHaveLength(1);
    // Sending again without the tick is stopped in the browser.
    await userEvent.click(within(dialog).getByRole('button', { name: 'Record vehicle' }));
    expect(posted).toHaveLength(1);
    await userEvent.click(within(dialog).getByRole('checkbox', { name: /keep this VIN as stamped/ }));
    await userEvent.click(within(dialog).getByRole('button', { name: 'Record vehicle' }));
    await waitFor(() => expect(posted).toHaveLength(2));
    expect(posted[1]).toMatchObject({ vin: '1G4AH59H55G118341', acknowledgeCheckDigit: true, marque: 'Velmark', model: 'Tourer' });
    expect(await screen.findByText(/Check digit does not match; kept as stamped/, {}, slow)).toBeInTheDocument();
  }, 30_000);

  it('a mechanic sees the money fields disabled and never sends them', async () => {
    const mechanic = meFixture({}, [{ shopId: shopA, shopName: 'Harbour Works', role: 'mechanic', spendingLimitMinor: null }]);
    const posted: unknown[] = [];
    installVehiclesApi(
      {
        [`POST /shops/${shopA}/vehicles`]: (req) => {
          posted.push(req.body);
          return { status: 201, body: vehicleFixture() };
        },
        [`GET /shops/${shopA}/vehicles/${vehicleId}`]: () => ({ body: vehicleFixture() }),
        [`GET /shops/${shopA}/vehicles/${vehicleId}/timeline`]: () => ({ body: { entries: [] } }),
        [`GET /shops/${shopA}/vehicles/${vehicleId}/fitment`]: () => ({ body: { parts: [], stockKnown: false } }),
      },
      mechanic,
    );
    renderApp(`/shops/${shopA}/vehicles`);
    await userEvent.click(await screen.findByRole('button', { name: 'Record a vehicle' }, slow));
    const dialog = await screen.findByRole('dialog', { name: 'Record a vehicle' });
    await userEvent.selectOptions(within(dialog).getByLabelText('Kind'), 'shop_stock');
    expect(within(dialog).getByLabelText(/Acquisition cost/)).toBeDisabled();
    expect(within(dialog).getByLabelText(/Asking price/)).toBeDisabled();
    expect(dialog).toHaveTextContent('Only the owner sets this.');
    // Customers are the owner's: no inline "new customer" for a mechanic.
    expect(within(dialog).queryByRole('button', { name: 'New customer…' })).not.toBeInTheDocument();
    await userEvent.type(within(dialog).getByLabelText('Marque'), 'Corran');
    await userEvent.type(within(dialog).getByLabelText('Model'), 'Meadowlark 350');
    await userEvent.click(within(dialog).getByRole('button', { name: 'Record vehicle' }));
    await waitFor(() => expect(posted).toHaveLength(1));
    expect(posted[0]).not.toHaveProperty('acquisitionCostMinor');
    expect(posted[0]).not.toHaveProperty('askingPriceMinor');
  }, 30_000);
});

describe('the vehicle page', () => {
  it('shows identification, status moves, the timeline and fitment with stock', async () => {
    const detail = vehicleFixture({
      odometerReadings: [{ id: '55555555-5555-4555-8555-555555555555', value: 23110, unit: 'mi', readOn: '2026-01-10', note: null, recordedBy: null, createdAt: '2026-01-10T09:00:00.000Z' }],
    });
    const { requests } = installVehiclesApi({
      [`GET /shops/${shopA}/vehicles/${vehicleId}`]: () => ({ body: detail }),
      [`GET /shops/${shopA}/vehicles/${vehicleId}/timeline`]: () => ({ body: { entries: [{ kind: 'status', at: '2026-01-10T09:00:00.000Z', title: 'Arrived', detail: null, by: { id: 'u', name: 'Pat Example' }, refId: null }] } }),
      [`GET /shops/${shopA}/vehicles/${vehicleId}/fitment`]: () => ({
        body: { parts: [{ partId: '66666666-6666-4666-8666-666666666666', number: 'AP-7710', description: 'Fork seal', origin: 'genuine', status: 'available', fitment: { yearFrom: 1969, yearTo: 1973, frameFrom: null, frameTo: null }, frameMatch: 'yes', freeStock: 3, bins: ['A-03 (new)'] }], stockKnown: true },
      }),
      [`POST /shops/${shopA}/vehicles/${vehicleId}/status`]: () => ({ body: { ...detail, status: 'assessing', nextStatuses: ['in_work', 'ready', 'handed_over'] } }),
    });
    renderApp(`/shops/${shopA}/vehicles/${vehicleId}`);
    expect(await screen.findByRole('heading', { level: 1, name: '1971 Astley-Pike Sprint 500' }, slow)).toBeInTheDocument();
    expect(screen.getByText('AP5E 10442')).toBeInTheDocument();
    expect(await screen.findByText('£4,200.00', {}, slow)).toBeInTheDocument();
    expect(screen.getByRole('table', { name: 'Odometer readings, newest first' })).toHaveTextContent('23,110 mi (37,192 km)');
    const fitment = await screen.findByRole('table', { name: 'Parts that fit this vehicle' }, slow);
    expect(fitment).toHaveTextContent('AP-7710');
    expect(fitment).toHaveTextContent('3');
    expect(fitment).toHaveTextContent('A-03 (new)');
    await userEvent.click(screen.getByRole('button', { name: 'Start assessment' }));
    const dialog = await screen.findByRole('dialog', { name: 'Start assessment?' });
    await userEvent.click(within(dialog).getByRole('button', { name: 'Start assessment' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'POST' && r.path.endsWith('/status'))).toBe(true));
    expect(requests.find((r) => r.method === 'POST' && r.path.endsWith('/status'))?.body).toMatchObject({ to: 'assessing' });
  }, 30_000);
});
