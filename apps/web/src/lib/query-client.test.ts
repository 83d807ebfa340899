import { describe, expect, it } from 'vitest';
import { meQueryKey } from './auth';
import { clearShopCaches, createQueryClient, shopQueryKey } from './query-client';
import { ApiError } from './api-client';

describe('shop caches', () => {
  it('drops every other shop’s data and keeps the current shop and "me"', () => {
    const qc = createQueryClient();
    qc.setQueryData(meQueryKey, { user: 'x' });
    qc.setQueryData(shopQueryKey('a', 'detail'), { name: 'A' });
    qc.setQueryData(shopQueryKey('b', 'detail'), { name: 'B' });
    qc.setQueryData(shopQueryKey('b', 'parts', { page: 2 }), []);
    clearShopCaches(qc, 'a');
    expect(qc.getQueryData(shopQueryKey('a', 'detail'))).toEqual({ name: 'A' });
    expect(qc.getQueryData(shopQueryKey('b', 'detail'))).toBeUndefined();
    expect(qc.getQueryData(shopQueryKey('b', 'parts', { page: 2 }))).toBeUndefined();
    expect(qc.getQueryData(meQueryKey)).toEqual({ user: 'x' });
  });

  it('treats a 401 from any query as "signed out"', async () => {
    const qc = createQueryClient();
    qc.setQueryData(meQueryKey, { user: 'x' });
    await qc
      .fetchQuery({
        queryKey: shopQueryKey('a', 'detail'),
        queryFn: () => Promise.reject(new ApiError(401, 'unauthenticated', 'Sign in to continue.')),
      })
      .catch(() => undefined);
    expect(qc.getQueryData(meQueryKey)).toBeNull();
  });
});
