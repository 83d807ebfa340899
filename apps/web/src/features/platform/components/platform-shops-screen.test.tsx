import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, meFixture, type RecordedRequest } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';

const slow = { timeout: 5000 };
const admin = meFixture({ isPlatformAdmin: true, name: 'Ada Admin' });
const plan = { id: 'aaaaaaaa-0000-4000-8000-000000000001', name: 'Workbench', monthlyPriceMinor: 1900, currency: 'gbp', stripeLookupKey: 'tappet_workbench_monthly', seatLimit: 3, catalogueLimit: 2000, vehicleLimit: 10, isActive: true };
const shopRow = {
  id: 'bbbbbbbb-0000-4000-8000-000000000001',
  name: 'Harbour Works',
  slug: 'harbour-works',
  plan: { id: plan.id, name: plan.name },
  billingState: 'past_due',
  manualSuspensionReason: null,
  seatsUsed: 3,
  seatLimit: 3,
  catalogueSize: 120,
  catalogueLimit: 2000,
  lastActivityAt: '2026-11-30T10:00:00.000Z',
  trialEndsAt: null,
  supportAccessUntil: null,
  createdAt: '2026-11-01T10:00:00.000Z',
};

afterEach(() => vi.unstubAllGlobals());

describe('platform console', () => {
  it('lists shops with state and usage, filters, onboards a shop and suspends one with a reason', async () => {
    const user = userEvent.setup();
    const { requests } = installFakeApi({
      'GET /me': () => ({ body: admin }),
      'GET /platform/shops': () => ({ body: { shops: [shopRow], plans: [plan] } }),
      'GET /platform/shops?state=past_due': () => ({ body: { shops: [shopRow], plans: [plan] } }),
      'POST /platform/shops': (r: RecordedRequest) => ({ status: 201, body: { ...shopRow, id: 'bbbbbbbb-0000-4000-8000-000000000002', name: (r.body as { name: string }).name, billingState: 'trial', seatsUsed: 1 } }),
      [`POST /platform/shops/${shopRow.id}/suspend`]: () => ({ body: { billingState: 'suspended' } }),
    });
    renderApp('/platform');
    const row = await screen.findByRole('row', { name: /Harbour Works/ }, slow);
    expect(row).toHaveTextContent('Payment overdue');
    expect(row).toHaveTextContent('3 / 3');

    await user.selectOptions(screen.getByLabelText('State'), 'past_due');
    await user.click(screen.getByRole('button', { name: 'Show shops' }));
    await vi.waitFor(() => expect(requests.some((r) => r.path === '/platform/shops?state=past_due')).toBe(true));

    await user.click(screen.getAllByRole('button', { name: 'Onboard a shop' })[0]!);
    const dialog = screen.getByRole('dialog', { name: 'Onboard a shop' });
    await user.click(within(dialog).getByRole('button', { name: 'Create shop and invite owner' }));
    expect(within(dialog).getByText('Choose a plan.')).toBeInTheDocument();
    expect(requests.filter((r) => r.method === 'POST')).toHaveLength(0);
    await user.type(within(dialog).getByLabelText('Shop name'), 'Saltmarsh Motors');
    await user.selectOptions(within(dialog).getByLabelText('Plan'), plan.id);
    await user.type(within(dialog).getByLabelText('Owner’s e-mail address'), 'Rhoda@Saltmarsh-Motors.test');
    await user.click(within(dialog).getByRole('button', { name: 'Create shop and invite owner' }));
    expect(await screen.findByText(/The invitation went to rhoda@saltmarsh-motors.test/)).toBeInTheDocument();
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ name: 'Saltmarsh Motors', planId: plan.id, ownerEmail: 'rhoda@saltmarsh-motors.test' });

    await user.click(screen.getByRole('button', { name: 'Suspend Harbour Works' }));
    const suspend = screen.getByRole('dialog', { name: 'Suspend Harbour Works?' });
    await user.click(within(suspend).getByRole('button', { name: 'Suspend shop' }));
    expect(within(suspend).getByText('Give a reason of at least 3 characters.')).toBeInTheDocument();
    await user.type(within(suspend).getByLabelText('Reason'), 'Card dispute');
    await user.click(within(suspend).getByRole('button', { name: 'Suspend shop' }));
    expect(await screen.findByText('Harbour Works is suspended and read-only.')).toBeInTheDocument();
    expect(requests.find((r) => r.path.endsWith('/suspend'))?.body).toEqual({ reason: 'Card dispute' });
  }, 30_000);

  it('is "not found" for anyone who is not a platform admin', async () => {
    installFakeApi({ 'GET /me': () => ({ body: meFixture({}, [{ shopId: '11111111-1111-4111-8111-111111111111', shopName: 'Harbour Works', role: 'owner', spendingLimitMinor: null }]) }) });
    renderApp('/platform');
    expect(await screen.findByRole('heading', { level: 1, name: /not found/i }, slow)).toBeInTheDocument();
  }, 20_000);
});
