import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '../../audit/audit.entity';
import { createTestContext, csrf, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';

let ctx: TestContext;
let base: string;
let owner: Awaited<ReturnType<typeof signedInAgent>>;

beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx, ['owner']);
  base = `/api/shops/${shop.shop.id}/customers`;
  owner = await signedInAgent(ctx.app, shop.byRole.owner.email, shop.password);
});
afterAll(() => ctx.close());

describe('customers', () => {
  it('creates, finds by name, e-mail or phone, and changes a customer with an audited diff', async () => {
    const created = await owner.post(base).set(csrf).send({ name: 'Tamsin Oakridge', email: 'T.Oakridge@Example.test', phone: '01632 960 555', address: '4 Quay Lane\nHarbourside', notes: '' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Tamsin Oakridge', email: 't.oakridge@example.test', notes: null });
    await owner.post(base).set(csrf).send({ name: 'Bram Fettle' });
    expect((await owner.get(`${base}?q=oakr`)).body.items.map((c: { name: string }) => c.name)).toEqual(['Tamsin Oakridge']);
    expect((await owner.get(`${base}?q=960 555`)).body.total).toBe(1);
    expect((await owner.get(`${base}?q=%25`)).body.total).toBe(0); // a LIKE wildcard is a character here
    const changed = await owner.patch(`${base}/${created.body.id}`).set(csrf).send({ phone: '01632 960 556' });
    expect(changed.status).toBe(200);
    const event = await ctx.db.reader.findOneOrFail(AuditEventEntity, { where: { action: 'customer.updated', entityId: created.body.id } });
    expect(event.changes).toEqual({ phone: { before: '01632 960 555', after: '01632 960 556' } });
  });

  it('refuses a missing name, a bad e-mail address, letters in the phone number and unknown fields', async () => {
    expect((await owner.post(base).set(csrf).send({ name: '  ' })).status).toBe(400);
    const email = await owner.post(base).set(csrf).send({ name: 'A', email: 'not-an-address' });
    expect(email.status).toBe(400);
    expect(email.body.error.message).toMatch(/e-mail address/);
    expect((await owner.post(base).set(csrf).send({ name: 'A', phone: 'call me' })).status).toBe(400);
    expect((await owner.post(base).set(csrf).send({ name: 'A', shopId: 'x' })).status).toBe(400);
  });
});
