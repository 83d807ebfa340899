import type { LineageGraphResponse, Part, PartDetailResponse, PartListResponse } from '@tappet/contracts';
import { installFakeApi, ownerOfA, shopA, type RecordedRequest } from '../../testing/fake-api';
import type { Me } from '../../lib/auth';

type Handler = (request: RecordedRequest) => { status?: number; body?: unknown } | Promise<{ status?: number; body?: unknown }>;

/** Invented part ids for tests. */
export const ids = {
  old: 'aaaaaaaa-0000-4000-8000-000000000001',
  mid: 'aaaaaaaa-0000-4000-8000-000000000002',
  current: 'aaaaaaaa-0000-4000-8000-000000000003',
  kit: 'aaaaaaaa-0000-4000-8000-000000000004',
  link: 'bbbbbbbb-0000-4000-8000-000000000001',
} as const;

/** A part of the invented demo shop. */
export function partFixture(overrides: Partial<Part> = {}): Part {
  return {
    id: ids.old,
    number: '71-3456',
    key: '713456',
    description: 'Clutch pushrod seal',
    origin: 'genuine',
    maker: null,
    category: 'Clutch',
    unit: 'each',
    status: 'nla',
    notes: null,
    supplierNumbers: [],
    createdAt: '2024-03-01T09:00:00.000Z',
    updatedAt: '2024-03-01T09:00:00.000Z',
    ...overrides,
  };
}

export function listFixture(items: Array<Part & { problemCount: number }>, extra: Partial<PartListResponse> = {}): PartListResponse {
  return { items, total: items.length, page: 1, pageSize: 25, categories: ['Brakes', 'Clutch'], ...extra };
}

/** 71-3456 → 71-3457 (both ways) → 71-3458 ×2 (one way), the last one current. */
export function detailFixture(): PartDetailResponse {
  return {
    part: partFixture({ supplierNumbers: ['HX 220-14'] }),
    linksFrom: [
      {
        id: ids.link,
        fromPartId: ids.old,
        fromNumber: '71-3456',
        kind: 'replaced_by',
        toPartId: ids.mid,
        toNumber: '71-3457',
        quantity: 1,
        interchange: 'both',
        effectiveDate: '1971-06-01',
        sourceReference: 'Service note 14',
        note: null,
      },
    ],
    linksTo: [],
    fitments: [{ id: 'cccccccc-0000-4000-8000-000000000001', partId: ids.old, marque: 'Ferncastle', model: 'Kestrel 350', yearFrom: 1968, yearTo: 1971, frameFrom: null, frameTo: null }],
    current: [{ partId: ids.current, number: '71-3458', quantity: 2 }],
    problems: [],
  };
}

export function lineageFixture(overrides: Partial<LineageGraphResponse> = {}): LineageGraphResponse {
  return {
    nodes: [
      { partId: ids.old, number: '71-3456', description: 'Clutch pushrod seal', status: 'nla', isCurrent: false, isFocus: true, inProblem: false },
      { partId: ids.mid, number: '71-3457', description: 'Clutch pushrod seal, revised', status: 'available', isCurrent: false, isFocus: false, inProblem: false },
      { partId: ids.current, number: '71-3458', description: 'Pushrod seal half', status: 'available', isCurrent: true, isFocus: false, inProblem: false },
    ],
    edges: [
      { from: ids.old, to: ids.mid, kind: 'replaced_by', interchange: 'both', quantity: 1 },
      { from: ids.mid, to: ids.current, kind: 'replaced_by', interchange: 'one_way', quantity: 2 },
    ],
    truncated: false,
    ...overrides,
  };
}

/**
 * The fake API for catalogue screens: `GET /me`, the shop, and the given handlers. A handler
 * registered without a query string ("GET /shops/x/parts") answers that path with any query.
 */
export function installCatalogueApi(handlers: Record<string, Handler>, me: Me = ownerOfA()) {
  const all: Record<string, Handler> = {
    'GET /me': () => ({ body: me }),
    [`GET /shops/${shopA}`]: () => ({ body: { id: shopA, name: 'Harbour Works', slug: 'harbour-works', createdAt: '2024-03-01T09:00:00.000Z' } }),
    'POST /me/active-shop': () => ({ body: me }),
    ...handlers,
  };
  const routes = new Proxy(all, {
    get: (target, key) => {
      if (typeof key !== 'string') return undefined;
      return target[key] ?? target[key.split('?')[0] ?? key];
    },
  });
  return installFakeApi(routes);
}

/** The query of a recorded request as an object. */
export function queryOf(request: RecordedRequest): Record<string, string> {
  return Object.fromEntries(new URLSearchParams(request.path.split('?')[1] ?? ''));
}
