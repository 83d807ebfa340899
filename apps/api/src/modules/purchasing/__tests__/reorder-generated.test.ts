import { seededRandom } from '@tappet/domain';
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestContext, seedShop, signedInAgent, type TestContext } from '../../../test-support/test-app';
import { generateReorderShop } from '../../test-support/reorder-shop';

// The reorder list over a whole generated shop (the benchmark's generator, 400 parts), against the
// list the straightforward implementation gave for the same shop before the list was made faster
// (issue 14). Any change to any figure, reason, history day or order shows here; if the list is
// meant to change, re-record with `npx vitest run --project api -u <this file>` and say why.

const DAY = 86_400_000;
let ctx: TestContext;
let list: unknown;


beforeAll(async () => {
  ctx = await createTestContext();
  const shop = await seedShop(ctx, ['buyer']);
  const now = ctx.clock.now().getTime();
  const rows: Array<{ table: string; row: Record<string, unknown> }> = [];
  // Every other part out of stock, so that many parts are due.
  let lines = 0;
  const sink = (table: string, row: Record<string, unknown>) => rows.push({ table, row: table === 'stock_lines' && lines++ % 2 === 0 ? { ...row, on_hand: 0 } : row });
  generateReorderShop(sink, { shopId: shop.shop.id, partCount: 400, now, rand: seededRandom(14) });
  // What the generator never makes: two movements of a part on one day, and a day whose job returns
  // outweigh its issues (counted as no demand, not negative demand).
  const at = (daysAgo: number) => new Date(now - daysAgo * DAY).toISOString().replace('T', ' ').replace('Z', '');
  const movement = (seq: number, part: number, kind: string, delta: number, daysAgo: number) => ({
    table: 'stock_movements',
    row: { ...rows.find((r) => r.table === 'stock_movements')!.row, id: `extra-mv-${seq}`, seq: 100_000 + seq, kind, part_id: `bench-part-${part}`, quantity_delta: delta, value_change_minor: delta * 100, occurred_at: at(daysAgo), recorded_at: at(daysAgo) },
  });
  rows.push(movement(1, 11, 'issued', -2, 3), movement(2, 11, 'issued', -1, 3), movement(3, 12, 'issued', -1, 5), movement(4, 12, 'returned', 3, 5));
  await ctx.db.write(async (manager) => {
    for (const { table, row } of rows) {
      const columns = Object.keys(row);
      await manager.query(`INSERT INTO ${table} (${columns.join(', ')}) VALUES (${columns.map(() => '?').join(', ')})`, Object.values(row));
    }
  });
  const buyer = await signedInAgent(ctx.app, shop.byRole.buyer.email, shop.password);
  const res = await buyer.get(`/api/shops/${shop.shop.id}/purchasing/reorder-list`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  list = res.body;
}, 60_000);
afterAll(() => ctx.close());

/** JSON with each list item on a line of its own: small enough to keep, and a change shows as the items it touched. */
function oneItemPerLine(list: Record<string, unknown>): string {
  const fields = Object.entries(list).map(([key, value]) => (Array.isArray(value) ? `"${key}": [\n${value.map((v) => JSON.stringify(v)).join(',\n')}\n]` : `"${key}": ${JSON.stringify(value)}`));
  return `{\n${fields.join(',\n')}\n}\n`;
}

describe('the reorder list over a generated shop', () => {
  it('is the list recorded before the list was made faster, figure for figure and in the same order', async () => {
    const expected = path.join(__dirname, '__fixtures__', 'reorder-generated-shop.json');
    await expect(oneItemPerLine(list as Record<string, unknown>)).toMatchFileSnapshot(expected);
    // The recorded list is not a trivial one.
    const recorded = JSON.parse(fs.readFileSync(expected, 'utf8'));
    expect(recorded.suggestions.length).toBeGreaterThan(5);
    expect(recorded.suggestions.some((s: { demand: { fedBy: unknown[] } }) => s.demand.fedBy.length > 1)).toBe(true);
    expect(recorded.deadStock.length).toBeGreaterThan(0);
  });
});
