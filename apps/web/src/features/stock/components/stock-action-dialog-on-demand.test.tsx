import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { ToastProvider } from '@tappet/ui';
import { render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, shopA } from '../../../testing/fake-api';
import { StockActionDialogOnDemand } from './stock-action-dialog-on-demand';
import type { StockActionDialogProps } from './stock-action-dialog';

afterEach(() => vi.unstubAllGlobals());

const binA = 'cccccccc-0000-4000-8000-000000000001';
const binB = 'cccccccc-0000-4000-8000-000000000002';
const partId = 'aaaaaaaa-0000-4000-8000-000000000011';

/** Bins answered only when `release` is called: the dialog opens before they arrive. */
function installSlowBins() {
  let release = () => {};
  const arrived = new Promise<void>((resolve) => (release = resolve));
  const { requests } = installFakeApi({
    [`GET /shops/${shopA}/stock/bins`]: async () => {
      await arrived;
      return {
        body: {
          bins: [
            { id: binA, code: 'A-01', description: null, active: true, onHand: 0, lineCount: 0 },
            { id: binB, code: 'B-04', description: 'Aisle B, shelf 4', active: true, onHand: 3, lineCount: 1 },
          ],
        },
      };
    },
  });
  return { requests, release };
}

function renderDialog(props: Partial<StockActionDialogProps>) {
  const client = new QueryClient({ defaultOptions: { queries: { retry: false } } });
  return render(
    <QueryClientProvider client={client}>
      <ToastProvider>
        <StockActionDialogOnDemand shopId={shopA} action={null} currency="GBP" onClose={() => {}} {...props} />
      </ToastProvider>
    </QueryClientProvider>,
  );
}

describe('the stock action dialog, loaded when it opens', () => {
  it('renders nothing and asks for nothing while closed', async () => {
    const { requests } = installSlowBins();
    renderDialog({ action: null });
    await new Promise((r) => setTimeout(r, 50));
    expect(screen.queryByRole('dialog')).toBeNull();
    expect(requests).toHaveLength(0);
  });

  it('keeps the bin it was opened for when the bins list arrives after the dialog', async () => {
    const { requests, release } = installSlowBins();
    renderDialog({ action: 'hold', preset: { partId, partNumber: 'SJ-4411', binId: binB, condition: 'new' } });
    const dialog = await screen.findByRole('dialog', { name: 'Hold stock' }, { timeout: 5000 });
    expect(requests.filter((r) => r.path === `/shops/${shopA}/stock/bins`)).toHaveLength(1);
    const bin = within(dialog).getByLabelText('Bin');
    expect(bin).toHaveDisplayValue('Loading bins…');
    // A keyboard user already on the select keeps their place when the list arrives (after the
    // dialog has put focus inside itself, as it does on opening).
    await vi.waitFor(() => expect(dialog.contains(document.activeElement)).toBe(true));
    bin.focus();
    release();
    await vi.waitFor(() => expect(within(dialog).getByLabelText('Bin')).toHaveDisplayValue('B-04 — Aisle B, shelf 4'));
    expect(within(dialog).getByLabelText('Bin')).toBe(bin);
    expect(bin).toHaveFocus();
  });
});
