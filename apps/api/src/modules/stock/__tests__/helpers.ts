import type { Test } from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { expect } from 'vitest';
import type { ShopRole } from '@tappet/contracts';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';

export type Agent = TestAgent<Test>;

/** A shop with one signed-in agent per role, and helpers for its stock routes. */
export interface StockWorld {
  ctx: TestContext;
  shopId: string;
  as: Record<ShopRole, Agent>;
  /** POSTs to /api/shops/:shopId/stock + path as `role`. */
  post(role: ShopRole, path: string, body?: Record<string, unknown>): Test;
  get(role: ShopRole, path: string): Test;
  addPart(number: string, extra?: Record<string, unknown>): Promise<string>;
  addBin(code: string): Promise<string>;
  /** Counts rows of a table, for "nothing changed" checks. */
  rows(table: string): Promise<number>;
}

/** Builds a world on a context (a fresh one unless given). */
export async function stockWorld(existing?: TestContext): Promise<StockWorld> {
  const ctx = existing ?? (await createTestContext());
  const shop = await seedShop(ctx);
  const agents = {} as Record<ShopRole, Agent>;
  for (const role of ['owner', 'mechanic', 'buyer', 'viewer'] as const) agents[role] = await signedInAgent(ctx.app, shop.byRole[role].email, shop.password);
  const shopId = shop.shop.id;
  const world: StockWorld = {
    ctx,
    shopId,
    as: agents,
    post: (role, path, body = {}) => agents[role].post(`/api/shops/${shopId}/stock${path}`).set(csrf).send(body),
    get: (role, path) => agents[role].get(`/api/shops/${shopId}/stock${path}`),
    async addPart(number, extra = {}) {
      const res = await agents.owner.post(`/api/shops/${shopId}/parts`).set(csrf).send({ number, description: `Part ${number}`, ...extra });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      return res.body.id as string;
    },
    async addBin(code) {
      const res = await world.post('owner', '/bins', { code, description: `Bin ${code}` });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      return res.body.id as string;
    },
    async rows(table) {
      const [row] = await ctx.db.reader.query<Array<{ n: number }>>(`SELECT COUNT(*) AS n FROM ${table}`);
      return Number(row?.n ?? 0);
    },
  };
  return world;
}

/** Expects `status`, showing the body when it differs. */
export function expectStatus(res: { status: number; body: unknown }, status: number): void {
  expect(res.status, JSON.stringify(res.body)).toBe(status);
}
