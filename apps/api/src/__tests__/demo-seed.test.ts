/* eslint-disable @nx/enforce-module-boundaries -- checks the seed in seeds/, which has no test project of its own */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoPassword, seedDemo } from '../../../../seeds/demo';
import { createTestContext, csrf, type TestContext } from '../test-support/test-app';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
  expect(await seedDemo(ctx.db)).toBe(true);
});
afterAll(() => ctx.close());

const signIn = (email: string) => request(ctx.app).post('/api/auth/sign-in').set(csrf).send({ email, password: demoPassword });

describe('the demo seed', () => {
  it('lets every demo account sign in with the demo password, in the right roles', async () => {
    const expectations: Record<string, string[]> = {
      'owner@harbour-works.test': ['Brackenfold Garage:viewer', 'Harbour Works:owner'],
      'mechanic@harbour-works.test': ['Harbour Works:mechanic'],
      'buyer@harbour-works.test': ['Harbour Works:buyer'],
      'viewer@harbour-works.test': ['Harbour Works:viewer'],
      'owner@brackenfold-garage.test': ['Brackenfold Garage:owner'],
      'admin@tappet.test': [],
    };
    for (const [email, memberships] of Object.entries(expectations)) {
      const res = await signIn(email);
      expect(res.status, email).toBe(200);
      expect(res.body.memberships.map((m: { shopName: string; role: string }) => `${m.shopName}:${m.role}`)).toEqual(memberships);
      expect(res.body.user.isPlatformAdmin).toBe(email === 'admin@tappet.test');
    }
  });

  it("starts the Harbour Works owner in the shop they own", async () => {
    const res = await signIn('owner@harbour-works.test');
    const owned = res.body.memberships.find((m: { role: string }) => m.role === 'owner');
    expect(res.body.activeShopId).toBe(owned.shopId);
  });

  it('shows shop administration alive: an open invitation, an API key and their audit entries', async () => {
    const agent = request.agent(ctx.app);
    const res = await agent.post('/api/auth/sign-in').set(csrf).send({ email: 'owner@harbour-works.test', password: demoPassword });
    const shopId = res.body.activeShopId as string;
    const staff = await agent.get(`/api/shops/${shopId}/staff`).expect(200);
    expect(JSON.stringify(staff.body)).toContain('counter@harbour-works.test');
    const keys = await agent.get(`/api/shops/${shopId}/api-keys`).expect(200);
    expect(keys.body.keys.map((k: { label: string }) => k.label)).toContain('Stock level feed');
    const audit = await agent.get(`/api/shops/${shopId}/audit-events?entity=invitation`).expect(200);
    expect(JSON.stringify(audit.body)).toContain('invitation.created');
  });

  it('gives the buyer a 500.00 spending limit', async () => {
    const res = await signIn('buyer@harbour-works.test');
    expect(res.body.memberships[0].spendingLimitMinor).toBe(50_000);
  });

  it('does nothing when users exist already', async () => {
    expect(await seedDemo(ctx.db)).toBe(false);
  });
});
