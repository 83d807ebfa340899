import { randomUUID } from 'node:crypto';
import { setTimeout as delay } from 'node:timers/promises';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { EntityManager } from 'typeorm';
import { ShopEntity } from '../../modules/shops/shops.entity';
import { onPostgres, openTestDatabase } from '../../test-support/test-app';

let database: Awaited<ReturnType<typeof openTestDatabase>>;
beforeEach(async () => {
  database = await openTestDatabase();
});
afterEach(() => database.close());

const shopRow = (name: string) => ({ id: randomUUID(), name, slug: `${name}-${randomUUID()}`, billingState: 'trial' as const, createdAt: new Date() });
const insertShop = (manager: EntityManager, name: string) => manager.insert(ShopEntity, shopRow(name));

async function shopNames(): Promise<string[]> {
  const rows = await database.db.reader.find(ShopEntity, { order: { name: 'ASC' } });
  return rows.map((r) => r.name);
}

describe('the FIFO write lock', () => {
  it('keeps the committed writes of others when an overlapping transaction rolls back', async () => {
    const { db } = database;
    const log: string[] = [];
    // A awaits in the middle of its transaction; B rolls back after awaiting; C and E are plain
    // writes and D a second transaction, all started while A is still open.
    const a = db.write(async (m) => {
      log.push('A start');
      await insertShop(m, 'a1');
      await delay(30);
      await insertShop(m, 'a2');
      log.push('A end');
    });
    const b = db.write(async (m) => {
      log.push('B start');
      await insertShop(m, 'b1');
      await delay(10);
      throw new Error('B changes its mind');
    });
    const c = db.write((m) => insertShop(m, 'c1'));
    const d = db.write(async (m) => {
      log.push('D start');
      await insertShop(m, 'd1');
      await delay(5);
      await insertShop(m, 'd2');
      log.push('D end');
    });
    const e = db.write((m) => insertShop(m, 'e1'));

    const results = await Promise.allSettled([a, b, c, d, e]);
    expect(results.map((r) => r.status)).toEqual(['fulfilled', 'rejected', 'fulfilled', 'fulfilled', 'fulfilled']);
    expect(await shopNames()).toEqual(['a1', 'a2', 'c1', 'd1', 'd2', 'e1']);
    // First in, first out, and never interleaved (SQLite; on PostgreSQL transactions run side by side, decision 019).
    if (!onPostgres()) expect(log).toEqual(['A start', 'A end', 'B start', 'D start', 'D end']);
  });

  it('passes the result of the work on, and its error', async () => {
    await expect(database.db.write(async () => 42)).resolves.toBe(42);
    await expect(database.db.write(async () => Promise.reject(new Error('nope')))).rejects.toThrow('nope');
  });

  it('refuses an entity write outside the lock', async () => {
    await expect(insertShop(database.db.reader, 'sneaky')).rejects.toThrow(/outside db.write/);
    expect(await shopNames()).toEqual([]);
  });

  it('refuses a nested write instead of waiting for itself forever', async () => {
    await expect(database.db.write(() => database.db.write(async () => 1))).rejects.toThrow(/inside db.write/);
  });

  // SQLite-specific by nature (decision 019): PostgreSQL gives each transaction its own connection, so there is no trap to show.
  it.skipIf(onPostgres())('(why it exists) without the lock, a rollback takes a plain write of someone else with it', async () => {
    const { dataSource } = database;
    const sql = `INSERT INTO shops (id, name, slug, billing_state, created_at) VALUES (?, ?, ?, 'trial', '2026-01-01 00:00:00.000')`;
    const unguarded = dataSource.transaction(async (m) => {
      await m.query(sql, [randomUUID(), 'x1', 'x1']);
      await delay(20);
      throw new Error('roll back');
    });
    await delay(5);
    // Reported as done, yet it ran inside the transaction above on the shared connection...
    await dataSource.query(sql, [randomUUID(), 'y1', 'y1']);
    await expect(unguarded).rejects.toThrow('roll back');
    // ...and vanished with it.
    expect(await shopNames()).toEqual([]);
  });
});
