import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { shopA } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';
import { ids, installCatalogueApi, listFixture, partFixture } from '../../catalogue/testing';

// The print dialog as reached from the catalogue list: choose parts, choose a format, get a PDF.
const slow = { timeout: 5000 };
const rows = [
  { ...partFixture(), problemCount: 0 },
  { ...partFixture({ id: ids.current, number: '71-3458', key: '713458', description: 'Pushrod seal half', status: 'available' }), problemCount: 0 },
];
const options = {
  defaultFormat: 'letter-3x10',
  formats: [
    { id: 'a4-3x8', name: 'A4 sheet, 3 × 8 labels (70 × 37 mm)', labelsPerPage: 24, labelWidthMm: 70, labelHeightMm: 37 },
    { id: 'letter-3x10', name: 'US Letter sheet, 3 × 10 labels (66.7 × 25.4 mm)', labelsPerPage: 30, labelWidthMm: 66.675, labelHeightMm: 25.4 },
    { id: 'roll-62x29', name: 'Single labels on a roll (62 × 29 mm)', labelsPerPage: 1, labelWidthMm: 62, labelHeightMm: 29 },
  ],
};

let printed: unknown[];
function install(labelsAnswer: () => Response) {
  printed = [];
  const { fetchMock } = installCatalogueApi({
    [`GET /shops/${shopA}/parts`]: () => ({ body: listFixture(rows) }),
    [`GET /shops/${shopA}/labels/options`]: () => ({ body: options }),
  });
  const json = fetchMock.getMockImplementation()!;
  // The PDF is not JSON: answer the print request here.
  fetchMock.mockImplementation(async (input: RequestInfo | URL, init?: RequestInit) => {
    if (String(input).endsWith(`/shops/${shopA}/labels/parts`)) {
      printed.push({ headers: init?.headers, body: JSON.parse(String(init?.body)) });
      return labelsAnswer();
    }
    return json(input, init);
  });
}

const pdf = () =>
  new Response('%PDF-1.7 test', {
    status: 200,
    headers: { 'Content-Type': 'application/pdf', 'Content-Disposition': 'inline; filename="part-labels-a4-3x8.pdf"', 'X-Label-Count': '6', 'X-Page-Count': '1' },
  });

beforeEach(() => {
  vi.stubGlobal('URL', Object.assign(URL, { createObjectURL: vi.fn(() => 'blob:labels'), revokeObjectURL: vi.fn() }));
});
afterEach(() => vi.unstubAllGlobals());

describe('printing labels from the catalogue list', () => {
  it('prints the chosen parts in the chosen format, with the shop default preselected', async () => {
    const user = userEvent.setup();
    install(pdf);
    renderApp(`/shops/${shopA}/catalogue`);
    const table = await screen.findByRole('table', { name: 'Parts in the catalogue' }, slow);
    await user.click(within(table).getByRole('checkbox', { name: 'Choose 71-3458' }));
    await user.click(within(table).getByRole('checkbox', { name: 'Choose 71-3456' }));
    const bar = screen.getByRole('region', { name: 'Chosen parts' });
    expect(bar).toHaveTextContent('2 parts chosen');
    await user.click(within(bar).getByRole('button', { name: 'Print labels' }));

    const dialog = await screen.findByRole('dialog', { name: 'Print part labels' });
    const format = await within(dialog).findByLabelText('Label format');
    expect(format).toHaveValue('letter-3x10');
    expect(within(dialog).getByText('2 labels on 1 Letter sheet')).toBeInTheDocument();
    await user.selectOptions(format, 'a4-3x8');
    expect(within(dialog).getByText(/Only for this print/)).toBeInTheDocument();
    const copies = within(dialog).getByLabelText('Copies of each label');
    await user.clear(copies);
    await user.type(copies, '3');
    const start = within(dialog).getByLabelText('Start at label position');
    await user.clear(start);
    await user.type(start, '20');
    expect(within(dialog).getByText('6 labels on 2 A4 sheets')).toBeInTheDocument();
    await user.click(within(dialog).getByRole('button', { name: 'Make the PDF' }));

    expect(await within(dialog).findByText('The labels are ready.')).toBeInTheDocument();
    expect(printed).toEqual([{ headers: expect.objectContaining({ 'X-CSRF': '1' }), body: { partIds: [ids.current, ids.old], copies: 3, format: 'a4-3x8', skip: 19 } }]);
    expect(within(dialog).getByRole('link', { name: 'Open the PDF' })).toHaveAttribute('href', 'blob:labels');
    expect(within(dialog).getByRole('link', { name: 'Download' })).toHaveAttribute('download', 'part-labels-a4-3x8.pdf');
  }, 20_000);

  it('refuses impossible copies and positions before asking, and shows what the API says', async () => {
    const user = userEvent.setup();
    install(() => new Response(JSON.stringify({ error: { code: 'not_found', message: 'One of the chosen parts is not in this shop.' } }), { status: 404, headers: { 'Content-Type': 'application/json' } }));
    renderApp(`/shops/${shopA}/catalogue`);
    const table = await screen.findByRole('table', { name: 'Parts in the catalogue' }, slow);
    await user.click(within(table).getByRole('checkbox', { name: 'Choose every part on this page' }));
    expect(screen.getByRole('region', { name: 'Chosen parts' })).toHaveTextContent('2 parts chosen');
    await user.click(screen.getByRole('button', { name: 'Print labels' }));
    const dialog = await screen.findByRole('dialog', { name: 'Print part labels' });
    const copies = await within(dialog).findByLabelText('Copies of each label');
    await user.clear(copies);
    await user.type(copies, '51');
    const start = within(dialog).getByLabelText('Start at label position');
    await user.clear(start);
    await user.type(start, '31');
    await user.click(within(dialog).getByRole('button', { name: 'Make the PDF' }));
    expect(within(dialog).getByText('Use a whole number from 1 to 50.')).toBeInTheDocument();
    expect(within(dialog).getByText('Use a position from 1 to 30 (left to right, top to bottom).')).toBeInTheDocument();
    expect(printed).toEqual([]);

    await user.clear(copies);
    await user.type(copies, '1');
    await user.clear(start);
    await user.type(start, '1');
    await user.click(within(dialog).getByRole('button', { name: 'Make the PDF' }));
    expect(await within(dialog).findByRole('alert')).toHaveTextContent('One of the chosen parts is not in this shop.');
    // Nothing lost: the choices are still there to try again.
    expect(copies).toHaveValue(1);
  }, 20_000);

  it('clears the choice', async () => {
    const user = userEvent.setup();
    install(pdf);
    renderApp(`/shops/${shopA}/catalogue`);
    const table = await screen.findByRole('table', { name: 'Parts in the catalogue' }, slow);
    await user.click(within(table).getByRole('checkbox', { name: 'Choose 71-3458' }));
    await user.click(screen.getByRole('button', { name: 'Clear the choice' }));
    await waitFor(() => expect(screen.queryByRole('region', { name: 'Chosen parts' })).not.toBeInTheDocument());
    expect(within(table).getByRole('checkbox', { name: 'Choose 71-3458' })).not.toBeChecked();
  }, 20_000);
});
