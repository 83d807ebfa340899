import { expect, type APIRequestContext } from '@playwright/test';
import { writeHeaders } from '../../fixtures/stack';

/** Signs in through the API; with `page.request` the page's browser context is signed in too. */
export async function signInThroughApi(request: APIRequestContext, email: string, password: string): Promise<void> {
  const res = await request.post('/api/auth/sign-in', { headers: writeHeaders, data: { email, password } });
  expect(res.status(), await res.text()).toBe(200);
}

/** POSTs JSON to the shop's API and returns the body, expecting `status`. */
export async function postJson<T = Record<string, unknown>>(request: APIRequestContext, path: string, data: unknown, status = 201): Promise<T> {
  const res = await request.post(path, { headers: writeHeaders, data });
  expect(res.status(), await res.text()).toBe(status);
  return (await res.json()) as T;
}

/**
 * A small purchasing world: an old number replaced one way by a new one, demand issued today under
 * the old number, a bin and a supplier listing the new number in packs of 6.
 */
export async function seedReorderWorld(request: APIRequestContext, shopId: string, supplierEmail: string) {
  const base = `/api/shops/${shopId}`;
  const oldPart = await postJson<{ id: string }>(request, `${base}/parts`, { number: 'CR-4410', description: 'Clutch plate, friction' });
  const newPart = await postJson<{ id: string }>(request, `${base}/parts`, { number: 'CR-4411', description: 'Clutch plate, friction, bonded' });
  await postJson(request, `${base}/part-links`, { fromPartId: oldPart.id, kind: 'replaced_by', toNumber: 'CR-4411', interchange: 'one_way' });
  const bin = await postJson<{ id: string }>(request, `${base}/stock/bins`, { code: 'C-07' });
  await postJson(request, `${base}/stock/receipts`, { partId: oldPart.id, binId: bin.id, condition: 'new', quantity: 40, unitCostMinor: 450 });
  await postJson(request, `${base}/stock/issues`, { partId: oldPart.id, binId: bin.id, condition: 'new', quantity: 30 });
  const supplier = await postJson<{ id: string }>(request, `${base}/purchasing/suppliers`, { name: 'Marrick Spares', email: supplierEmail, currency: 'GBP', leadTimeDays: 7 });
  await postJson(request, `${base}/purchasing/suppliers/${supplier.id}/listings`, { partId: newPart.id, supplierNumber: 'MARRICK 411', priceMinor: 500, packSize: 6 });
  return { oldPartId: oldPart.id, newPartId: newPart.id, binId: bin.id, supplierId: supplier.id };
}
