import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { BillingOverview, BillingStatus } from '@tappet/contracts';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, meFixture, ownerOfA, shopA } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';
import { goTo } from '../api/hosted-pages';

const slow = { timeout: 5000 };
const plan = (id: string, name: string, price: number, seats: number | null) => ({ id, name, monthlyPriceMinor: price, currency: 'gbp', stripeLookupKey: `k_${name}`, seatLimit: seats, catalogueLimit: 2000, vehicleLimit: null, isActive: true });
const workbench = plan('aaaaaaaa-0000-4000-8000-000000000001', 'Workbench', 1900, 3);
const bay = plan('aaaaaaaa-0000-4000-8000-000000000002', 'Restoration Bay', 4900, 10);

function status(overrides: Partial<BillingStatus> = {}): BillingStatus {
  return { state: 'trial', readOnly: false, readOnlyReason: null, trialEndsAt: '2026-12-11T09:00:00.000Z', trialDaysLeft: 9, pastDueSince: null, suspendsAt: null, canOpenPortal: false, suspendedByHand: false, ...overrides };
}
function overview(s: BillingStatus, subscription: Partial<BillingOverview['subscription']> = {}): BillingOverview {
  return {
    status: s,
    plan: workbench,
    plans: [workbench, bay],
    usage: { seats: { used: 3, limit: 3 }, catalogue: { used: 120, limit: 2000 }, vehicles: { used: null, limit: null } },
    subscription: { canOpenPortal: false, subscribed: false, currentPeriodEnd: null, cancelAtPeriodEnd: false, ...subscription },
  };
}

afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

describe('billing page', () => {
  it('shows the trial and usage, and subscribes to the chosen plan through Checkout', async () => {
    const user = userEvent.setup();
    const assign = vi.spyOn(goTo, 'url').mockImplementation(() => undefined);
    const { requests } = installFakeApi({
      'GET /me': () => ({ body: ownerOfA() }),
      [`GET /shops/${shopA}/billing/status`]: () => ({ body: status() }),
      [`GET /shops/${shopA}/billing`]: () => ({ body: overview(status()) }),
      [`POST /shops/${shopA}/billing/checkout`]: () => ({ body: { url: 'http://127.0.0.1:12111/checkout/cs_test_1' } }),
    });
    renderApp(`/shops/${shopA}/billing`);
    expect(await screen.findByTestId('trial-days', {}, slow)).toHaveTextContent('9 days left in the free trial');
    expect(screen.getByText('Limit reached')).toBeInTheDocument();
    // No banner in a trial.
    expect(screen.queryByRole('region', { name: 'Payment overdue' })).not.toBeInTheDocument();
    await user.click(screen.getByRole('radio', { name: /Restoration Bay/ }));
    await user.click(screen.getByRole('button', { name: 'Subscribe with Stripe Checkout' }));
    await vi.waitFor(() => expect(assign).toHaveBeenCalledWith('http://127.0.0.1:12111/checkout/cs_test_1'));
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ planId: bay.id });
  }, 20_000);

  it('offers the portal once subscribed, and thanks the owner back from Checkout', async () => {
    const user = userEvent.setup();
    const assign = vi.spyOn(goTo, 'url').mockImplementation(() => undefined);
    const active = status({ state: 'active', trialEndsAt: null, trialDaysLeft: null, canOpenPortal: true });
    installFakeApi({
      'GET /me': () => ({ body: ownerOfA() }),
      [`GET /shops/${shopA}/billing/status`]: () => ({ body: active }),
      [`GET /shops/${shopA}/billing`]: () => ({ body: overview(active, { canOpenPortal: true, subscribed: true, currentPeriodEnd: '2027-01-02T09:00:00.000Z' }) }),
      [`POST /shops/${shopA}/billing/portal`]: () => ({ body: { url: 'http://127.0.0.1:12111/portal/bps_1' } }),
    });
    renderApp(`/shops/${shopA}/billing?checkout=done`);
    expect(await screen.findByText(/the payment went through and the subscription is active/, {}, slow)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Subscribe with Stripe Checkout' })).not.toBeInTheDocument();
    await user.click(screen.getByRole('button', { name: 'Manage in the billing portal' }));
    await vi.waitFor(() => expect(assign).toHaveBeenCalledWith('http://127.0.0.1:12111/portal/bps_1'));
  }, 20_000);
});

describe('billing notices on every shop screen', () => {
  it('shows the owner a past-due banner with the way to pay', async () => {
    installFakeApi({
      'GET /me': () => ({ body: ownerOfA() }),
      [`GET /shops/${shopA}/billing/status`]: () => ({ body: status({ state: 'past_due', trialEndsAt: null, trialDaysLeft: null, pastDueSince: '2026-11-28T09:00:00.000Z', suspendsAt: '2026-12-12T09:00:00.000Z', canOpenPortal: true }) }),
    });
    renderApp(`/shops/${shopA}`);
    const banner = await screen.findByRole('region', { name: 'Payment overdue' }, slow);
    expect(banner).toHaveTextContent(/the shop becomes read-only/);
    expect(within(banner).getByRole('button', { name: 'Pay in the billing portal' })).toBeInTheDocument();
  }, 20_000);

  it('tells a buyer in a suspended shop why it is read-only, without owner actions', async () => {
    const reason = 'This shop is read-only: its subscription is suspended because payment is more than 14 days overdue. Nothing has been deleted; the owner can pay in Billing to restore writing at once.';
    installFakeApi({
      'GET /me': () => ({ body: meFixture({}, [{ shopId: shopA, shopName: 'Harbour Works', role: 'buyer', spendingLimitMinor: 50_000 }]) }),
      [`GET /shops/${shopA}/billing/status`]: () => ({ body: status({ state: 'suspended', readOnly: true, readOnlyReason: reason, trialEndsAt: null, trialDaysLeft: null }) }),
    });
    renderApp(`/shops/${shopA}`);
    const notice = await screen.findByRole('region', { name: 'Read-only shop' }, slow);
    expect(notice).toHaveTextContent(reason);
    expect(within(notice).queryByRole('link', { name: 'Go to Billing' })).not.toBeInTheDocument();
  }, 20_000);
});
