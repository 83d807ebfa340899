import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { seedVehicleFixture } from '../vehicles.test-fixture';

// Vehicles and their jobs (issues 9 and 10): a vehicle with an open safety item on one of its jobs
// cannot be made ready, handed over or sold; its timeline shows its jobs.

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
});
afterAll(() => ctx.close());

describe('a vehicle and its jobs', () => {
  it('holds the vehicle back while a job has safety items open, shows the job on the timeline, and lets it go once the job is cancelled', async () => {
    const shop = await seedShop(ctx, ['owner']);
    const shopId = shop.shop.id;
    const { vehicleId } = await seedVehicleFixture(ctx.db, shopId, ctx.env.uploadsDir, 0);
    const owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
    const templates = (await owner.get(`/api/shops/${shopId}/checklist-templates`).expect(200)).body.templates as Array<{ id: string; name: string }>;
    const recommissioning = templates.find((t) => t.name.startsWith('Recommissioning'))!;
    const job = await owner.post(`/api/shops/${shopId}/jobs`).set(csrf).send({ vehicleId, title: 'Recommission', customerRequest: 'Get it running.', assigneeIds: [], templateIds: [recommissioning.id] });
    expect(job.status, JSON.stringify(job.body)).toBe(201);

    const move = (to: string) => owner.post(`/api/shops/${shopId}/vehicles/${vehicleId}/status`).set(csrf).send({ to });
    for (const to of ['assessing', 'in_work']) expect((await move(to)).status).toBe(200);
    const blocked = await move('ready');
    expect(blocked.status).toBe(409);
    expect(blocked.body.error.details.reason).toBe('safety_blockers');
    expect(blocked.body.error.message).toMatch(/cannot be “Ready” yet/);
    expect((await owner.get(`/api/shops/${shopId}/vehicles/${vehicleId}`)).body.status).toBe('in_work');

    const timeline = (await owner.get(`/api/shops/${shopId}/vehicles/${vehicleId}/timeline`).expect(200)).body.entries as Array<{ kind: string; title: string }>;
    expect(timeline.filter((e) => e.kind === 'job').map((e) => e.title)).toEqual([`Job ${job.body.number as number} opened: Recommission`]);

    expect((await owner.post(`/api/shops/${shopId}/jobs/${job.body.id as string}/status`).set(csrf).send({ to: 'cancelled' })).status).toBe(200);
    expect((await move('ready')).status).toBe(200);
  });
});
