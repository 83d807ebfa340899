/* eslint-disable @nx/enforce-module-boundaries -- checks the demo seed in seeds/, which has no test project of its own */
import { afterAll, beforeAll, expect, it } from 'vitest';
import { vehicleStatuses } from '@tappet/contracts';
import { demoPassword, seedDemo } from '../../../../../../seeds/demo';
import { createTestContext, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { ShopEntity } from '../../shops/shops.entity';

let ctx: TestContext;
beforeAll(async () => {
  ctx = await createTestContext();
  expect(await seedDemo(ctx.db, ctx.clock.now(), { uploadsDir: ctx.env.uploadsDir })).toBe(true);
}, 60_000);
afterAll(() => ctx.close());

it('seeds invented vehicles at every status, built before 1981 with frame and engine numbers only, with photos and documents that are served', async () => {
  const shop = await ctx.db.reader.findOneByOrFail(ShopEntity, { slug: 'harbour-works' });
  const agent = await signedInAgent(ctx.app, 'viewer@harbour-works.test', demoPassword);
  const list = await agent.get(`/api/shops/${shop.id}/vehicles?pageSize=100`);
  expect(list.status).toBe(200);
  const items = list.body.items as Array<{ id: string; status: string; year: number; vin: string | null; frameNumber: string | null; engineNumber: string | null; marque: string }>;
  expect(new Set(items.map((v) => v.status))).toEqual(new Set(vehicleStatuses));
  for (const v of items) {
    expect(v.year).toBeLessThan(1981);
    expect(v.vin).toBeNull();
    expect(v.frameNumber).toBeTruthy();
    expect(v.engineNumber).toBeTruthy();
    expect(['Corran', 'Velmark', 'Astley-Pike']).toContain(v.marque);
  }
  const first = items[0]!;
  const detail = await agent.get(`/api/shops/${shop.id}/vehicles/${first.id}`);
  const photo = detail.body.files.find((f: { kind: string }) => f.kind === 'photo');
  const doc = detail.body.files.find((f: { kind: string }) => f.kind === 'document');
  expect(photo && doc).toBeTruthy();
  const thumb = await agent.get(`/api/shops/${shop.id}/vehicles/${first.id}/files/${photo.id}/thumbnail`);
  expect(thumb.status).toBe(200);
  expect(thumb.headers['content-type']).toBe('image/jpeg');
  const pdf = await agent.get(`/api/shops/${shop.id}/vehicles/${first.id}/files/${doc.id}/content`).buffer(true);
  expect(pdf.status).toBe(200);
  expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');
  const timeline = await agent.get(`/api/shops/${shop.id}/vehicles/${first.id}/timeline`);
  expect(timeline.body.entries.length).toBeGreaterThan(2);
}, 60_000);
