import { expect, type APIRequestContext } from '@playwright/test';
import type { Part, PartInput, PartLink } from '@tappet/contracts';
import { writeHeaders } from '../../fixtures/stack';

/**
 * Signs in through the API on the given request context. Used with `page.request`, the session
 * cookie lands in the page's browser context, so the page is signed in too.
 */
export async function signInThroughApi(request: APIRequestContext, email: string, password: string): Promise<void> {
  const res = await request.post('/api/auth/sign-in', { headers: writeHeaders, data: { email, password } });
  expect(res.status(), await res.text()).toBe(200);
}

/** Adds a part to the shop's catalogue through the API. */
export async function addPart(request: APIRequestContext, shopId: string, input: PartInput): Promise<Part> {
  const res = await request.post(`/api/shops/${shopId}/parts`, { headers: writeHeaders, data: input });
  expect(res.status(), await res.text()).toBe(201);
  return (await res.json()) as Part;
}

/** Links two parts of the shop through the API. */
export async function addLink(
  request: APIRequestContext,
  shopId: string,
  link: { fromPartId: string; toPartId: string; kind: PartLink['kind']; quantity?: number; interchange?: PartLink['interchange'] },
): Promise<PartLink> {
  const res = await request.post(`/api/shops/${shopId}/part-links`, { headers: writeHeaders, data: link });
  expect(res.status(), await res.text()).toBe(201);
  return (await res.json()) as PartLink;
}
