import type { AuditEventListResponse } from '@tappet/contracts';
import { fireEvent, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { installFakeApi, ownerOfA, shopA, type RecordedRequest } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';

const slow = { timeout: 5000 };
const me = ownerOfA();
const id = (n: number) => `bbbbbbbb-0000-4000-8000-${String(n).padStart(12, '0')}`;

const page = (events: AuditEventListResponse['events'], total = events.length): AuditEventListResponse => ({ events, total, page: 1, pageSize: 50 });
const roleChanged = {
  id: id(1),
  action: 'membership.role_changed',
  entity: 'membership',
  entityId: id(2),
  actor: { userId: me.user.id, userName: 'Pat Example', apiKeyId: null, apiKeyLabel: null },
  changes: { role: { before: 'mechanic', after: 'buyer' } },
  ip: '192.0.2.10',
  createdAt: '2024-06-01T09:00:00.000Z',
};
const keyEvent = { ...roleChanged, id: id(3), action: 'part.updated', entity: 'part', actor: { userId: null, userName: null, apiKeyId: id(4), apiKeyLabel: 'Stock sync' }, changes: {} };

type Handler = (r: RecordedRequest) => { status?: number; body?: unknown };
function install(answer: (query: URLSearchParams) => AuditEventListResponse) {
  const base: Record<string, Handler> = {
    'GET /me': () => ({ body: me }),
    [`GET /shops/${shopA}/staff`]: () => ({ body: { members: [], invitations: [] } }),
    [`GET /shops/${shopA}/api-keys`]: () => ({ body: { keys: [] } }),
    [`GET /shops/${shopA}/audit-events`]: (r) => ({ body: answer(new URLSearchParams(r.path.split('?')[1])) }),
  };
  // The list is asked for with a query string; route it by path alone.
  const routes = new Proxy(base, { get: (target, key) => (typeof key === 'string' ? (target[key] ?? target[key.split('?')[0] ?? key]) : undefined) });
  return installFakeApi(routes);
}

const auditQueries = (requests: RecordedRequest[]) => requests.filter((r) => r.path.startsWith(`/shops/${shopA}/audit-events?`)).map((r) => new URLSearchParams(r.path.split('?')[1]));

afterEach(() => vi.unstubAllGlobals());

describe('the audit log', () => {
  it('shows who, what, when, from where and each changed field before → after', async () => {
    install(() => page([roleChanged, keyEvent]));
    renderApp(`/shops/${shopA}/audit-log`);
    const table = await screen.findByRole('table', { name: 'Audit events, newest first' }, slow);
    const row = within(table).getByRole('row', { name: /Changed a role/ });
    expect(row).toHaveTextContent('Pat Example');
    expect(row).toHaveTextContent('role: mechanic → changed to buyer');
    expect(row).toHaveTextContent('192.0.2.10');
    expect(within(table).getByRole('row', { name: /Changed a part/ })).toHaveTextContent('API key “Stock sync”');
  }, 20_000);

  it('asks the API with the filters, keeps them in the URL and in the CSV link', async () => {
    const user = userEvent.setup();
    const { requests } = install((q) => (q.get('entity') === 'membership' ? page([roleChanged]) : page([])));
    const { router } = renderApp(`/shops/${shopA}/audit-log`);
    expect(await screen.findByText('Nothing recorded yet', {}, slow)).toBeInTheDocument();

    await user.selectOptions(screen.getByLabelText('Kind of record'), 'membership');
    await screen.findByRole('row', { name: /Changed a role/ }, slow);
    expect(auditQueries(requests).at(-1)?.get('entity')).toBe('membership');
    expect(router.state.location.search).toBe('?entity=membership');
    expect(screen.getByRole('link', { name: 'Download these events as CSV' })).toHaveAttribute('href', `/api/shops/${shopA}/audit-events.csv?entity=membership`);

    // A date input takes a whole date at once (jsdom does not type into it key by key).
    fireEvent.change(screen.getByLabelText('From'), { target: { value: '2024-06-01' } });
    await waitFor(() => expect(auditQueries(requests).at(-1)?.get('from')).toBe('2024-06-01'));
    expect(auditQueries(requests).at(-1)?.get('entity')).toBe('membership');
    // The route's loader prefetches before the new URL is committed; the link follows the URL.
    await waitFor(() => expect(screen.getByRole('link', { name: 'Download these events as CSV' })).toHaveAttribute('href', `/api/shops/${shopA}/audit-events.csv?entity=membership&from=2024-06-01`));
  }, 20_000);

  it('says when no event matches the filters and offers to clear them', async () => {
    const user = userEvent.setup();
    install(() => page([]));
    const { router } = renderApp(`/shops/${shopA}/audit-log?entity=part`);
    expect(await screen.findByText('No events match these filters', {}, slow)).toBeInTheDocument();
    await user.click(screen.getAllByRole('button', { name: 'Clear the filters' })[0]!);
    await waitFor(() => expect(router.state.location.search).toBe(''));
  }, 20_000);
});
