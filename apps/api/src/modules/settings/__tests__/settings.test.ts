import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '../../audit/audit.entity';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';

let ctx: TestContext;
let seeded: Awaited<ReturnType<typeof seedShop>>;
let owner: Awaited<ReturnType<typeof signedInAgent>>;
let url: string;

beforeEach(async () => {
  ctx = await createTestContext();
  seeded = await seedShop(ctx);
  owner = await signedInAgent(ctx.app, seeded.byRole.owner.email, seeded.password);
  url = `/api/shops/${seeded.shop.id}/settings`;
});
afterEach(() => ctx.close());

describe('shop settings', () => {
  it('starts with the defaults', async () => {
    const res = await owner.get(url).expect(200);
    expect(res.body).toEqual({
      name: seeded.shop.name,
      address: '',
      currency: 'GBP',
      distanceUnit: 'mi',
      pressureUnit: 'psi',
      taxRatePercent: 20,
      labourRateMinorPerHour: 6000,
      serviceLevel: 0.95,
      orderingCostMinor: 2500,
      holdingCostRatePercent: 25,
      labelSheetFormat: 'a4-3x8',
    });
  });

  it('changes some settings, keeps the rest, and audits before and after', async () => {
    const res = await owner
      .patch(url)
      .set(csrf)
      .send({ name: 'Brackenfold Garage', address: '4 Quay Lane, Brackenfold', currency: 'eur', distanceUnit: 'km', pressureUnit: 'bar', taxRatePercent: 20.125, serviceLevel: 0.975, labelSheetFormat: 'roll-62x29' })
      .expect(200);
    expect(res.body).toMatchObject({ name: 'Brackenfold Garage', currency: 'EUR', distanceUnit: 'km', pressureUnit: 'bar', taxRatePercent: 20.125, serviceLevel: 0.975, labourRateMinorPerHour: 6000, labelSheetFormat: 'roll-62x29' });
    expect((await owner.get(url)).body).toEqual(res.body);
    // The shop's name is the settings' name.
    expect((await owner.get(`/api/shops/${seeded.shop.id}`)).body.name).toBe('Brackenfold Garage');
    const [event] = await ctx.db.reader.find(AuditEventEntity, { where: { shopId: seeded.shop.id, action: 'settings.updated' } });
    expect(event!.changes).toMatchObject({ currency: { before: 'GBP', after: 'EUR' }, taxRatePercent: { before: 20, after: 20.125 }, name: { before: seeded.shop.name, after: 'Brackenfold Garage' } });
    expect(event!.changes).not.toHaveProperty('labourRateMinorPerHour');
  });

  it('records nothing when nothing changes', async () => {
    await owner.patch(url).set(csrf).send({ currency: 'GBP' }).expect(200);
    expect(await ctx.db.reader.count(AuditEventEntity, { where: { shopId: seeded.shop.id, action: 'settings.updated' } })).toBe(0);
  });

  it.each([
    [{ currency: 'XYZ' }],
    [{ currency: 'pounds' }],
    [{ distanceUnit: 'furlong' }],
    [{ pressureUnit: 'atm' }],
    [{ taxRatePercent: 100.5 }],
    [{ taxRatePercent: -1 }],
    [{ taxRatePercent: 17.1234 }],
    [{ serviceLevel: 0.4 }],
    [{ serviceLevel: 1 }],
    [{ labourRateMinorPerHour: 60.5 }],
    [{ orderingCostMinor: -5 }],
    [{ holdingCostRatePercent: 101 }],
    [{ labelSheetFormat: 'a5-2x4' }],
    [{ name: 'x' }],
    [{}],
    [{ billingState: 'active' }],
  ])('refuses %j', async (body) => {
    const res = await owner.patch(url).set(csrf).send(body).expect(400);
    expect(res.body.error.code).toBe('validation_failed');
  });

  it('is changed by owners only (others read it: screens need the currency and units), and another shop is a 404', async () => {
    for (const role of ['buyer', 'mechanic', 'viewer'] as const) {
      const agent = await signedInAgent(ctx.app, seeded.byRole[role].email, seeded.password);
      await agent.patch(url).set(csrf).send({ distanceUnit: 'km' }).expect(403);
      expect((await agent.get(url).expect(200)).body).toMatchObject({ currency: 'GBP', distanceUnit: 'mi' });
    }
    await otherShopOwnerCannotRead();
    expect((await owner.get(url)).body.distanceUnit).toBe('mi');
  });

  async function otherShopOwnerCannotRead() {
    const other = await seedShop(ctx, ['owner']);
    const otherOwner = await signedInAgent(ctx.app, other.byRole.owner.email, other.password);
    await otherOwner.patch(url).set(csrf).send({ distanceUnit: 'km' }).expect(404);
    await otherOwner.get(url).expect(404);
  }
});
