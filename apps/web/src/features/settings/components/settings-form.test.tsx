import { defaultShopSettings } from '@tappet/contracts';
import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, ownerOfA, shopA, type RecordedRequest } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';
import { changedSettings, majorTextToMinor, readSettingsForm } from './settings-form';

const slow = { timeout: 5000 };
const saved = { name: 'Harbour Works', ...defaultShopSettings };
const formOf = (over: Record<string, string> = {}) => ({
  name: 'Harbour Works',
  address: '',
  currency: 'GBP',
  distanceUnit: 'mi',
  pressureUnit: 'psi',
  taxRatePercent: '20',
  labourRateMinorPerHour: '60.00',
  serviceLevel: '0.95',
  orderingCostMinor: '25.00',
  holdingCostRatePercent: '25',
  labelSheetFormat: 'a4-3x8',
  ...over,
});

afterEach(() => vi.unstubAllGlobals());

describe('reading the settings form', () => {
  it('turns major units into minor units and finds nothing changed in the saved values', () => {
    const read = readSettingsForm(formOf());
    expect(read).toEqual({ ok: true, settings: saved });
    if (read.ok) expect(changedSettings(saved, read.settings)).toEqual({});
    expect(majorTextToMinor('1,250.5')).toBe(125050);
    expect(majorTextToMinor('12.345')).toBeNull();
  });

  it('names each wrong field with the contract’s message', () => {
    const read = readSettingsForm(formOf({ currency: 'ZZ', serviceLevel: '1.2', taxRatePercent: 'twenty', labourRateMinorPerHour: '-5' }));
    expect(read.ok).toBe(false);
    if (read.ok) return;
    expect(read.errors.currency).toMatch(/three-letter/);
    expect(read.errors.serviceLevel).toBe('Use 0.5 to 0.999.');
    expect(read.errors.taxRatePercent).toBe('Enter a number.');
    expect(read.errors.labourRateMinorPerHour).toBe('Enter an amount such as 60 or 62.50.');
  });
});

describe('the Shop page settings', () => {
  it('sends only the changed settings and says the shop was renamed', async () => {
    const user = userEvent.setup();
    let current = saved;
    const { requests } = installFakeApi({
      'GET /me': () => ({ body: ownerOfA() }),
      [`GET /shops/${shopA}`]: () => ({ body: { id: shopA, name: current.name, slug: 'harbour-works', createdAt: '2024-03-01T09:00:00.000Z' } }),
      [`GET /shops/${shopA}/settings`]: () => ({ body: current }),
      [`PATCH /shops/${shopA}/settings`]: (r: RecordedRequest) => {
        current = { ...current, ...(r.body as object) };
        return { body: current };
      },
    });
    renderApp(`/shops/${shopA}/shop`);
    const name = await screen.findByLabelText('Shop name', {}, slow);
    await user.clear(name);
    await user.type(name, 'Harbour Works Ltd');
    const labour = screen.getByLabelText('Labour rate per hour (GBP)');
    await user.clear(labour);
    await user.type(labour, '72.50');
    await user.click(screen.getByRole('button', { name: 'Save settings' }));
    expect(await screen.findByText('Settings saved. Shop renamed to Harbour Works Ltd.')).toBeInTheDocument();
    expect(requests.find((r) => r.method === 'PATCH')?.body).toEqual({ name: 'Harbour Works Ltd', labourRateMinorPerHour: 7250 });
    expect(within(screen.getByRole('region', { name: 'Download everything' })).getByRole('link', { name: 'Download everything (.zip)' })).toHaveAttribute('href', `/api/shops/${shopA}/export.zip`);
  }, 20_000);
});
