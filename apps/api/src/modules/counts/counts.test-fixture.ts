import type { Database } from '../../db/write-lock';
import { FakeClock } from '../../lib/clock';
import { createCountsService } from './counts.service';

/** Ids of counts made for route tests; open counts are handed out one per call so posting and abandoning can repeat. */
export interface CountsFixture {
  /** An open count of `binId` with its line counted, for reads, entries and labels. */
  countId: string;
  lineId: string;
  /** An open count with nothing counted, for a post (which then changes nothing). */
  nextOpenCountId(): string;
}

/**
 * Writes counts through the counts service on bins that must hold stock (the stock fixture's bin
 * A does): one open count of `binId`, and `spare` counts of otherwise empty bins made for them, so
 * each route call posts or abandons a different one (a line may be in one open count at a time).
 */
export async function seedCountsFixture(db: Database, shopId: string, refs: { binId: string; makeBin(code: string): Promise<string> }, spare = 12): Promise<CountsFixture> {
  const counts = createCountsService({ db, clock: new FakeClock() });
  const actor = { userId: null };
  const main = await counts.start(shopId, { binIds: [refs.binId], categories: [] }, actor);
  const line = main.lines[0];
  if (!line) throw new Error('The counts fixture needs a bin with stock.');
  await counts.enter(shopId, main.id, { lineId: line.id, quantity: line.frozenQuantity, mode: 'set' }, actor);
  const open: string[] = [];
  for (let i = 0; i < spare; i++) {
    const bin = await refs.makeBin(`CF-${i + 1}`);
    open.push((await counts.start(shopId, { binIds: [bin], categories: [] }, actor)).id);
  }
  return {
    countId: main.id,
    lineId: line.id,
    nextOpenCountId: () => {
      const id = open.shift();
      if (!id) throw new Error('The counts fixture ran out of open counts.');
      return id;
    },
  };
}
