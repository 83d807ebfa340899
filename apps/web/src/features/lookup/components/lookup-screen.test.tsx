import type { PartSearchResult } from '@tappet/contracts';
import { act, fireEvent, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, ownerOfA, shopA, type RecordedRequest } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';
import { recentLookupsKey } from '../hooks/use-recent-lookups';

const slow = { timeout: 5000 };
const partId = 'aaaaaaaa-0000-4000-8000-00000000000a';
const otherId = 'aaaaaaaa-0000-4000-8000-00000000000b';
const me = ownerOfA();

const result = (overrides: Partial<PartSearchResult> = {}): PartSearchResult => ({
  id: partId,
  number: '71-3456',
  description: 'Clutch cable, inner',
  origin: 'genuine',
  category: 'Controls',
  status: 'available',
  match: 'fuzzy',
  reason: 'close to 71-3456 (1 typo)',
  ...overrides,
});

/** The fake API: `answer(q)` gives the lookup's results; everything else the app needs at start. */
function install(answer: (q: string) => { status?: number; body?: unknown }, sellPrices: (ids: string[]) => { status?: number; body?: unknown } = () => ({ body: { currency: 'GBP', prices: [] } })) {
  const base: Record<string, (r: RecordedRequest) => { status?: number; body?: unknown }> = {
    'GET /me': () => ({ body: me }),
    [`GET /shops/${shopA}`]: () => ({ body: { id: shopA, name: 'Harbour Works', slug: 'harbour-works', createdAt: '2024-03-01T09:00:00.000Z' } }),
    [`GET /shops/${shopA}/parts/search`]: (r) => answer(new URLSearchParams(r.path.split('?')[1]).get('q') ?? ''),
    [`GET /shops/${shopA}/parts`]: () => ({ body: { items: [], total: 0, page: 1, pageSize: 1, categories: ['Brakes', 'Controls'] } }),
    [`GET /shops/${shopA}/sales/sell-prices`]: (r) => sellPrices(new URLSearchParams(r.path.split('?')[1]).getAll('partIds')),
  };
  const routes = new Proxy(base, { get: (target, key) => (typeof key === 'string' ? (target[key] ?? target[key.split('?')[0] ?? key]) : undefined) });
  return installFakeApi(routes);
}

const searches = (requests: RecordedRequest[]) => requests.filter((r) => r.path.startsWith(`/shops/${shopA}/parts/search`)).map((r) => new URLSearchParams(r.path.split('?')[1]).get('q'));

beforeEach(() => localStorage.clear());
afterEach(() => vi.unstubAllGlobals());

describe('the lookup screen', () => {
  it('focuses the field, shows results as you type with the reason, and opens the highlighted part with the keyboard', async () => {
    const user = userEvent.setup();
    const { requests } = install((q) => ({ body: { results: q ? [result(), result({ id: otherId, number: '71-3465', description: 'Brake light switch', match: 'fuzzy', reason: 'close to 71-3465 (1 typo)', status: 'nla', origin: 'pattern' })] : [] } }));
    const { router } = renderApp(`/shops/${shopA}/lookup`);
    const field = await screen.findByRole('combobox', { name: 'Look up a part' }, slow);
    await waitFor(() => expect(field).toHaveFocus());
    await user.type(field, '71-4356');
    const list = await screen.findByRole('listbox', { name: 'Lookup results' }, slow);
    const [first, second] = within(list).getAllByRole('option');
    expect(first).toHaveTextContent('71-3456');
    expect(first).toHaveTextContent('close to 71-3456 (1 typo)');
    expect(first).toHaveAttribute('aria-selected', 'true');
    expect(second).toHaveTextContent('Pattern');
    expect(second).toHaveTextContent('No longer available');
    // Debounced: one request for the whole number, not one per key.
    expect(searches(requests)).toEqual(['71-4356']);

    await user.keyboard('{ArrowDown}');
    expect(second).toHaveAttribute('aria-selected', 'true');
    expect(field).toHaveAttribute('aria-activedescendant', second!.id);
    await user.keyboard('{Enter}');
    await waitFor(() => expect(router.state.location.pathname).toBe(`/shops/${shopA}/catalogue/${otherId}`));
    expect(JSON.parse(localStorage.getItem(recentLookupsKey(me.user.id, shopA))!)).toEqual([{ partId: otherId, number: '71-3465', description: 'Brake light switch', query: '71-4356' }]);
  });

  it('narrows the lookup to a vehicle, a category and an origin, keeps the filters in the URL and clears them', async () => {
    const user = userEvent.setup();
    const base = install((q) => ({ body: { results: q ? [result()] : [] } }));
    const { router } = renderApp(`/shops/${shopA}/lookup`);
    const field = await screen.findByRole('combobox', { name: 'Look up a part' }, slow);
    await user.click(screen.getByRole('button', { name: 'Narrow down' }));
    const form = screen.getByRole('search', { name: 'Narrow the lookup' });
    await user.type(within(form).getByRole('textbox', { name: 'Marque' }), 'Corran');
    await user.type(within(form).getByRole('textbox', { name: 'Year' }), '19');
    await user.click(within(form).getByRole('button', { name: 'Apply' }));
    // A half-typed year is refused with a reason; nothing is applied and the form stays open.
    expect(await within(form).findByText('Give a year like 1968 (1880 to 2100).')).toBeInTheDocument();
    expect(router.state.location.search).toBe('');
    await user.type(within(form).getByRole('textbox', { name: 'Year' }), '68');
    await user.selectOptions(within(form).getByRole('combobox', { name: 'Origin' }), 'Genuine');
    await user.selectOptions(await within(form).findByRole('combobox', { name: 'Category' }), await within(form).findByRole('option', { name: 'Brakes' }));
    await user.click(within(form).getByRole('textbox', { name: 'Model' }));
    await user.keyboard('{Enter}');
    await waitFor(() => expect(screen.queryByRole('search', { name: 'Narrow the lookup' })).not.toBeInTheDocument());
    expect(new URLSearchParams(router.state.location.search).get('marque')).toBe('Corran');
    // The router's state changes at once; the screen follows on its next render.
    expect(await screen.findByText('Fits Corran 1968 · Brakes · Genuine', {}, slow)).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Narrowed (4)' })).toBeInTheDocument();

    await user.type(field, 'clutch');
    await screen.findByRole('listbox', { name: 'Lookup results' }, slow);
    const sent = base.requests.filter((r) => r.path.startsWith(`/shops/${shopA}/parts/search`)).map((r) => new URLSearchParams(r.path.split('?')[1]));
    expect(sent.at(-1)?.get('q')).toBe('clutch');
    expect(sent.at(-1)?.get('marque')).toBe('Corran');
    expect(sent.at(-1)?.get('year')).toBe('1968');
    expect(sent.at(-1)?.get('origin')).toBe('genuine');
    expect(sent.at(-1)?.get('category')).toBe('Brakes');
    expect(sent.at(-1)?.has('model')).toBe(false);

    await user.click(screen.getByRole('button', { name: 'Clear' }));
    await waitFor(() => expect(router.state.location.search).toBe(''));
    await waitFor(() => expect(base.requests.filter((r) => r.path.startsWith(`/shops/${shopA}/parts/search`)).at(-1)?.path).not.toContain('marque'));
  });

  it('ignores filter values in a link that the API would refuse', async () => {
    const user = userEvent.setup();
    const { requests } = install((q) => ({ body: { results: q ? [result()] : [] } }));
    renderApp(`/shops/${shopA}/lookup?year=19x&origin=stolen&marque=Velmark`);
    const field = await screen.findByRole('combobox', { name: 'Look up a part' }, slow);
    expect(await screen.findByText('Fits Velmark', {}, slow)).toBeInTheDocument();
    await user.type(field, 'hub');
    await screen.findByRole('listbox', { name: 'Lookup results' }, slow);
    const sent = new URLSearchParams(requests.filter((r) => r.path.includes('/parts/search')).at(-1)!.path.split('?')[1]);
    expect([sent.get('marque'), sent.get('year'), sent.get('origin')]).toEqual(['Velmark', null, null]);
  });

  it('keeps the previous results on screen while the next answer loads', async () => {
    const user = userEvent.setup();
    let release: () => void = () => undefined;
    install((q) => (q === '71-3' ? { body: { results: [result({ match: 'partial', reason: 'number starts with 713' })] } } : { body: { results: [] } }));
    renderApp(`/shops/${shopA}/lookup`);
    const field = await screen.findByRole('combobox', { name: 'Look up a part' }, slow);
    await user.type(field, '71-3');
    await screen.findByText('number starts with 713', {}, slow);
    install(
      () =>
        new Promise((resolve) => {
          release = () => resolve({ body: { results: [] } });
        }) as never,
    );
    await user.type(field, '9');
    await waitFor(() => expect(field).toHaveValue('71-39'));
    // Past the debounce, the new request is in flight: the old row is still shown.
    await act(() => new Promise((r) => setTimeout(r, 250)));
    expect(screen.getByText('number starts with 713')).toBeInTheDocument();
    release();
    await screen.findByText('Nothing matches “71-39”', {}, slow);
  });

  it('opens an exact hit at once when a scanner types the code and Enter', async () => {
    const { requests } = install((q) => ({ body: { results: q === 'VX880' ? [result({ number: 'VX/880', match: 'exact', reason: 'exact number' })] : [] } }));
    const { router } = renderApp(`/shops/${shopA}/lookup`);
    const field = await screen.findByRole('combobox', { name: 'Look up a part' }, slow);
    // A scanner: every key within a few milliseconds, then Enter (before any debounce fires).
    for (const key of 'VX880') {
      fireEvent.keyDown(field, { key });
      fireEvent.change(field, { target: { value: `${(field as HTMLInputElement).value}${key}` } });
    }
    fireEvent.keyDown(field, { key: 'Enter' });
    await waitFor(() => expect(router.state.location.pathname).toBe(`/shops/${shopA}/catalogue/${partId}`));
    expect(searches(requests)).toContain('VX880');
  });

  it('does not open a scanned code that only matches loosely', async () => {
    install(() => ({ body: { results: [result()] } }));
    const { router } = renderApp(`/shops/${shopA}/lookup`);
    const field = await screen.findByRole('combobox', { name: 'Look up a part' }, slow);
    for (const key of '714356') {
      fireEvent.keyDown(field, { key });
      fireEvent.change(field, { target: { value: `${(field as HTMLInputElement).value}${key}` } });
    }
    fireEvent.keyDown(field, { key: 'Enter' });
    await screen.findByRole('listbox', { name: 'Lookup results' }, slow);
    expect(router.state.location.pathname).toBe(`/shops/${shopA}/lookup`);
  });

  it('comes back to the field on "/", and says when nothing matches or the lookup failed', async () => {
    const user = userEvent.setup();
    install((q) => (q === 'boom' ? { status: 500, body: { error: { code: 'internal', message: 'The server had a problem.' } } } : { body: { results: [] } }));
    renderApp(`/shops/${shopA}/lookup`);
    const field = await screen.findByRole('combobox', { name: 'Look up a part' }, slow);
    await user.type(field, 'zz-99');
    await screen.findByText('Nothing matches “zz-99”', {}, slow);
    field.blur();
    await user.keyboard('/');
    expect(field).toHaveFocus();
    expect(field).toHaveValue('zz-99');
    await user.clear(field);
    await user.type(field, 'boom');
    const alert = await screen.findByRole('alert', {}, slow);
    expect(alert).toHaveTextContent('The lookup failed');
    expect(within(alert).getByRole('button', { name: 'Try again' })).toBeInTheDocument();
  });

  it('lists this person’s recent lookups in this shop when the field is empty', async () => {
    const user = userEvent.setup();
    localStorage.setItem(recentLookupsKey(me.user.id, shopA), JSON.stringify([{ partId, number: '71-3456', description: 'Clutch cable, inner', query: '3456' }, { bogus: true }]));
    localStorage.setItem(recentLookupsKey('someone-else', shopA), JSON.stringify([{ partId: otherId, number: '99-0000', description: 'Not mine', query: '99' }]));
    install(() => ({ body: { results: [] } }));
    const { router } = renderApp(`/shops/${shopA}/lookup`);
    const recent = await screen.findByRole('region', { name: 'Recent lookups' }, slow);
    expect(within(recent).getAllByRole('link')).toHaveLength(1);
    expect(recent).toHaveTextContent('typed “3456”');
    expect(screen.queryByText('Not mine')).not.toBeInTheDocument();
    await user.click(within(recent).getByRole('link', { name: /71-3456/ }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/shops/${shopA}/catalogue/${partId}`));
  });

  it('shows each result’s sell price before tax, from one request for all the results', async () => {
    const user = userEvent.setup();
    const price = (id: string, unitMinor: number | null) => ({ partId: id, unitMinor, basis: unitMinor === null ? 'no-price' : 'list', markupPercent: null, listPriceMinor: unitMinor });
    const { requests } = install(
      (q) => ({ body: { results: q ? [result(), result({ id: otherId, number: '71-3465', description: 'Brake light switch' })] : [] } }),
      (ids) => ({ body: { currency: 'GBP', prices: ids.map((id) => price(id, id === partId ? 2499 : null)) } }),
    );
    renderApp(`/shops/${shopA}/lookup`);
    await user.type(await screen.findByRole('combobox', { name: 'Look up a part' }, slow), '71-34');
    const list = await screen.findByRole('listbox', { name: 'Lookup results' }, slow);
    const [first, second] = within(list).getAllByRole('option');
    await waitFor(() => expect(within(first!).getByTestId('lookup-sell-price')).toHaveTextContent('Sell £24.99 before tax'));
    // No price: nothing rather than a dash (the part's page says why).
    expect(within(second!).queryByTestId('lookup-sell-price')).not.toBeInTheDocument();
    const priceRequests = requests.filter((r) => r.path.startsWith(`/shops/${shopA}/sales/sell-prices`));
    expect(priceRequests).toHaveLength(1);
    expect(new URLSearchParams(priceRequests[0]!.path.split('?')[1]).getAll('partIds').sort()).toEqual([partId, otherId].sort());
  });

  it('still lists the results when the sell prices cannot be had', async () => {
    const user = userEvent.setup();
    install(
      (q) => ({ body: { results: q ? [result()] : [] } }),
      () => ({ status: 500, body: { error: { code: 'internal', message: 'The server had a problem.' } } }),
    );
    renderApp(`/shops/${shopA}/lookup`);
    await user.type(await screen.findByRole('combobox', { name: 'Look up a part' }, slow), '71-34');
    const list = await screen.findByRole('listbox', { name: 'Lookup results' }, slow);
    expect(within(list).getByRole('option')).toHaveTextContent('71-3456');
    await new Promise((r) => setTimeout(r, 200));
    expect(within(list).queryByTestId('lookup-sell-price')).not.toBeInTheDocument();
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
  });

  it('puts Lookup first in the rail', async () => {
    install(() => ({ body: { results: [] } }));
    renderApp(`/shops/${shopA}/lookup`);
    const nav = await screen.findByRole('navigation', {}, slow);
    expect(within(nav).getAllByRole('link')[0]).toHaveTextContent('Lookup');
  });
});
