import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { SupportAccessResponse } from '@tappet/contracts';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, ownerOfA, shopA, type RecordedRequest } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';

const slow = { timeout: 5000 };
const grantId = 'dddddddd-0000-4000-8000-000000000001';
afterEach(() => vi.unstubAllGlobals());

describe('support access', () => {
  it('grants access for the chosen time, lists what support did, and ends it after confirmation', async () => {
    const user = userEvent.setup();
    let state: SupportAccessResponse = { current: null, grants: [], activity: [] };
    const { requests } = installFakeApi({
      'GET /me': () => ({ body: ownerOfA() }),
      [`GET /shops/${shopA}/support-access`]: () => ({ body: state }),
      [`POST /shops/${shopA}/support-access`]: (r: RecordedRequest) => {
        const grant = { id: grantId, grantedByName: 'Pat Example', note: (r.body as { note?: string }).note ?? null, createdAt: '2026-12-02T09:00:00.000Z', expiresAt: '2026-12-03T09:00:00.000Z', revokedAt: null, active: true };
        state = {
          current: grant,
          grants: [grant],
          activity: [{ id: 'eeeeeeee-0000-4000-8000-000000000001', at: '2026-12-02T09:05:00.000Z', actorName: 'Ottilie Marsh', action: 'support.viewed', entity: 'support_access', detail: `GET /api/shops/${shopA}/parts` }],
        };
        return { status: 201, body: grant };
      },
      [`DELETE /shops/${shopA}/support-access`]: () => {
        state = { current: null, grants: state.grants.map((g) => ({ ...g, active: false, revokedAt: '2026-12-02T10:00:00.000Z' })), activity: state.activity };
        return { body: { ok: true } };
      },
    });
    renderApp(`/shops/${shopA}/support-access`);
    expect(await screen.findByText('Nothing yet', {}, slow)).toBeInTheDocument();
    await user.selectOptions(screen.getByLabelText('For how long'), '24');
    await user.type(screen.getByLabelText('What do you need help with? (optional)'), 'Import skipped a row');
    await user.click(screen.getByRole('button', { name: 'Grant support access' }));
    expect(await screen.findByRole('heading', { name: 'Support can see this shop' })).toBeInTheDocument();
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ hours: 24, note: 'Import skipped a row' });
    const row = screen.getByRole('row', { name: /Ottilie Marsh/ });
    expect(row).toHaveTextContent('Looked at');

    await user.click(screen.getByRole('button', { name: 'End support access now' }));
    const confirm = screen.getByRole('alertdialog', { name: 'End support access now?' });
    await user.click(within(confirm).getByRole('button', { name: 'End support access' }));
    expect(await screen.findByRole('button', { name: 'Grant support access' })).toBeInTheDocument();
    expect(screen.getByText('Ended early')).toBeInTheDocument();
  }, 30_000);
});
