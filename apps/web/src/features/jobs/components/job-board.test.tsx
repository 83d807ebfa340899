import type { JobSummary } from '@tappet/contracts';
import { screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { installFakeApi, ownerOfA, shopA, type RecordedRequest } from '../../../testing/fake-api';
import { renderApp } from '../../../testing/render-app';

const slow = { timeout: 5000 };
const job = (n: number): JobSummary => ({
  id: `aaaaaaaa-0000-4000-8000-${String(n).padStart(12, '0')}`,
  number: n,
  title: `Service ${n}`,
  customerRequest: '',
  status: 'open',
  dueOn: null,
  vehicle: { id: 'bbbbbbbb-0000-4000-8000-000000000001', marque: 'Corran', model: 'Tern 350', year: 1967, frameNumber: 'CT 41207' },
  assignees: [],
  progress: { recorded: 0, total: 0 },
  blockerCount: 0,
  createdAt: '2026-11-01T09:00:00.000Z',
  updatedAt: '2026-11-01T09:00:00.000Z',
  startedAt: null,
  completedAt: null,
});

function install(body: { jobs: JobSummary[]; truncated?: boolean }) {
  const routes: Record<string, (r: RecordedRequest) => { status?: number; body?: unknown }> = {
    'GET /me': () => ({ body: ownerOfA() }),
    [`GET /shops/${shopA}`]: () => ({ body: { id: shopA, name: 'Harbour Works', slug: 'harbour-works', createdAt: '2024-03-01T09:00:00.000Z' } }),
    [`GET /shops/${shopA}/jobs`]: () => ({ body }),
  };
  return installFakeApi(new Proxy(routes, { get: (target, key) => (typeof key === 'string' ? (target[key] ?? target[key.split('?')[0] ?? key]) : undefined) }));
}

describe('the job board', () => {
  it('says when it shows only the newest jobs', async () => {
    install({ jobs: [job(501), job(500)], truncated: true });
    renderApp(`/shops/${shopA}/jobs`);
    const notice = await screen.findByText(/Showing the newest/, {}, slow);
    expect(notice).toHaveTextContent('Showing the newest 500 jobs. Older ones are on their vehicles’ pages.');
    expect(notice).toHaveAttribute('role', 'status');
    expect(screen.getByRole('link', { name: /Job\s*501/ })).toBeInTheDocument();
  });

  it('says nothing of the kind when the list is whole', async () => {
    install({ jobs: [job(2), job(1)], truncated: false });
    renderApp(`/shops/${shopA}/jobs`);
    expect(await screen.findByRole('link', { name: /Job\s*2/ }, slow)).toBeInTheDocument();
    expect(screen.queryByText(/Showing the newest/)).not.toBeInTheDocument();
  });
});
