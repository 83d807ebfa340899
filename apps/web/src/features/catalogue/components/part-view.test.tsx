import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { meFixture, shopA } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';
import { detailFixture, ids, installCatalogueApi, lineageFixture, listFixture, partFixture } from '../testing';

const slow = { timeout: 5000 };
afterEach(() => vi.unstubAllGlobals());

function partApi(overrides: { detail?: ReturnType<typeof detailFixture>; lineage?: ReturnType<typeof lineageFixture> } = {}, extra = {}) {
  return {
    [`GET /shops/${shopA}/parts/${ids.old}`]: () => ({ body: overrides.detail ?? detailFixture() }),
    [`GET /shops/${shopA}/parts/${ids.old}/lineage`]: () => ({ body: overrides.lineage ?? lineageFixture() }),
    ...extra,
  };
}

describe('the part page', () => {
  it('shows the number as the heading, the current orderable number, supplier numbers and fitment', async () => {
    installCatalogueApi(partApi());
    renderApp(`/shops/${shopA}/catalogue/${ids.old}`);
    expect(await screen.findByRole('heading', { level: 1, name: /71-3456/ }, slow)).toHaveTextContent('Clutch pushrod seal');
    expect(screen.getByText('Current orderable number:').parentElement).toHaveTextContent('Current orderable number: 71-3458 ×2');
    expect(screen.getByText('HX 220-14')).toBeInTheDocument();
    // The tables load just after the part's first paint.
    const fitments = await screen.findByRole('table', { name: 'What this part fits' }, slow);
    expect(fitments).toHaveTextContent('Ferncastle');
    expect(fitments).toHaveTextContent('1968–1971');
    const linksFrom = screen.getByRole('table', { name: 'Links from 71-3456' });
    expect(linksFrom).toHaveTextContent('Is replaced by');
    expect(linksFrom).toHaveTextContent('fits both ways');
    expect(linksFrom).toHaveTextContent('Service note 14');
    expect(linksFrom).toHaveTextContent('1971-06-01');
  }, 20_000);

  it('lists the lineage in words beside a picture whose boxes link to each part', async () => {
    installCatalogueApi(partApi());
    renderApp(`/shops/${shopA}/catalogue/${ids.old}`);
    const list = await screen.findByRole('list', { name: 'Links in the lineage' }, slow);
    const items = within(list).getAllByRole('listitem').map((li) => li.textContent);
    expect(items).toEqual(['71-3456 is replaced by 71-3457 (×1, fits both ways)', '71-3457 is replaced by 71-3458 (×2, new fits old only)']);
    expect(screen.getByText('Current part:').parentElement).toHaveTextContent('Current part: 71-3458');

    const picture = await screen.findByRole('figure', { name: /Lineage picture of 71-3456/ }, slow);
    const current = within(picture).getByRole('link', { name: '71-3458, Pushrod seal half, Current' });
    expect(current).toHaveAttribute('href', `/shops/${shopA}/catalogue/${ids.current}`);
    expect(current).toHaveTextContent('Current');
    expect(within(picture).getByRole('link', { name: /71-3456/ })).toHaveAttribute('aria-current', 'page');
    expect(within(picture).getByRole('link', { name: /71-3456/ })).toHaveTextContent('No longer available');
    expect(picture).toHaveTextContent('replaced by ×2, one way');
    expect(screen.queryByText(/goes on beyond/)).not.toBeInTheDocument();
  }, 20_000);

  it('highlights data problems and says when the picture is cut short', async () => {
    const detail = { ...detailFixture(), current: [], problems: [{ kind: 'cycle' as const, numbers: ['71-3456', '71-3457'] }] };
    const base = lineageFixture();
    const lineage = { ...base, nodes: base.nodes.map((n) => ({ ...n, inProblem: n.partId !== ids.current })), truncated: true };
    installCatalogueApi(partApi({ detail, lineage }));
    renderApp(`/shops/${shopA}/catalogue/${ids.old}`);
    const problems = await screen.findByRole('region', { name: 'A data problem touches this part' }, slow);
    expect(problems).toHaveTextContent('Circular replacement: These numbers replace one another in a circle: 71-3456 → 71-3457.');
    expect(screen.getByText(/No current orderable number/)).toBeInTheDocument();
    expect(await screen.findByText(/goes on beyond what is shown/, {}, slow)).toBeInTheDocument();
    const picture = await screen.findByRole('figure', {}, slow);
    expect(within(picture).getByRole('link', { name: /71-3457/ })).toHaveTextContent('Problem');
    expect(within(picture).getByRole('link', { name: /71-3458/ })).not.toHaveTextContent('Problem');
  }, 20_000);

  it('offers no editing to a mechanic', async () => {
    const mechanic = meFixture({}, [{ shopId: shopA, shopName: 'Harbour Works', role: 'mechanic', spendingLimitMinor: null }]);
    installCatalogueApi(partApi(), mechanic);
    renderApp(`/shops/${shopA}/catalogue/${ids.old}`);
    await screen.findByRole('list', { name: 'Links in the lineage' }, slow);
    expect(screen.queryByRole('button', { name: /Edit|Delete|Add/ })).not.toBeInTheDocument();
  }, 20_000);

  it('says so when the part is not in this shop', async () => {
    installCatalogueApi({});
    renderApp(`/shops/${shopA}/catalogue/${ids.old}`);
    expect(await screen.findByRole('heading', { name: 'This part was not found' }, slow)).toBeInTheDocument();
  }, 20_000);

  it('adds a link to a part found by number, and deletes a link after confirming', async () => {
    const user = userEvent.setup();
    const target = partFixture({ id: ids.kit, number: '71-9000', key: '719000', description: 'Seal kit', status: 'available' });
    const { requests } = installCatalogueApi(
      partApi({}, {
        [`GET /shops/${shopA}/parts`]: () => ({ body: listFixture([{ ...target, problemCount: 0 }]) }),
        [`POST /shops/${shopA}/part-links`]: () => ({ status: 201, body: { ...detailFixture().linksFrom[0], id: ids.kit, kind: 'equivalent', toPartId: ids.kit, toNumber: '71-9000', interchange: 'one_way' } }),
        [`DELETE /shops/${shopA}/part-links/${ids.link}`]: () => ({ status: 204 }),
      }),
    );
    renderApp(`/shops/${shopA}/catalogue/${ids.old}`);
    await user.click(await screen.findByRole('button', { name: 'Add link' }, slow));
    const dialog = await screen.findByRole('dialog', { name: 'Link 71-3456 to another part' }, slow);
    await user.selectOptions(within(dialog).getByLabelText('Kind of link'), 'equivalent');
    // An equivalent is both ways or one way, never "with changes".
    expect(within(within(dialog).getByLabelText('Interchange')).queryByRole('option', { name: 'fits with changes' })).not.toBeInTheDocument();
    await user.click(within(dialog).getByRole('button', { name: 'Add link' }));
    expect(within(dialog).getByRole('searchbox', { name: 'Other part' })).toHaveAccessibleDescription(/Choose the other part/);

    await user.type(within(dialog).getByRole('searchbox', { name: 'Other part' }), '9000');
    await user.click(await within(dialog).findByRole('radio', { name: /71-9000/ }));
    await user.selectOptions(within(dialog).getByLabelText('Interchange'), 'one_way');
    await user.click(within(dialog).getByRole('button', { name: 'Add link' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({
      fromPartId: ids.old,
      kind: 'equivalent',
      toPartId: ids.kit,
      quantity: 1,
      interchange: 'one_way',
      effectiveDate: null,
      sourceReference: null,
      note: null,
    });

    await user.click(screen.getByRole('button', { name: 'Delete the link “is replaced by 71-3457”' }));
    const confirm = screen.getByRole('alertdialog', { name: 'Delete this link?' });
    expect(within(confirm).getByRole('button', { name: 'Cancel' })).toHaveFocus();
    await user.click(within(confirm).getByRole('button', { name: 'Delete link' }));
    await waitFor(() => expect(requests.some((r) => r.method === 'DELETE' && r.path === `/shops/${shopA}/part-links/${ids.link}`)).toBe(true));
  }, 20_000);

  it('adds a fitment after checking its years, and edits the part with its current values filled in', async () => {
    const user = userEvent.setup();
    const { requests } = installCatalogueApi(
      partApi({}, {
        [`POST /shops/${shopA}/fitments`]: () => ({ status: 201, body: { ...detailFixture().fitments[0], id: ids.kit } }),
        [`PATCH /shops/${shopA}/parts/${ids.old}`]: () => ({ body: partFixture({ description: 'Clutch pushrod oil seal' }) }),
      }),
    );
    renderApp(`/shops/${shopA}/catalogue/${ids.old}`);
    await user.click(await screen.findByRole('button', { name: 'Add fitment' }, slow));
    const dialog = await screen.findByRole('dialog', { name: 'What does 71-3456 fit?' }, slow);
    await user.type(within(dialog).getByLabelText('Marque'), 'Ferncastle');
    await user.type(within(dialog).getByLabelText('Model'), 'Merlin 500');
    await user.type(within(dialog).getByLabelText('First year'), '1972');
    await user.type(within(dialog).getByLabelText('Last year'), '1969');
    await user.click(within(dialog).getByRole('button', { name: 'Add fitment' }));
    expect(within(dialog).getByLabelText('Last year')).toHaveAccessibleDescription(/The first year comes before the last\./);
    expect(requests.filter((r) => r.method === 'POST')).toHaveLength(0);
    await user.clear(within(dialog).getByLabelText('Last year'));
    await user.type(within(dialog).getByLabelText('Last year'), '1975');
    await user.click(within(dialog).getByRole('button', { name: 'Add fitment' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ partId: ids.old, marque: 'Ferncastle', model: 'Merlin 500', yearFrom: 1972, yearTo: 1975, frameFrom: null, frameTo: null });

    await user.click(screen.getByRole('button', { name: 'Edit part' }));
    const edit = await screen.findByRole('dialog', { name: 'Edit 71-3456' }, slow);
    expect(within(edit).getByLabelText('Supplier numbers')).toHaveValue('HX 220-14');
    expect(within(edit).getByLabelText('Status')).toHaveValue('nla');
    await user.clear(within(edit).getByLabelText('Description'));
    await user.type(within(edit).getByLabelText('Description'), 'Clutch pushrod oil seal');
    await user.click(within(edit).getByRole('button', { name: 'Save part' }));
    await waitFor(() => expect(screen.queryByRole('dialog')).not.toBeInTheDocument());
    expect(requests.find((r) => r.method === 'PATCH')?.body).toMatchObject({ number: '71-3456', description: 'Clutch pushrod oil seal', status: 'nla', supplierNumbers: ['HX 220-14'] });
  }, 20_000);
});
