import { expect, type APIRequestContext } from '@playwright/test';
import type { Bin, Part, PartInput } from '@tappet/contracts';
import { writeHeaders } from '../../fixtures/stack';

/** Signs in through the API; with `page.request` the page's browser context gets the session too. */
export async function signIn(request: APIRequestContext, email: string, password: string): Promise<void> {
  const res = await request.post('/api/auth/sign-in', { headers: writeHeaders, data: { email, password } });
  expect(res.status(), await res.text()).toBe(200);
}

export async function addPart(request: APIRequestContext, shopId: string, input: PartInput): Promise<Part> {
  const res = await request.post(`/api/shops/${shopId}/parts`, { headers: writeHeaders, data: input });
  expect(res.status(), await res.text()).toBe(201);
  return (await res.json()) as Part;
}

export async function replacedBy(request: APIRequestContext, shopId: string, from: Part, to: Part): Promise<void> {
  const res = await request.post(`/api/shops/${shopId}/part-links`, { headers: writeHeaders, data: { fromPartId: from.id, toPartId: to.id, kind: 'replaced_by' } });
  expect(res.status(), await res.text()).toBe(201);
}

export async function addBin(request: APIRequestContext, shopId: string, code: string, description?: string): Promise<Bin> {
  const res = await request.post(`/api/shops/${shopId}/stock/bins`, { headers: writeHeaders, data: { code, description } });
  expect(res.status(), await res.text()).toBe(201);
  return (await res.json()) as Bin;
}

export async function receive(request: APIRequestContext, shopId: string, body: Record<string, unknown>): Promise<void> {
  const res = await request.post(`/api/shops/${shopId}/stock/receipts`, { headers: writeHeaders, data: body });
  expect(res.status(), await res.text()).toBe(201);
}
