import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import type { PartStockResponse, ShopRole } from '@tappet/contracts';
import { ToastProvider } from '@tappet/ui';
import { render, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router-dom';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { ShopAbilityProvider } from '../../../lib/ability';
import { installFakeApi, meFixture, shopA } from '../../../testing/fake-api';
import { PartStockPanel } from './part-stock-panel';

const partId = 'aaaaaaaa-0000-4000-8000-000000000021';
const binA = 'cccccccc-0000-4000-8000-000000000021';
const binCore = 'cccccccc-0000-4000-8000-000000000022';

const answer: PartStockResponse = {
  partId,
  number: '02-303',
  stock: {
    onHand: 14,
    held: 4,
    free: 10,
    lines: [
      { binId: binA, binCode: 'C-08', condition: 'new', onHand: 4, held: 4, free: 0 },
      { binId: binCore, binCode: 'CORE', condition: 'core', onHand: 10, held: 0, free: 10 },
    ],
  },
  holds: [],
  serials: [],
  valuation: [],
  fillOptions: [],
  currency: 'GBP',
};

function renderPanel(role: ShopRole) {
  installFakeApi({ [`GET /shops/${shopA}/stock/parts/${partId}`]: () => ({ body: answer }) });
  const me = meFixture({}, [{ shopId: shopA, shopName: 'Harbour Works', role, spendingLimitMinor: null }]);
  return render(
    <QueryClientProvider client={new QueryClient({ defaultOptions: { queries: { retry: false } } })}>
      <ToastProvider>
        <MemoryRouter>
          <ShopAbilityProvider me={me} shopId={shopA}>
            <PartStockPanel shopId={shopA} partId={partId} />
          </ShopAbilityProvider>
        </MemoryRouter>
      </ToastProvider>
    </QueryClientProvider>,
  );
}

afterEach(() => vi.unstubAllGlobals());

describe('the part’s stock lines', () => {
  it('offers issue and hold as buttons and the rest in a menu, each named for its line', async () => {
    const user = userEvent.setup();
    renderPanel('owner');
    const table = await screen.findByRole('table', { name: 'Stock of 02-303 per bin and condition' });
    const [, held, core] = within(table).getAllByRole('row');
    // Bin and condition share a column.
    expect(within(table).getAllByRole('columnheader').map((h) => h.textContent)).toEqual(['Bin and condition', 'On hand', 'Held', 'Free', 'Actions']);
    expect(within(core!).getAllByRole('cell')[0]).toHaveTextContent('CORECore (for exchange)');
    // Nothing free in C-08: no issue, hold or move there, but it can still be adjusted and counted.
    expect(within(held!).queryByRole('button', { name: /^Issue|^Hold/ })).toBeNull();
    await user.click(within(held!).getByRole('button', { name: 'More actions for 02-303 from C-08, new' }));
    expect(screen.getAllByRole('menuitem').map((i) => i.textContent)).toEqual(['Adjust 02-303 from C-08, new', 'Count 02-303 from C-08, new']);
    await user.keyboard('{Escape}');

    expect(within(core!).getByRole('button', { name: 'Issue 02-303 from CORE, core (for exchange)' })).toBeInTheDocument();
    expect(within(core!).getByRole('button', { name: 'Hold 02-303 from CORE, core (for exchange)' })).toBeInTheDocument();
    await user.click(within(core!).getByRole('button', { name: 'More actions for 02-303 from CORE, core (for exchange)' }));
    expect(screen.getAllByRole('menuitem').map((i) => i.textContent)).toEqual(['Move 02-303 from CORE, core (for exchange)', 'Adjust 02-303 from CORE, core (for exchange)', 'Count 02-303 from CORE, core (for exchange)']);
  });

  it('gives a mechanic issue and hold only, and no menu', async () => {
    renderPanel('mechanic');
    const table = await screen.findByRole('table', { name: 'Stock of 02-303 per bin and condition' });
    const core = within(table).getAllByRole('row')[2]!;
    expect(within(core).getAllByRole('button').map((b) => b.getAttribute('aria-label'))).toEqual(['Issue 02-303 from CORE, core (for exchange)', 'Hold 02-303 from CORE, core (for exchange)']);
  });
});
