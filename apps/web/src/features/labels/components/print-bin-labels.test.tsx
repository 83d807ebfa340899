import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { AppProvider } from '../../../app/provider';
import { createQueryClient } from '../../../lib/query-client';
import { installFakeApi, shopA } from '../../../testing/fake-api';
import { PrintBinLabelsButton } from './print-bin-labels';

const bins = [
  { id: 'cccccccc-0000-4000-8000-000000000001', code: 'A-01', description: 'Top shelf', active: true },
  { id: 'cccccccc-0000-4000-8000-000000000002', code: 'A-02', description: null, active: true },
  { id: 'cccccccc-0000-4000-8000-000000000003', code: 'OLD-9', description: 'Cleared out', active: false },
];
const options = {
  defaultFormat: 'roll-62x29',
  formats: [
    { id: 'a4-3x8', name: 'A4 sheet, 3 × 8 labels (70 × 37 mm)', labelsPerPage: 24, labelWidthMm: 70, labelHeightMm: 37 },
    { id: 'letter-3x10', name: 'US Letter sheet, 3 × 10 labels (66.7 × 25.4 mm)', labelsPerPage: 30, labelWidthMm: 66.675, labelHeightMm: 25.4 },
    { id: 'roll-62x29', name: 'Single labels on a roll (62 × 29 mm)', labelsPerPage: 1, labelWidthMm: 62, labelHeightMm: 29 },
  ],
};

let printed: unknown[];
beforeEach(() => {
  printed = [];
  const { fetchMock } = installFakeApi({ [`GET /shops/${shopA}/labels/options`]: () => ({ body: options }) });
  const json = fetchMock.getMockImplementation()!;
  fetchMock.mockImplementation(async (input: RequestInfo | URL, init?: RequestInit) => {
    if (String(input).endsWith(`/shops/${shopA}/labels/bins`)) {
      printed.push(JSON.parse(String(init?.body)));
      return new Response('%PDF-1.7 test', { headers: { 'Content-Type': 'application/pdf', 'Content-Disposition': 'inline; filename="bin-labels-roll-62x29.pdf"', 'X-Label-Count': '5', 'X-Page-Count': '5' } });
    }
    return json(input, init);
  });
  vi.stubGlobal('URL', Object.assign(URL, { createObjectURL: vi.fn(() => 'blob:bins'), revokeObjectURL: vi.fn() }));
});
afterEach(() => vi.unstubAllGlobals());

describe('printing bin labels', () => {
  it('starts with the bins in use chosen, and prints the chosen bins with their parts', async () => {
    const user = userEvent.setup();
    render(
      <AppProvider queryClient={createQueryClient()}>
        <PrintBinLabelsButton shopId={shopA} bins={bins} />
      </AppProvider>,
    );
    await user.click(screen.getByRole('button', { name: 'Print bin labels' }));
    const choose = screen.getByRole('dialog', { name: 'Choose the bins' });
    const list = within(choose).getByRole('list', { name: 'Bins' });
    expect(within(list).getByRole('checkbox', { name: /A-01/ })).toBeChecked();
    expect(within(list).getByRole('checkbox', { name: /OLD-9/ })).not.toBeChecked();
    await user.click(within(list).getByRole('checkbox', { name: /A-02/ }));
    expect(choose).toHaveTextContent('1 of 3 chosen.');
    await user.click(within(choose).getByRole('button', { name: 'Next' }));

    const dialog = await screen.findByRole('dialog', { name: 'Print bin labels' });
    expect(dialog).toHaveTextContent('A-01');
    expect(await within(dialog).findByLabelText('Label format')).toHaveValue('roll-62x29');
    expect(within(dialog).getByRole('checkbox', { name: 'Also a label for each part in the bin' })).toBeChecked();
    await user.click(within(dialog).getByRole('button', { name: 'Make the PDF' }));
    expect(await within(dialog).findByText('The labels are ready.')).toBeInTheDocument();
    expect(printed).toEqual([{ binIds: [bins[0]!.id], contents: true, format: 'roll-62x29', skip: 0 }]);
    expect(within(dialog).getByText(/5 labels for the roll printer/)).toBeInTheDocument();
  }, 20_000);

  it('needs at least one bin', async () => {
    const user = userEvent.setup();
    render(
      <AppProvider queryClient={createQueryClient()}>
        <PrintBinLabelsButton shopId={shopA} bins={bins} />
      </AppProvider>,
    );
    await user.click(screen.getByRole('button', { name: 'Print bin labels' }));
    await user.click(screen.getByRole('button', { name: 'Choose none' }));
    expect(screen.getByRole('button', { name: 'Next' })).toBeDisabled();
  }, 20_000);
});
