import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { shopQueryKey } from '../lib/query-client';
import { installFakeApi, meFixture, ownerOfA, shopA, shopB, type RecordedRequest } from '../testing/fake-api';
import { renderApp } from '../testing/render-app';

const slow = { timeout: 5000 };
const shopDetail = (id: string, name: string) => ({ id, name, slug: name.toLowerCase().replace(/ /g, '-'), createdAt: '2024-03-01T09:00:00.000Z' });
const unauthenticated = { status: 401, body: { error: { code: 'unauthenticated', message: 'Sign in to continue.' } } };

afterEach(() => vi.unstubAllGlobals());

/** A signed-in owner of shop A (and viewer of shop B), with the shop endpoints. */
function ownerApi(extra: Record<string, (r: RecordedRequest) => { status?: number; body?: unknown }> = {}) {
  let me = ownerOfA();
  return installFakeApi({
    'GET /me': () => ({ body: me }),
    [`GET /shops/${shopA}`]: () => ({ body: shopDetail(shopA, 'Harbour Works') }),
    [`GET /shops/${shopB}`]: () => ({ body: shopDetail(shopB, 'Brackenfold Garage') }),
    'POST /me/active-shop': (r) => {
      me = { ...me, activeShopId: (r.body as { shopId: string }).shopId };
      return { body: me };
    },
    'POST /auth/sign-out': () => ({ body: { ok: true } }),
    ...extra,
  });
}

describe('signing in', () => {
  it('sends a signed-out visitor to sign in and back to the page they asked for', async () => {
    const user = userEvent.setup();
    let signedIn = false;
    const { requests } = installFakeApi({
      'GET /me': () => (signedIn ? { body: ownerOfA() } : unauthenticated),
      'POST /auth/sign-in': () => {
        signedIn = true;
        return { body: ownerOfA() };
      },
      [`GET /shops/${shopA}`]: () => ({ body: shopDetail(shopA, 'Harbour Works') }),
    });
    const { router } = renderApp(`/shops/${shopA}`);
    await screen.findByRole('heading', { name: 'Sign in to Tappet' }, slow);
    expect(router.state.location.search).toBe(`?redirectTo=${encodeURIComponent(`/shops/${shopA}`)}`);

    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(screen.getByLabelText('E-mail')).toBeInvalid();
    expect(screen.getByLabelText('E-mail')).toHaveFocus();
    expect(screen.getByLabelText('Password')).toHaveAccessibleDescription('Enter your password.');
    expect(requests.filter((r) => r.method === 'POST')).toHaveLength(0);

    await user.type(screen.getByLabelText('E-mail'), ' Owner@Harbour-Works.test ');
    await user.type(screen.getByLabelText('Password'), 'tappet-demo');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    await screen.findByRole('heading', { name: 'Harbour Works', level: 1 }, slow);
    expect(router.state.location.pathname).toBe(`/shops/${shopA}`);
    const signIn = requests.find((r) => r.path === '/auth/sign-in');
    expect(signIn?.body).toEqual({ email: 'owner@harbour-works.test', password: 'tappet-demo' });
    expect(signIn?.headers['x-csrf']).toBe('1');
    // The first sign-in also loads /api/me's schema on demand (docs/decisions/022-first-load.md).
  }, 20_000);

  it('shows the API’s rate-limit message', async () => {
    const user = userEvent.setup();
    installFakeApi({
      'GET /me': () => unauthenticated,
      'POST /auth/sign-in': () => ({ status: 429, body: { error: { code: 'rate_limited', message: 'Too many failed sign-in attempts. Try again in 4 minutes.' } } }),
    });
    renderApp('/sign-in');
    await user.type(await screen.findByLabelText('E-mail', {}, slow), 'owner@harbour-works.test');
    await user.type(screen.getByLabelText('Password'), 'guess');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('alert')).toHaveTextContent('Too many failed sign-in attempts. Try again in 4 minutes.');
  });
});

describe('password reset', () => {
  it('answers "check your inbox" without saying whether the address exists', async () => {
    const user = userEvent.setup();
    const { requests } = installFakeApi({ 'GET /me': () => unauthenticated, 'POST /auth/password-reset/request': () => ({ body: { ok: true } }) });
    renderApp('/forgot-password');
    await user.type(await screen.findByLabelText('E-mail', {}, slow), 'nobody@harbour-works.test');
    await user.click(screen.getByRole('button', { name: 'Send reset link' }));
    expect(await screen.findByRole('heading', { name: 'Check your inbox' })).toBeInTheDocument();
    expect(screen.getByText(/If/)).toHaveTextContent('If nobody@harbour-works.test belongs to a Tappet account');
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ email: 'nobody@harbour-works.test' });
  });

  it('says when the link is used or expired, and offers a new one', async () => {
    const user = userEvent.setup();
    installFakeApi({
      'GET /me': () => unauthenticated,
      'POST /auth/password-reset/confirm': () => ({ status: 400, body: { error: { code: 'bad_request', message: 'This reset link is invalid, used or expired. Ask for a new one.' } } }),
    });
    renderApp(`/reset-password?token=${'t'.repeat(43)}`);
    await user.type(await screen.findByLabelText('New password', {}, slow), 'a sturdy passphrase');
    await user.click(screen.getByRole('button', { name: 'Set new password' }));
    expect(await screen.findByText('This reset link has expired or has already been used.')).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Ask for a new link' })).toHaveAttribute('href', '/forgot-password');
  });

  it('sets the password and hands over to sign-in', async () => {
    const user = userEvent.setup();
    const token = 'k'.repeat(43);
    const { requests } = installFakeApi({ 'GET /me': () => unauthenticated, 'POST /auth/password-reset/confirm': () => ({ body: { ok: true } }) });
    const { router } = renderApp(`/reset-password?token=${token}`);
    await user.type(await screen.findByLabelText('New password', {}, slow), 'short');
    await user.click(screen.getByRole('button', { name: 'Set new password' }));
    expect(screen.getByLabelText('New password')).toHaveAccessibleDescription(/Use at least 8 characters\./);
    await user.clear(screen.getByLabelText('New password'));
    await user.type(screen.getByLabelText('New password'), 'a sturdy passphrase');
    await user.click(screen.getByRole('button', { name: 'Set new password' }));
    expect(await screen.findByText('Your new password is set. Sign in with it.', {}, slow)).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ token, password: 'a sturdy passphrase' });
  });

  it('treats a link without a token as a bad link', async () => {
    installFakeApi({ 'GET /me': () => unauthenticated });
    renderApp('/reset-password');
    expect(await screen.findByText('This reset link has expired or has already been used.', {}, slow)).toBeInTheDocument();
    expect(screen.queryByLabelText('New password')).not.toBeInTheDocument();
  });
});

describe('the signed-in app', () => {
  it('shows the owner the Shop page and the rename form, and renames', async () => {
    const user = userEvent.setup();
    const { requests } = ownerApi({ [`PATCH /shops/${shopA}`]: () => ({ body: shopDetail(shopA, 'Harbour Works Ltd') }) });
    renderApp(`/shops/${shopA}`);
    const nav = await screen.findByRole('navigation', { name: 'Main' }, slow);
    expect(within(nav).getAllByRole('link').map((l) => l.textContent)).toEqual(['Lookup', 'Home', 'Catalogue', 'Stock', 'Counts', 'Purchasing', 'Sales', 'Sales reports', 'Consignment', 'Vehicles', 'Jobs', 'Shop', 'Staff', 'Audit log', 'API keys', 'Billing', 'Support access', 'API documentation']);
    const field = await screen.findByLabelText('Shop name', {}, slow);
    await user.clear(field);
    await user.type(field, 'Harbour Works Ltd');
    await user.click(screen.getByRole('button', { name: 'Save shop name' }));
    expect(await screen.findByText('Shop renamed to Harbour Works Ltd.')).toBeInTheDocument();
    expect(requests.find((r) => r.method === 'PATCH')).toMatchObject({ body: { name: 'Harbour Works Ltd' }, headers: { 'x-csrf': '1' } });
  });

  it('switches shop: tells the API, forgets the old shop’s data and opens the new shop as a viewer', async () => {
    const user = userEvent.setup();
    const { requests } = ownerApi();
    const { router, queryClient } = renderApp(`/shops/${shopA}`);
    await screen.findByLabelText('Shop name', {}, slow);
    expect(queryClient.getQueryData(shopQueryKey(shopA, 'detail'))).toBeDefined();

    await user.click(screen.getByRole('button', { name: 'Switch shop' }));
    await user.click(screen.getByRole('menuitem', { name: 'Brackenfold Garage' }));
    await screen.findByRole('heading', { name: 'Brackenfold Garage', level: 1 }, slow);
    expect(router.state.location.pathname).toBe(`/shops/${shopB}`);
    expect(requests.find((r) => r.path === '/me/active-shop')?.body).toEqual({ shopId: shopB });
    // The shop layout clears other shops' data in an effect, which may run just after the new
    // heading is painted.
    await waitFor(() => expect(queryClient.getQueryData(shopQueryKey(shopA, 'detail'))).toBeUndefined());

    // A viewer gets neither the Shop page nor the rename form.
    const nav = screen.getByRole('navigation', { name: 'Main' });
    expect(within(nav).queryByRole('link', { name: 'Shop' })).not.toBeInTheDocument();
    expect(screen.queryByLabelText('Shop name')).not.toBeInTheDocument();
    expect(screen.getByText('You can read the shop’s records but not change them.')).toBeInTheDocument();
  });

  it('answers "not found" for a shop the person does not belong to', async () => {
    ownerApi();
    renderApp('/shops/99999999-9999-4999-8999-999999999999');
    expect(await screen.findByRole('heading', { name: 'This shop was not found' }, slow)).toBeInTheDocument();
    // The frame stays, so the way back is right there.
    expect(screen.getByRole('navigation', { name: 'Main' })).toBeInTheDocument();
  });

  it('tells a viewer who opens the Shop page by URL that it is for the owner', async () => {
    ownerApi();
    renderApp(`/shops/${shopB}/shop`);
    expect(await screen.findByText('This page is for the shop’s owner', {}, slow)).toBeInTheDocument();
    expect(screen.queryByLabelText('Shop name')).not.toBeInTheDocument();
  });

  it('sends a platform admin without shops to the platform page', async () => {
    installFakeApi({ 'GET /me': () => ({ body: meFixture({ isPlatformAdmin: true, name: 'Ada Admin' }) }) });
    const { router } = renderApp('/');
    expect(await screen.findByRole('heading', { name: 'Platform', level: 1 }, slow)).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/platform');
    expect(screen.queryByRole('button', { name: 'Switch shop' })).not.toBeInTheDocument();
  });

  it('signs out and returns to the sign-in page', async () => {
    const user = userEvent.setup();
    const { requests } = ownerApi();
    const { router } = renderApp(`/shops/${shopA}`);
    await user.click(await screen.findByRole('button', { name: 'Sign out' }, slow));
    await screen.findByRole('heading', { name: 'Sign in to Tappet' }, slow);
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(router.state.location.search).toBe('');
    expect(requests.some((r) => r.method === 'POST' && r.path === '/auth/sign-out')).toBe(true);
  });

  it('shows a 404 page for an unknown address', async () => {
    installFakeApi({ 'GET /me': () => unauthenticated });
    renderApp('/no/such/page');
    expect(await screen.findByRole('heading', { name: 'This page was not found' }, slow)).toBeInTheDocument();
    await waitFor(() => expect(screen.getByRole('link', { name: 'Go to your home page' })).toHaveAttribute('href', '/'));
  });
});
