import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { meFixture, shopA } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';
import { ids, installCatalogueApi, listFixture, partFixture, queryOf } from '../testing';

const slow = { timeout: 5000 };
afterEach(() => vi.unstubAllGlobals());

const rows = [
  { ...partFixture(), problemCount: 0 },
  { ...partFixture({ id: ids.current, number: '71-3458', key: '713458', description: 'Pushrod seal half', status: 'available', origin: 'reproduction' }), problemCount: 2 },
];

describe('the catalogue list', () => {
  it('shows each part with its number, origin, status in words and problem count, and links to the part', async () => {
    installCatalogueApi({ [`GET /shops/${shopA}/parts`]: () => ({ body: listFixture(rows) }) });
    renderApp(`/shops/${shopA}/catalogue`);
    const table = await screen.findByRole('table', { name: 'Parts in the catalogue' }, slow);
    const [, first, second] = within(table).getAllByRole('row');
    expect(first).toHaveTextContent('71-3456');
    expect(first).toHaveTextContent('No longer available');
    expect(first).toHaveTextContent('None');
    expect(second).toHaveTextContent('Reproduction');
    expect(second).toHaveTextContent('Available');
    expect(second).toHaveTextContent('2 problems');
    expect(within(second!).getByRole('link', { name: '71-3458' })).toHaveAttribute('href', `/shops/${shopA}/catalogue/${ids.current}`);
    expect(screen.getByText('Parts 1–2 of 2')).toBeInTheDocument();
  }, 20_000);

  it('sends the filters to the API and keeps them in the address', async () => {
    const user = userEvent.setup();
    const { requests } = installCatalogueApi({ [`GET /shops/${shopA}/parts`]: () => ({ body: listFixture(rows) }) });
    const { router } = renderApp(`/shops/${shopA}/catalogue`);
    await screen.findByRole('table', { name: 'Parts in the catalogue' }, slow);
    const lastQuery = () => queryOf(requests.filter((r) => r.path.startsWith(`/shops/${shopA}/parts`)).at(-1)!);

    await user.selectOptions(screen.getByLabelText('Origin'), 'reproduction');
    await waitFor(() => expect(lastQuery()).toMatchObject({ origin: 'reproduction' }));
    await waitFor(() => expect(screen.getByLabelText('Origin')).toHaveValue('reproduction'));
    await user.selectOptions(screen.getByLabelText('Category'), 'Clutch');
    await waitFor(() => expect(lastQuery()).toMatchObject({ origin: 'reproduction', category: 'Clutch' }));
    await waitFor(() => expect(screen.getByLabelText('Category')).toHaveValue('Clutch'));
    await user.click(screen.getByRole('checkbox', { name: 'Problems only' }));
    await waitFor(() => expect(lastQuery()).toMatchObject({ problemsOnly: 'true' }));
    await waitFor(() => expect(screen.getByRole('checkbox', { name: 'Problems only' })).toBeChecked());
    await user.selectOptions(screen.getByLabelText('Status'), 'nla');
    await waitFor(() => expect(screen.getByLabelText('Status')).toHaveValue('nla'));
    await user.type(screen.getByRole('searchbox', { name: 'Number or description' }), '71-34');
    // Typing alone does not search; Enter does.
    expect(lastQuery().q).toBeUndefined();
    await user.keyboard('{Enter}');
    await waitFor(() => expect(lastQuery()).toEqual({ q: '71-34', category: 'Clutch', origin: 'reproduction', status: 'nla', problemsOnly: 'true', pageSize: '25' }));
    expect(new URLSearchParams(router.state.location.search).get('q')).toBe('71-34');

    await user.click(screen.getByRole('button', { name: 'Clear filters' }));
    // Back to the unfiltered list (served from the cache of the first visit).
    await waitFor(() => expect(router.state.location.search).toBe(''));
    await waitFor(() => expect(screen.getByLabelText('Origin')).toHaveValue(''));
    expect(screen.getByRole('searchbox', { name: 'Number or description' })).toHaveValue('');
  }, 20_000);

  it('pages through the server’s pages', async () => {
    const user = userEvent.setup();
    const { requests } = installCatalogueApi({
      [`GET /shops/${shopA}/parts`]: (r) => ({ body: listFixture(rows, { total: 60, page: Number(queryOf(r).page ?? 1) }) }),
    });
    renderApp(`/shops/${shopA}/catalogue`);
    expect(await screen.findByText('Page 1 of 3', {}, slow)).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Previous page' })).toBeDisabled();
    await user.click(screen.getByRole('button', { name: 'Next page' }));
    expect(await screen.findByText('Page 2 of 3')).toBeInTheDocument();
    expect(queryOf(requests.filter((r) => r.path.split('?')[0] === `/shops/${shopA}/parts`).at(-1)!)).toMatchObject({ page: '2' });
  }, 20_000);

  it('says how to fill an empty catalogue, with add and import for the owner', async () => {
    installCatalogueApi({ [`GET /shops/${shopA}/parts`]: () => ({ body: listFixture([]) }) });
    renderApp(`/shops/${shopA}/catalogue`);
    const empty = (await screen.findByText('The catalogue is empty', {}, slow)).parentElement!;
    expect(within(empty).getByRole('button', { name: 'Add a part' })).toBeInTheDocument();
    expect(within(empty).getByRole('link', { name: 'Import a file' })).toHaveAttribute('href', `/shops/${shopA}/catalogue/import`);
    expect(screen.getByRole('link', { name: 'parts' })).toHaveAttribute('href', `/api/shops/${shopA}/exports/parts.csv`);
    expect(screen.getByRole('navigation', { name: 'Main' })).toHaveTextContent('Catalogue');
  }, 20_000);

  it('offers a viewer no add or import, but the exports', async () => {
    const viewer = meFixture({}, [{ shopId: shopA, shopName: 'Harbour Works', role: 'viewer', spendingLimitMinor: null }]);
    installCatalogueApi({ [`GET /shops/${shopA}/parts`]: () => ({ body: listFixture([]) }) }, viewer);
    renderApp(`/shops/${shopA}/catalogue`);
    expect(await screen.findByText(/Ask the owner or the parts buyer/, {}, slow)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: /Add/ })).not.toBeInTheDocument();
    expect(screen.queryByRole('link', { name: /Import/ })).not.toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'links' })).toHaveAttribute('href', `/api/shops/${shopA}/exports/links.csv`);
  }, 20_000);

  it('adds a part, showing the schema’s field errors first, and opens its page', async () => {
    const user = userEvent.setup();
    const created = partFixture({ id: ids.kit, number: '06-1122', description: 'Gasket set' });
    const { requests } = installCatalogueApi({
      [`GET /shops/${shopA}/parts`]: () => ({ body: listFixture(rows) }),
      [`POST /shops/${shopA}/parts`]: () => ({ status: 201, body: created }),
      [`GET /shops/${shopA}/parts/${ids.kit}`]: () => ({ body: { part: created, linksFrom: [], linksTo: [], fitments: [], current: [{ partId: ids.kit, number: '06-1122', quantity: 1 }], problems: [] } }),
      [`GET /shops/${shopA}/parts/${ids.kit}/lineage`]: () => ({ body: { nodes: [], edges: [], truncated: false } }),
    });
    const { router } = renderApp(`/shops/${shopA}/catalogue`);
    await user.click(await screen.findByRole('button', { name: 'Add part' }, slow));
    const dialog = screen.getByRole('dialog', { name: 'Add a part' });
    await user.type(within(dialog).getByLabelText('Part number'), '06#1122');
    await user.click(within(dialog).getByRole('button', { name: 'Add part' }));
    expect(within(dialog).getByLabelText('Part number')).toHaveAccessibleDescription(/letters, digits, spaces/);
    expect(within(dialog).getByLabelText('Description')).toHaveAccessibleDescription('Describe the part.');
    expect(requests.filter((r) => r.method === 'POST')).toHaveLength(0);

    await user.clear(within(dialog).getByLabelText('Part number'));
    await user.type(within(dialog).getByLabelText('Part number'), '06-1122');
    await user.type(within(dialog).getByLabelText('Description'), 'Gasket set');
    await user.type(within(dialog).getByLabelText('Supplier numbers'), 'GS 11, GS-11A');
    await user.click(within(dialog).getByRole('button', { name: 'Add part' }));
    await waitFor(() => expect(router.state.location.pathname).toBe(`/shops/${shopA}/catalogue/${ids.kit}`));
    expect(requests.find((r) => r.method === 'POST')?.body).toMatchObject({ number: '06-1122', description: 'Gasket set', supplierNumbers: ['GS 11', 'GS-11A'], maker: null });
  }, 20_000);

  it('shows the API’s field errors next to the fields', async () => {
    const user = userEvent.setup();
    installCatalogueApi({
      [`GET /shops/${shopA}/parts`]: () => ({ body: listFixture(rows) }),
      [`POST /shops/${shopA}/parts`]: () => ({
        status: 409,
        body: { error: { code: 'conflict', message: 'That number is taken.', details: [{ path: ['number'], message: '06-1122 is already in the catalogue.' }] } },
      }),
    });
    renderApp(`/shops/${shopA}/catalogue`);
    await user.click(await screen.findByRole('button', { name: 'Add part' }, slow));
    const dialog = screen.getByRole('dialog', { name: 'Add a part' });
    await user.type(within(dialog).getByLabelText('Part number'), '06-1122');
    await user.type(within(dialog).getByLabelText('Description'), 'Gasket set');
    await user.click(within(dialog).getByRole('button', { name: 'Add part' }));
    await waitFor(() => expect(within(dialog).getByLabelText('Part number')).toHaveAccessibleDescription('06-1122 is already in the catalogue.'));
    // What was typed stays.
    expect(within(dialog).getByLabelText('Description')).toHaveValue('Gasket set');
  }, 20_000);

  it('says when the catalogue has data problems and lists only the parts they touch on request', async () => {
    const user = userEvent.setup();
    const { requests } = installCatalogueApi({
      [`GET /shops/${shopA}/parts`]: () => ({ body: listFixture(rows) }),
      [`GET /shops/${shopA}/catalogue/problems`]: () => ({
        body: { problems: [{ kind: 'cycle', numbers: ['70-6620', '71-6620'] }, { kind: 'dead_end', numbers: ['03-740'] }] },
      }),
    });
    renderApp(`/shops/${shopA}/catalogue`);
    const banner = await screen.findByRole('region', { name: 'Data problems' }, slow);
    expect(banner).toHaveTextContent('The catalogue has 2 data problems: circular replacements, dead ends.');
    await user.click(within(banner).getByRole('button', { name: 'Show only parts with problems' }));
    await waitFor(() => expect(screen.getByRole('checkbox', { name: 'Problems only' })).toBeChecked());
    expect(requests.some((r) => r.path.startsWith(`/shops/${shopA}/parts?`) && r.path.includes('problemsOnly=true'))).toBe(true);
    expect(within(banner).queryByRole('button')).not.toBeInTheDocument();
  }, 20_000);
});
