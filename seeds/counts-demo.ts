/* eslint-disable @nx/enforce-module-boundaries -- the seed writes through the API's own data layer (see demo.ts) */
import type { EntityManager } from 'typeorm';
import { enterCount, postCount, startCount } from '../apps/api/src/modules/counts/counts.service';

/**
 * Two stock counts in one demo shop (inside the caller's write, after stock and jobs): count 1 of
 * one bin, posted a week ago with one part short by one; count 2 of another bin, in progress, with
 * some lines counted (one with a difference) and the rest still to do.
 */
export async function seedCountsDemo(manager: EntityManager, shopId: string, people: { owner: string; buyer: string; mechanic: string }, at: Date): Promise<void> {
  const daysAgo = (n: number, hour = 9) => new Date(Date.UTC(at.getUTCFullYear(), at.getUTCMonth(), at.getUTCDate() - n, hour, 30));
  // Bins with at least three lines of free stock (nothing held), fullest first.
  const bins = await manager.query<Array<{ binId: string }>>(
    `SELECT l.bin_id AS binId FROM stock_lines l
     JOIN stock_pools sp ON sp.shop_id = l.shop_id AND sp.part_id = l.part_id AND sp.condition = l.condition
     WHERE l.shop_id = ? AND l.on_hand > 1 AND sp.method = 'average'
     GROUP BY l.bin_id HAVING COUNT(*) >= 3 AND SUM(l.held) = 0 ORDER BY COUNT(*) DESC, l.bin_id LIMIT 2`,
    [shopId],
  );
  if (bins.length < 2) return;
  const actor = (userId: string) => ({ userId, ip: null });

  const posted = await startCount(manager, shopId, { binIds: [bins[0]!.binId], categories: [], note: 'Monthly check of the fast-moving shelf' }, { actor: actor(people.buyer), at: daysAgo(8) });
  const postedLines = await manager.query<Array<{ id: string; frozen: number }>>(`SELECT id, frozen_quantity AS frozen FROM stock_count_lines WHERE shop_id = ? AND count_id = ? ORDER BY id`, [shopId, posted]);
  for (const [i, line] of postedLines.entries()) {
    await enterCount(manager, shopId, posted, { lineId: line.id, quantity: i === 0 ? Number(line.frozen) - 1 : Number(line.frozen), mode: 'set' }, { actor: actor(i % 2 ? people.mechanic : people.buyer), at: daysAgo(8, 10) });
  }
  await postCount(manager, shopId, posted, { actor: actor(people.owner), at: daysAgo(7) });

  const open = await startCount(manager, shopId, { binIds: [bins[1]!.binId], categories: [], note: 'Spot check after the shelf was reorganised' }, { actor: actor(people.buyer), at: daysAgo(1) });
  const openLines = await manager.query<Array<{ id: string; frozen: number }>>(`SELECT id, frozen_quantity AS frozen FROM stock_count_lines WHERE shop_id = ? AND count_id = ? ORDER BY id`, [shopId, open]);
  for (const [i, line] of openLines.slice(0, 2).entries()) {
    await enterCount(manager, shopId, open, { lineId: line.id, quantity: i === 0 ? Number(line.frozen) + 2 : Number(line.frozen), mode: 'set' }, { actor: actor(people.mechanic), at: daysAgo(0, 8) });
  }
}
