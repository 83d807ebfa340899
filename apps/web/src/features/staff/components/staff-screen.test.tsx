import type { StaffListResponse } from '@tappet/contracts';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, ownerOfA, shopA, type RecordedRequest } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';

const slow = { timeout: 5000 };
const me = ownerOfA();
const id = (n: number) => `aaaaaaaa-0000-4000-8000-${String(n).padStart(12, '0')}`;

const staffList = (): StaffListResponse => ({
  members: [
    { membershipId: id(1), userId: me.user.id, name: 'Pat Example', email: 'pat@harbour-works.test', role: 'owner', spendingLimitMinor: null, isActive: true, joinedAt: '2024-03-01T09:00:00.000Z' },
    { membershipId: id(2), userId: id(12), name: 'Morgan Lathe', email: 'morgan@harbour-works.test', role: 'buyer', spendingLimitMinor: 50000, isActive: true, joinedAt: '2024-04-01T09:00:00.000Z' },
    { membershipId: id(3), userId: id(13), name: 'Ellis Grommet', email: 'ellis@harbour-works.test', role: 'mechanic', spendingLimitMinor: null, isActive: false, joinedAt: '2024-05-01T09:00:00.000Z' },
  ],
  invitations: [
    { id: id(4), email: 'sam@harbour-works.test', role: 'viewer', spendingLimitMinor: null, invitedByName: 'Pat Example', createdAt: '2024-06-01T09:00:00.000Z', expiresAt: '2024-06-08T09:00:00.000Z', expired: true },
  ],
});

const settings = { name: 'Harbour Works', address: '', currency: 'GBP', distanceUnit: 'mi', pressureUnit: 'psi', taxRatePercent: 20, labourRateMinorPerHour: 6000, serviceLevel: 0.95, orderingCostMinor: 2500, holdingCostRatePercent: 25, labelSheetFormat: 'a4-3x8' };
type Handler = (r: RecordedRequest) => { status?: number; body?: unknown };

function install(extra: Record<string, Handler> = {}) {
  return installFakeApi({
    'GET /me': () => ({ body: me }),
    [`GET /shops/${shopA}/staff`]: () => ({ body: staffList() }),
    [`GET /shops/${shopA}/settings`]: () => ({ body: settings }),
    ...extra,
  });
}

afterEach(() => vi.unstubAllGlobals());

describe('the staff screen', () => {
  it('lists people with role, limit and state in words, and open invitations with their expiry', async () => {
    install();
    renderApp(`/shops/${shopA}/staff`);
    const people = await screen.findByRole('table', { name: 'People in the shop' }, slow);
    const morgan = within(people).getByRole('row', { name: /Morgan Lathe/ });
    expect(morgan).toHaveTextContent('Parts buyer');
    expect(morgan).toHaveTextContent('£500.00');
    expect(morgan).toHaveTextContent('Active');
    expect(within(people).getByRole('row', { name: /Ellis Grommet/ })).toHaveTextContent('Deactivated');
    expect(within(people).getByRole('row', { name: /Pat Example/ })).toHaveTextContent('(you)');
    const invitations = screen.getByRole('table', { name: 'Open invitations' });
    expect(within(invitations).getByRole('row', { name: /sam@harbour-works.test/ })).toHaveTextContent('Expired: resend it');
  }, 20_000);

  it('validates the invitation before sending it, then sends e-mail and role', async () => {
    const user = userEvent.setup();
    const { requests } = install({
      [`POST /shops/${shopA}/staff/invitations`]: (r) => ({
        status: 201,
        body: { id: id(5), email: (r.body as { email: string }).email, role: 'buyer', spendingLimitMinor: 125050, invitedByName: 'Pat Example', createdAt: '2024-06-01T09:00:00.000Z', expiresAt: '2024-06-08T09:00:00.000Z', expired: false },
      }),
    });
    renderApp(`/shops/${shopA}/staff`);
    await user.click((await screen.findAllByRole('button', { name: 'Invite someone' }, slow))[0]!);
    const dialog = screen.getByRole('dialog', { name: 'Invite someone' });
    await user.type(within(dialog).getByLabelText('E-mail'), 'not-an-address');
    await user.click(within(dialog).getByRole('button', { name: 'Send invitation' }));
    expect(within(dialog).getByLabelText('E-mail')).toBeInvalid();
    expect(within(dialog).getByLabelText('E-mail')).toHaveFocus();
    expect(requests.filter((r) => r.method === 'POST')).toHaveLength(0);

    await user.clear(within(dialog).getByLabelText('E-mail'));
    await user.type(within(dialog).getByLabelText('E-mail'), 'Jo@Harbour-Works.test');
    await user.selectOptions(within(dialog).getByLabelText('Role'), 'buyer');
    await user.type(within(dialog).getByLabelText('Spending limit (GBP)'), '1,250.50');
    await user.click(within(dialog).getByRole('button', { name: 'Send invitation' }));
    expect(await screen.findByText('Invitation sent to jo@harbour-works.test as parts buyer.')).toBeInTheDocument();
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ email: 'jo@harbour-works.test', role: 'buyer', spendingLimitMinor: 125050 });
    await waitFor(() => expect(screen.queryByRole('dialog', { name: 'Invite someone' })).not.toBeInTheDocument());
  }, 20_000);

  it('says plainly why the last owner cannot be deactivated, and keeps the dialog open', async () => {
    const user = userEvent.setup();
    install({
      [`POST /shops/${shopA}/staff/${id(1)}/deactivate`]: () => ({
        status: 409,
        body: { error: { code: 'conflict', message: 'A shop must keep at least one active owner. Make someone else an owner first.' } },
      }),
    });
    renderApp(`/shops/${shopA}/staff`);
    await user.click(await screen.findByRole('button', { name: 'Actions for Pat Example' }, slow));
    await user.click(screen.getByRole('menuitem', { name: 'Deactivate' }));
    const confirm = screen.getByRole('alertdialog', { name: 'Deactivate Pat Example?' });
    expect(confirm).toHaveTextContent('signed out of Tappet at once');
    // Destructive: Cancel has the focus, so Enter does no harm.
    expect(within(confirm).getByRole('button', { name: 'Cancel' })).toHaveFocus();
    await user.click(within(confirm).getByRole('button', { name: 'Deactivate and sign out' }));
    expect(await within(confirm).findByRole('alert')).toHaveTextContent('A shop must keep at least one active owner. Make someone else an owner first.');
  }, 20_000);

  it('withdraws an invitation after confirming', async () => {
    const user = userEvent.setup();
    const { requests } = install({ [`DELETE /shops/${shopA}/staff/invitations/${id(4)}`]: () => ({ body: { ok: true } }) });
    renderApp(`/shops/${shopA}/staff`);
    await user.click(await screen.findByRole('button', { name: 'Withdraw the invitation to sam@harbour-works.test' }, slow));
    await user.click(within(await screen.findByRole('alertdialog', { name: 'Withdraw this invitation?' })).getByRole('button', { name: 'Withdraw invitation' }));
    expect(await screen.findByText('The invitation to sam@harbour-works.test is withdrawn.')).toBeInTheDocument();
    expect(requests.some((r) => r.method === 'DELETE' && r.path === `/shops/${shopA}/staff/invitations/${id(4)}`)).toBe(true);
  }, 20_000);
});
