import { vi } from 'vitest';
import type { Me } from '../lib/auth';

export interface RecordedRequest {
  method: string;
  path: string;
  headers: Record<string, string>;
  body: unknown;
  credentials?: RequestCredentials;
}

type Handler = (request: RecordedRequest) => { status?: number; body?: unknown } | Promise<{ status?: number; body?: unknown }>;

/**
 * Replaces fetch with a tiny in-test API: handlers by "METHOD /path" (without the /api prefix),
 * every request recorded. Unknown routes answer 404 in the API's error shape.
 */
export function installFakeApi(handlers: Record<string, Handler>) {
  const requests: RecordedRequest[] = [];
  const fetchMock = vi.fn(async (input: RequestInfo | URL, init: RequestInit = {}) => {
    const url = typeof input === 'string' ? input : input instanceof URL ? input.href : input.url;
    const path = url.replace(/^https?:\/\/[^/]+/, '').replace(/^\/api/, '');
    const method = (init.method ?? 'GET').toUpperCase();
    const headers = Object.fromEntries(Object.entries((init.headers ?? {}) as Record<string, string>).map(([k, v]) => [k.toLowerCase(), v]));
    const request: RecordedRequest = {
      method,
      path,
      headers,
      body: typeof init.body === 'string' ? JSON.parse(init.body) : undefined,
      credentials: init.credentials,
    };
    requests.push(request);
    const handler = handlers[`${method} ${path}`];
    const result = handler ? await handler(request) : { status: 404, body: { error: { code: 'not_found', message: 'Not found.' } } };
    const status = result.status ?? 200;
    return new Response(result.body === undefined ? null : JSON.stringify(result.body), {
      status,
      headers: { 'Content-Type': 'application/json' },
    });
  });
  vi.stubGlobal('fetch', fetchMock);
  return { requests, fetchMock };
}

export const shopA = '11111111-1111-4111-8111-111111111111';
export const shopB = '22222222-2222-4222-8222-222222222222';

/** A me payload for tests (invented people and shops). */
export function meFixture(overrides: Partial<Me['user']> = {}, memberships: Me['memberships'] = []): Me {
  return {
    user: { id: '33333333-3333-4333-8333-333333333333', email: 'pat@harbour-works.test', name: 'Pat Example', isPlatformAdmin: false, ...overrides },
    memberships,
    activeShopId: memberships[0]?.shopId ?? null,
  };
}

export const ownerOfA = (): Me =>
  meFixture({}, [
    { shopId: shopA, shopName: 'Harbour Works', role: 'owner', spendingLimitMinor: null },
    { shopId: shopB, shopName: 'Brackenfold Garage', role: 'viewer', spendingLimitMinor: null },
  ]);
