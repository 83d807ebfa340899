import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, meFixture, shopA } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';

const slow = { timeout: 5000 };
const token = 'A'.repeat(43);
const unauthenticated = { status: 401, body: { error: { code: 'unauthenticated', message: 'Sign in to continue.' } } };
const invitation = (accountExists: boolean) => ({ shopName: 'Harbour Works', email: 'rowan@harbour-works.test', role: 'mechanic', expiresAt: '2030-01-08T09:00:00.000Z', accountExists });
const mechanicMe = () =>
  meFixture({ email: 'rowan@harbour-works.test', name: 'Rowan Spokeshave' }, [{ shopId: shopA, shopName: 'Harbour Works', role: 'mechanic', spendingLimitMinor: null }]);

afterEach(() => vi.unstubAllGlobals());

describe('accepting an invitation', () => {
  it('creates the account with a name and password and opens the shop signed in', async () => {
    const user = userEvent.setup();
    let signedIn = false;
    const { requests } = installFakeApi({
      'GET /me': () => (signedIn ? { body: mechanicMe() } : unauthenticated),
      [`GET /invitations/${token}`]: () => ({ body: invitation(false) }),
      'POST /invitations/accept': () => {
        signedIn = true;
        return { body: mechanicMe() };
      },
      [`GET /shops/${shopA}`]: () => ({ body: { id: shopA, name: 'Harbour Works', slug: 'harbour-works', createdAt: '2024-03-01T09:00:00.000Z' } }),
    });
    const { router } = renderApp(`/accept-invitation?token=${token}`);
    expect(await screen.findByText('Mechanic', {}, slow)).toBeInTheDocument();
    expect(screen.getByText('rowan@harbour-works.test')).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Accept and join Harbour Works' }));
    expect(screen.getByLabelText('Your name')).toBeInvalid();
    expect(requests.filter((r) => r.method === 'POST')).toHaveLength(0);

    await user.type(screen.getByLabelText('Your name'), 'Rowan Spokeshave');
    await user.type(screen.getByLabelText('Choose a password'), 'bench-vice-and-feeler-gauge');
    await user.click(screen.getByRole('button', { name: 'Accept and join Harbour Works' }));
    await screen.findByRole('heading', { name: 'Harbour Works', level: 1 }, slow);
    expect(router.state.location.pathname).toBe(`/shops/${shopA}`);
    expect(requests.find((r) => r.path === '/invitations/accept')?.body).toEqual({ token, name: 'Rowan Spokeshave', password: 'bench-vice-and-feeler-gauge' });
  }, 20_000);

  it('asks someone with an account to sign in as the invited address first', async () => {
    installFakeApi({ 'GET /me': () => unauthenticated, [`GET /invitations/${token}`]: () => ({ body: invitation(true) }) });
    renderApp(`/accept-invitation?token=${token}`);
    const link = await screen.findByRole('link', { name: 'Sign in as rowan@harbour-works.test to accept' }, slow);
    expect(link).toHaveAttribute('href', `/sign-in?redirectTo=${encodeURIComponent(`/accept-invitation?token=${token}`)}`);
    expect(screen.queryByLabelText('Choose a password')).not.toBeInTheDocument();
  }, 20_000);

  it('says when the link has expired, was used or withdrawn', async () => {
    installFakeApi({
      'GET /me': () => unauthenticated,
      [`GET /invitations/${token}`]: () => ({ status: 404, body: { error: { code: 'not_found', message: 'This invitation link is invalid, used, withdrawn or expired.' } } }),
    });
    renderApp(`/accept-invitation?token=${token}`);
    expect(await screen.findByText('This invitation link has expired, has already been used, or was withdrawn.', {}, slow)).toBeInTheDocument();
    expect(screen.queryByLabelText('Your name')).not.toBeInTheDocument();
  }, 20_000);
});
