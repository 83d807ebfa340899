/* eslint-disable @nx/enforce-module-boundaries -- checks the seed in seeds/, which has no test project of its own */
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildDemoCatalogue } from '../../../../../../seeds/catalogue-demo';
import { demoPassword, seedDemo } from '../../../../../../seeds/demo';
import { ShopEntity } from '../../shops/shops.entity';
import { createTestContext, csrf, type TestContext } from '../../../test-support/test-app';

let ctx: TestContext;
let agent: ReturnType<typeof request.agent>;
let harbourId: string;
beforeAll(async () => {
  ctx = await createTestContext();
  expect(await seedDemo(ctx.db)).toBe(true);
  harbourId = (await ctx.db.reader.findOneOrFail(ShopEntity, { where: { slug: 'harbour-works' } })).id;
  agent = request.agent(ctx.app);
  await agent.post('/api/auth/sign-in').set(csrf).send({ email: 'mechanic@harbour-works.test', password: demoPassword }).expect(200);
});
afterAll(() => ctx.close());

const resolve = (number: string) => agent.get(`/api/shops/${harbourId}/lineage/resolve`).query({ number });

describe('the demo catalogue', () => {
  it('is the same on every build', () => {
    const at = new Date(Date.UTC(2026, 0, 1));
    expect(buildDemoCatalogue('s', at, { seed: 1971, size: 90 })).toEqual(buildDemoCatalogue('s', at, { seed: 1971, size: 90 }));
  });

  it('gives Harbour Works a few hundred parts with fitments and Brackenfold Garage a small catalogue', async () => {
    const list = await agent.get(`/api/shops/${harbourId}/parts`).query({ pageSize: 1 });
    expect(list.body.total).toBeGreaterThan(300);
    expect(list.body.total).toBeLessThan(600);
    expect(list.body.categories).toContain('Gaskets & seals');
    const owner = request.agent(ctx.app);
    await owner.post('/api/auth/sign-in').set(csrf).send({ email: 'owner@brackenfold-garage.test', password: demoPassword }).expect(200);
    const brackenfold = (await ctx.db.reader.findOneOrFail(ShopEntity, { where: { slug: 'brackenfold-garage' } })).id;
    const small = await owner.get(`/api/shops/${brackenfold}/parts`).query({ pageSize: 1 });
    expect(small.body.total).toBeGreaterThan(10);
    expect(small.body.total).toBeLessThan(100);
  });

  it('shows a kit, a split, a merge, a one-way and a with-changes replacement', async () => {
    expect((await resolve('64-9000')).body.current).toEqual([expect.objectContaining({ number: '71-9000', quantity: 1 })]);
    const detail = await agent.get(`/api/shops/${harbourId}/parts/${(await resolve('71-9000')).body.part.id}`);
    expect(detail.body.linksFrom.filter((l: { kind: string }) => l.kind === 'kit_contains')).toHaveLength(3);
    expect((await resolve('67-4410')).body.current.map((c: { number: string; quantity: number }) => `${c.quantity}×${c.number}`).sort()).toEqual(['1×70-4411', '2×70-4412']);
    expect((await resolve('VM/00871')).body.current.map((c: { number: string }) => c.number)).toEqual(['VM/00880']);
    expect((await resolve('VM/00872')).body.current.map((c: { number: string }) => c.number)).toEqual(['VM/00880']);
    expect((await resolve('VM/01241')).body.canFill.map((o: { parts: Array<{ number: string }> }) => o.parts[0]!.number)).not.toContain('VM/01240');
    const withChanges = (await resolve('02-517')).body.canFill.find((o: { parts: Array<{ number: string }> }) => o.parts[0]!.number === '02-518');
    expect(withChanges.needsChanges).toBe(true);
  });

  it('has reproduction equivalents, one dead end and one cycle to show as data problems', async () => {
    const repro = await agent.get(`/api/shops/${harbourId}/parts`).query({ origin: 'reproduction', pageSize: 1 });
    expect(repro.body.total).toBeGreaterThan(10);
    const problems = (await agent.get(`/api/shops/${harbourId}/catalogue/problems`)).body.problems as Array<{ kind: string; numbers: string[] }>;
    expect(problems.filter((p) => p.kind === 'cycle')).toEqual([{ kind: 'cycle', numbers: expect.arrayContaining(['70-6620', '71-6620']) }]);
    expect(problems.filter((p) => p.kind === 'dead_end').map((p) => p.numbers.at(-1))).toContain('03-740');
    expect(problems.filter((p) => p.kind === 'unknown_number')).toEqual([]);
  });
});
