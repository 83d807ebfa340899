import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, ownerOfA, shopA, type RecordedRequest } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';

const slow = { timeout: 5000 };
const me = ownerOfA();
const keyId = 'cccccccc-0000-4000-8000-000000000001';
const secret = 'tpk_invented-secret-for-the-test-0123456789';

afterEach(() => vi.unstubAllGlobals());

describe('API keys', () => {
  it('creates a key for the owner, shows the secret once and never again', async () => {
    const user = userEvent.setup();
    const keys: unknown[] = [];
    const { requests } = installFakeApi({
      'GET /me': () => ({ body: me }),
      [`GET /shops/${shopA}/api-keys`]: () => ({ body: { keys } }),
      [`POST /shops/${shopA}/api-keys`]: (r: RecordedRequest) => {
        const key = { id: keyId, label: (r.body as { label: string }).label, role: 'buyer', integrationName: null, createdBy: { id: me.user.id, name: 'Pat Example' }, createdAt: '2024-06-01T09:00:00.000Z', lastUsedAt: null, revokedAt: null };
        keys.push(key);
        return { status: 201, body: { key, secret } };
      },
    });
    renderApp(`/shops/${shopA}/api-keys`);
    expect(await screen.findByText('No API keys yet', {}, slow)).toBeInTheDocument();
    await user.click(screen.getAllByRole('button', { name: 'Create an API key' })[0]!);
    const dialog = screen.getByRole('dialog', { name: 'Create an API key' });
    await user.type(within(dialog).getByLabelText('Label'), 'Order bot');
    await user.selectOptions(within(dialog).getByLabelText('Role'), 'buyer');
    await user.click(within(dialog).getByLabelText('Me (Pat Example)'));
    expect(within(dialog).queryByLabelText('Integration name')).not.toBeInTheDocument();
    await user.click(within(dialog).getByRole('button', { name: 'Create key' }));

    const shown = await screen.findByRole('dialog', { name: 'Key “Order bot” created' });
    expect(within(shown).getByLabelText('The new key')).toHaveValue(secret);
    expect(requests.find((r) => r.method === 'POST')?.body).toEqual({ label: 'Order bot', role: 'buyer' });
    await user.click(within(shown).getByRole('button', { name: 'I have stored it' }));

    const row = await screen.findByRole('row', { name: /Order bot/ }, slow);
    expect(row).toHaveTextContent('Never');
    expect(row).toHaveTextContent('Pat Example');
    await waitFor(() => expect(document.body.innerHTML).not.toContain(secret));
  }, 20_000);
});
