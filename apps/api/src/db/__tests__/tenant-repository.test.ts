import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MembershipEntity } from '../../modules/shops/shops.entity';
import { FakeClock } from '../../lib/clock';
import { HttpError } from '../../lib/http-error';
import { createShopWithUsers, type CreatedShop } from '../../modules/test-support/test-support.service';
import { shopScoped } from '../tenant-repository';
import { openTestDatabase } from '../../test-support/test-app';

let database: Awaited<ReturnType<typeof openTestDatabase>>;
let a: CreatedShop;
let b: CreatedShop;
beforeAll(async () => {
  database = await openTestDatabase();
  a = await createShopWithUsers(database.db, new FakeClock(), { roles: ['owner', 'viewer'] });
  b = await createShopWithUsers(database.db, new FakeClock(), { roles: ['owner'] });
});
afterAll(() => database.close());

describe('shopScoped', () => {
  it('only ever sees rows of its own shop', async () => {
    const inA = shopScoped(database.db.reader, MembershipEntity, a.shop.id);
    expect((await inA.find()).map((m) => m.userId).sort()).toEqual(a.users.map((u) => u.id).sort());
    expect(await inA.findOne({ userId: b.users[0]!.id })).toBeNull();
    // Even when the caller's own filter names another shop, the tenant wins.
    expect(await inA.count({ shopId: b.shop.id })).toBe(a.users.length);
  });

  it("answers 404 for another shop's row", async () => {
    const inB = shopScoped(database.db.reader, MembershipEntity, b.shop.id);
    const err = await inB.findOneOr404({ userId: a.users[0]!.id }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(HttpError);
    expect((err as HttpError).status).toBe(404);
  });

  it('stamps inserts with its shop, whatever the row says', async () => {
    const userId = a.users[1]!.id;
    const id = randomUUID();
    await database.db.write((m) =>
      shopScoped(m, MembershipEntity, b.shop.id).insert({ id, shopId: a.shop.id, userId, role: 'viewer', spendingLimitMinor: null, isActive: true, createdAt: new Date() } as never),
    );
    const row = await database.db.reader.findOneByOrFail(MembershipEntity, { id });
    expect(row.shopId).toBe(b.shop.id);
  });
});
