// Plan limits: seats (members and open invitations) and catalogue size, with messages that say
// what to do. No Stripe involved.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { PartEntity } from '../../catalogue/catalogue.entity';
import { addPlan, putOnPlan } from './billing-world';
import { assertWithinPlanLimit, planLimitsFor } from '../plan-limits';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(() => ctx.close());

describe('seats', () => {
  it('refuses inviting one person more than the plan seats, and counts open invitations', async () => {
    const plan = await addPlan(ctx, { seatLimit: 3 });
    const shop = await seedShop(ctx, ['owner', 'mechanic']);
    await putOnPlan(ctx, shop.shop.id, plan.id);
    const owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    const invite = (email: string) => owner.post(`/api/shops/${shop.shop.id}/staff/invitations`).set(csrf).send({ email, role: 'viewer' });
    const third = await invite('third@limits.test');
    expect(third.status).toBe(201);
    const fourth = await invite('fourth@limits.test');
    expect(fourth.status).toBe(409);
    expect(fourth.body.error.message).toBe(
      `Your plan (${plan.name}) includes 3 seats, and 3 are taken by members and open invitations. Withdraw an open invitation, deactivate someone who has left, or choose a larger plan in Billing.`,
    );
    expect(fourth.body.error.details).toMatchObject({ limit: 'seats', allowed: 3, used: 3 });
    // Withdrawing the open invitation frees its seat.
    expect((await owner.delete(`/api/shops/${shop.shop.id}/staff/invitations/${third.body.id}`).set(csrf)).status).toBe(200);
    expect((await invite('fourth@limits.test')).status).toBe(201);
  });

  it('limits nothing for a shop without a plan', async () => {
    const shop = await seedShop(ctx, ['owner']);
    expect(await planLimitsFor(ctx.db.reader, shop.shop.id)).toBeNull();
    const owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    for (const n of [1, 2, 3, 4]) {
      expect((await owner.post(`/api/shops/${shop.shop.id}/staff/invitations`).set(csrf).send({ email: `p${n}@nolimit.test`, role: 'viewer' })).status).toBe(201);
    }
  });
});

describe('catalogue size', () => {
  it('refuses creating a part past the plan, and an import that would pass it (nothing imported)', async () => {
    const plan = await addPlan(ctx, { catalogueLimit: 3 });
    const shop = await seedShop(ctx, ['owner']);
    await putOnPlan(ctx, shop.shop.id, plan.id);
    const owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    const create = (n: string) => owner.post(`/api/shops/${shop.shop.id}/parts`).set(csrf).send({ number: n, description: 'Limit part' });
    expect((await create('LIM-1')).status).toBe(201);
    expect((await create('LIM-2')).status).toBe(201);

    const csv = Buffer.from('number,description\r\nLIM-3,Three\r\nLIM-4,Four\r\n');
    const imported = await owner.post(`/api/shops/${shop.shop.id}/imports`).set(csrf).field('kind', 'parts').field('mode', 'commit').attach('file', csv, 'parts.csv');
    expect(imported.status).toBe(409);
    expect(imported.body.error.message).toBe(`Your plan (${plan.name}) allows 3 parts; the shop has 2 and this would add 2. Remove parts you no longer need, or choose a larger plan in Billing.`);
    expect(await ctx.db.reader.count(PartEntity, { where: { shopId: shop.shop.id } })).toBe(2);

    expect((await create('LIM-3')).status).toBe(201);
    const fourth = await create('LIM-4');
    expect(fourth.status).toBe(409);
    expect(fourth.body.error.details).toMatchObject({ limit: 'catalogue', allowed: 3, used: 3, adding: 1 });
  });
});

describe('vehicles (for the vehicles module)', () => {
  it('checks a count the caller supplies', async () => {
    const plan = await addPlan(ctx, { vehicleLimit: 2 });
    const shop = await seedShop(ctx, ['owner']);
    await putOnPlan(ctx, shop.shop.id, plan.id);
    await expect(assertWithinPlanLimit(ctx.db.reader, shop.shop.id, 'vehicles', { used: 1, adding: 1 })).resolves.toBeUndefined();
    await expect(assertWithinPlanLimit(ctx.db.reader, shop.shop.id, 'vehicles', { used: 2, adding: 1 })).rejects.toMatchObject({ status: 409, message: expect.stringMatching(/allows 2 vehicles/) });
  });

  it('refuses a vehicle past the plan, and a vehicle sold frees its place', async () => {
    const plan = await addPlan(ctx, { vehicleLimit: 2 });
    const shop = await seedShop(ctx, ['owner']);
    await putOnPlan(ctx, shop.shop.id, plan.id);
    const owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    const add = (model: string) => owner.post(`/api/shops/${shop.shop.id}/vehicles`).set(csrf).send({ kind: 'shop_stock', marque: 'Velmark', model });
    const first = await add('One');
    expect(first.status, JSON.stringify(first.body)).toBe(201);
    expect((await add('Two')).status).toBe(201);
    const third = await add('Three');
    expect(third.status).toBe(409);
    expect(third.body.error.details).toMatchObject({ limit: 'vehicles', allowed: 2, used: 2, adding: 1 });
    expect(third.body.error.message).toMatch(/handed over or sold/);
    for (const to of ['assessing', 'in_work', 'ready', 'sold']) {
      const moved = await owner.post(`/api/shops/${shop.shop.id}/vehicles/${first.body.id as string}/status`).set(csrf).send({ to });
      expect(moved.status, JSON.stringify(moved.body)).toBe(200);
    }
    expect((await add('Three')).status).toBe(201);
  });
});
