import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { PublicEstimate } from '@tappet/contracts';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi } from '../../../testing/fake-api';
import { PublicApproval } from './public-approval';

const token = 'k'.repeat(43);
const estimate: PublicEstimate = {
  shopName: 'Harbour Works',
  reference: 'EST-000007',
  version: 2,
  jobTitle: 'Reline the rear brakes',
  vehicle: '1959 Mereford Heron 500',
  customerName: 'Rowan Tillery',
  currency: 'GBP',
  note: null,
  lines: [{ kind: 'labour', description: 'Reline', quantity: '1.5', unitPriceMinor: 6000, taxRatePercent: 20, netMinor: 9000, taxMinor: 1800, grossMinor: 10800 }],
  netMinor: 9000,
  taxMinor: 1800,
  grossMinor: 10800,
  taxByRate: [{ ratePercent: 20, netMinor: 9000, taxMinor: 1800 }],
  expiresAt: '2026-02-01T00:00:00.000Z',
};
const renderPage = (t: string | null) =>
  render(
    <QueryClientProvider client={new QueryClient({ defaultOptions: { queries: { retry: false } } })}>
      <PublicApproval token={t} />
    </QueryClientProvider>,
  );

afterEach(() => vi.unstubAllGlobals());

describe('the customer’s approval page', () => {
  it('shows the total with tax and approves exactly the version and total shown', async () => {
    const { requests } = installFakeApi({
      'POST /estimate-approval/view': () => ({ body: estimate }),
      'POST /estimate-approval/approve': () => ({ body: { status: 'approved', reference: 'EST-000007', version: 2, decidedAt: '2026-01-16T10:00:00.000Z', approvedAmountMinor: 10800 } }),
    });
    renderPage(token);
    expect(await screen.findByRole('heading', { name: 'Estimate EST-000007' })).toBeInTheDocument();
    expect(screen.getByText('Tax at 20 %')).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Approve £108.00' }));
    expect(await screen.findByRole('status')).toHaveTextContent('the estimate is approved');
    expect(requests.find((r) => r.path === '/estimate-approval/approve')?.body).toEqual({ token, version: 2, grossMinor: 10800, name: 'Rowan Tillery' });
  });

  it('asks for a reason before declining, keeping what was typed', async () => {
    const { requests } = installFakeApi({ 'POST /estimate-approval/view': () => ({ body: estimate }) });
    renderPage(token);
    await userEvent.click(await screen.findByRole('button', { name: 'Decline…' }));
    await userEvent.type(screen.getByLabelText(/Why are you declining/), 'no');
    await userEvent.click(screen.getByRole('button', { name: 'Decline the estimate' }));
    expect(screen.getByText('Tell the shop why (at least 3 characters).')).toBeInTheDocument();
    expect(screen.getByLabelText(/Why are you declining/)).toHaveValue('no');
    expect(requests.some((r) => r.path === '/estimate-approval/decline')).toBe(false);
  });

  it('explains a used or expired link', async () => {
    installFakeApi({ 'POST /estimate-approval/view': () => ({ status: 410, body: { error: { code: 'conflict', message: 'This link has expired. Ask the shop to send the estimate again.', details: { reason: 'link_expired' } } } }) });
    renderPage(token);
    expect(await screen.findByRole('alert')).toHaveTextContent('This link has expired');
    renderPage(null);
    expect(screen.getByText('This link is not complete')).toBeInTheDocument();
  });
});
