import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { csrf } from '../../../test-support/test-app';
import { AuditEventEntity } from '../../audit/audit.entity';
import { checkLedger } from '../../stock/stock.ledger-check';
import { expectStatus, stockWorld, type StockWorld } from '../../stock/__tests__/helpers';
import type { ShopRole } from '@tappet/contracts';

let w: StockWorld;
let other: StockWorld;
beforeAll(async () => {
  w = await stockWorld();
  other = await stockWorld(w.ctx);
});
afterAll(() => w.ctx.close());

const counts = (world: StockWorld, role: ShopRole, path = '') => ({
  get: () => world.as[role].get(`/api/shops/${world.shopId}/counts${path}`),
  post: (body: Record<string, unknown> = {}) => world.as[role].post(`/api/shops/${world.shopId}/counts${path}`).set(csrf).send(body),
});

interface Line {
  id: string;
  partNumber: string;
  binCode: string;
  frozenQuantity: number;
  countedQuantity: number | null;
  movedSinceFreeze: number | null;
  expectedQuantity: number | null;
  variance: number | null;
  added: boolean;
  counted: { name: string | null; at: string } | null;
}

const onHand = async (world: StockWorld, partId: string, binCode: string) => {
  const res = await world.get('viewer', `/parts/${partId}`);
  return (res.body.stock.lines as Array<{ binCode: string; onHand: number }>).find((l) => l.binCode === binCode)?.onHand ?? 0;
};

describe('a count while stock keeps moving', () => {
  // Hand-computed scenario (figures in minor units):
  //   P: 10 into A and 5 into B at 5.00. Q: 8 into A at 10.00. R: 4 into B at 2.50.
  //   Count of bin A starts: frozen P/A 10, Q/A 8 (R has nothing in A, B is not counted).
  //   During the count: 3 of P issued from A, 2 of P moved B → A (net −1 on P/A); 2 of Q
  //   received into A at 13.00 (Q pool 10 units worth 8,000 + 2,600 = 10,600, average 10.60).
  //   Entries: P/A counted 8 → expected 10 − 1 = 9, variance −1.
  //            Q/A counted 11 → expected 8 + 2 = 10, variance +1.
  //            R found in A: 2 → frozen 0, expected 0, variance +2.
  //   After P/A was counted 1 more of P is issued from A (on hand 8 − 1 = 7 … of the 9 the
  //   ledger had, 8 now): posting sets P/A to 8 − 1 = 7, keeping that later issue.
  //   Values at the moving average: P −1 × 5.00 = −500; Q +1 × 10.60 = +1,060; R +2 × 2.50 = +500.
  //   Totals: over 3, short 1; value over 1,560, short 500, net +1,060.
  let p: string, q: string, r: string, a: string, b: string, countId: string;
  let lines: Line[];

  beforeAll(async () => {
    p = await w.addPart('CT-P', { category: 'Brakes' });
    q = await w.addPart('CT-Q', { category: 'Brakes' });
    r = await w.addPart('CT-R', { category: 'Trim' });
    a = await w.addBin('CT-A');
    b = await w.addBin('CT-B');
    for (const [part, bin, quantity, unitCostMinor] of [[p, a, 10, 500], [p, b, 5, 500], [q, a, 8, 1000], [r, b, 4, 250]] as const) {
      expectStatus(await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'new', quantity, unitCostMinor }), 201);
    }
  });

  it('starting freezes what each line of the chosen bins holds', async () => {
    const res = await counts(w, 'buyer').post({ binIds: [a], note: 'Quarterly count of aisle A' });
    expectStatus(res, 201);
    countId = res.body.id;
    expect(res.body).toMatchObject({ number: 1, status: 'open', lineCount: 2, countedCount: 0, scope: { bins: [{ id: a, code: 'CT-A' }], categories: [] } });
    lines = res.body.lines;
    expect(lines.map((l) => [l.partNumber, l.frozenQuantity, l.countedQuantity])).toEqual([
      ['CT-P', 10, null],
      ['CT-Q', 8, null],
    ]);
  });

  it('entries record the moves since the freeze, who counted and when; the variance follows the formula', async () => {
    expectStatus(await w.post('mechanic', '/issues', { partId: p, binId: a, condition: 'new', quantity: 3 }), 201);
    expectStatus(await w.post('buyer', '/moves', { partId: p, condition: 'new', fromBinId: b, toBinId: a, quantity: 2 }), 201);
    expectStatus(await w.post('buyer', '/receipts', { partId: q, binId: a, condition: 'new', quantity: 2, unitCostMinor: 1300 }), 201);

    const lineP = lines.find((l) => l.partNumber === 'CT-P')!;
    const lineQ = lines.find((l) => l.partNumber === 'CT-Q')!;
    const resP = await counts(w, 'mechanic', `/${countId}/entries`).post({ lineId: lineP.id, quantity: 8 });
    expectStatus(resP, 201);
    expect(resP.body).toMatchObject({ frozenQuantity: 10, movedSinceFreeze: -1, expectedQuantity: 9, countedQuantity: 8, variance: -1 });
    expect(resP.body.counted.name).toBeTruthy();

    // "add": 6 on the shelf, 5 more in a box behind it.
    expectStatus(await counts(w, 'buyer', `/${countId}/entries`).post({ lineId: lineQ.id, quantity: 6 }), 201);
    const resQ = await counts(w, 'buyer', `/${countId}/entries`).post({ lineId: lineQ.id, quantity: 5, mode: 'add' });
    expect(resQ.body).toMatchObject({ movedSinceFreeze: 2, expectedQuantity: 10, countedQuantity: 11, variance: 1 });

    const found = await counts(w, 'owner', `/${countId}/entries`).post({ partId: r, binId: a, condition: 'new', quantity: 2 });
    expectStatus(found, 201);
    expect(found.body).toMatchObject({ partNumber: 'CT-R', added: true, frozenQuantity: 0, expectedQuantity: 0, variance: 2 });

    // Stock in a bin the count does not cover is refused.
    const outside = await counts(w, 'owner', `/${countId}/entries`).post({ partId: r, binId: b, condition: 'new', quantity: 1 });
    expectStatus(outside, 409);
    expect(outside.body.error.details.reason).toBe('count_out_of_scope');

    // Stock moves on after P/A was counted.
    expectStatus(await w.post('mechanic', '/issues', { partId: p, binId: a, condition: 'new', quantity: 1 }), 201);

    const detail = await counts(w, 'viewer', `/${countId}`).get();
    expect(detail.body).toMatchObject({ lineCount: 3, countedCount: 3, differenceCount: 3 });
  });

  it('the variance report gives quantity and value differences at the moving-average cost', async () => {
    const res = await counts(w, 'viewer', `/${countId}/variances`).get();
    expectStatus(res, 200);
    const byPart = Object.fromEntries((res.body.lines as Array<{ partNumber: string; variance: number; valueDifferenceMinor: number; unitCostMinor: number }>).map((l) => [l.partNumber, l]));
    expect(byPart['CT-P']).toMatchObject({ variance: -1, unitCostMinor: 500, valueDifferenceMinor: -500 });
    expect(byPart['CT-Q']).toMatchObject({ variance: 1, unitCostMinor: 1060, valueDifferenceMinor: 1060 });
    expect(byPart['CT-R']).toMatchObject({ variance: 2, unitCostMinor: 250, valueDifferenceMinor: 500 });
    expect(res.body.totals).toEqual({ over: 3, short: 1, valueOverMinor: 1560, valueShortMinor: 500, netValueMinor: 1060 });
    expect(res.body.postedValueMinor).toBeNull();
  });

  it('only the owner posts; posting writes counted movements referencing the count, keeping later movements', async () => {
    for (const role of ['buyer', 'mechanic', 'viewer'] as const) expectStatus(await counts(w, role, `/${countId}/post`).post(), 403);
    const before = await w.ctx.db.reader.count(AuditEventEntity);
    const res = await counts(w, 'owner', `/${countId}/post`).post();
    expectStatus(res, 200);
    expect(res.body.status).toBe('posted');
    expect(res.body.closed.name).toBeTruthy();
    expect(await w.ctx.db.reader.count(AuditEventEntity)).toBeGreaterThan(before);

    expect(await onHand(w, p, 'CT-A')).toBe(7);
    expect(await onHand(w, q, 'CT-A')).toBe(11);
    expect(await onHand(w, r, 'CT-A')).toBe(2);
    expect(await onHand(w, r, 'CT-B')).toBe(4);

    const moves = await w.get('viewer', '/movements?kind=counted');
    const ours = (moves.body.movements as Array<{ reference: string; quantityDelta: number; valueChangeMinor: number; partNumber: string }>).filter((m) => m.reference === 'Stock count 1');
    expect(ours.map((m) => [m.partNumber, m.quantityDelta, m.valueChangeMinor]).sort()).toEqual([
      ['CT-P', -1, -500],
      ['CT-Q', 1, 1060],
      ['CT-R', 2, 500],
    ]);
    const report = await counts(w, 'viewer', `/${countId}/variances`).get();
    expect(report.body.postedValueMinor).toBe(1060);
    expect(await checkLedger(w.ctx.db.reader, w.shopId)).toEqual([]);

    // Posted is final.
    const again = await counts(w, 'owner', `/${countId}/post`).post();
    expectStatus(again, 409);
    expect(again.body.error.details.reason).toBe('count_closed');
    expectStatus(await counts(w, 'owner', `/${countId}/entries`).post({ lineId: lines[0]!.id, quantity: 1 }), 409);
  });
});

describe('abandoning', () => {
  it('changes no stock and no ledger; the count is closed for entries', async () => {
    const part = await w.addPart('AB-1', { category: 'Electrics' });
    const bin = await w.addBin('AB-BIN');
    expectStatus(await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'new', quantity: 6, unitCostMinor: 700 }), 201);
    const start = await counts(w, 'owner').post({ categories: ['Electrics'] });
    expectStatus(start, 201);
    expect(start.body.scope.categories).toEqual(['Electrics']);
    const id = start.body.id as string;
    expectStatus(await counts(w, 'mechanic', `/${id}/entries`).post({ lineId: start.body.lines[0].id, quantity: 2 }), 201);
    const movements = await w.rows('stock_movements');
    const lines = await w.ctx.db.reader.query(`SELECT * FROM stock_lines WHERE shop_id = ? ORDER BY part_id, bin_id, condition`, [w.shopId]);
    const pools = await w.ctx.db.reader.query(`SELECT * FROM stock_pools WHERE shop_id = ? ORDER BY part_id, condition`, [w.shopId]);

    expectStatus(await counts(w, 'mechanic', `/${id}/abandon`).post(), 403);
    const res = await counts(w, 'buyer', `/${id}/abandon`).post();
    expectStatus(res, 200);
    expect(res.body.status).toBe('abandoned');

    expect(await w.rows('stock_movements')).toBe(movements);
    expect(await w.ctx.db.reader.query(`SELECT * FROM stock_lines WHERE shop_id = ? ORDER BY part_id, bin_id, condition`, [w.shopId])).toEqual(lines);
    expect(await w.ctx.db.reader.query(`SELECT * FROM stock_pools WHERE shop_id = ? ORDER BY part_id, condition`, [w.shopId])).toEqual(pools);
    expect(await checkLedger(w.ctx.db.reader, w.shopId)).toEqual([]);
    expect(await onHand(w, part, 'AB-BIN')).toBe(6);
    expectStatus(await counts(w, 'owner', `/${id}/post`).post(), 409);
    expectStatus(await counts(w, 'owner', `/${id}/entries`).post({ lineId: start.body.lines[0].id, quantity: 1 }), 409);
    // The stock can be counted again now.
    const next = await counts(w, 'owner').post({ binIds: [bin] });
    expectStatus(next, 201);
    expectStatus(await counts(w, 'owner', `/${next.body.id}/abandon`).post(), 200);
  });
});

describe('rules', () => {
  it('two people counting at once: every entry lands, none lost', async () => {
    const bin = await w.addBin('CC-BIN');
    const parts: string[] = [];
    for (let i = 0; i < 6; i++) {
      const part = await w.addPart(`CC-${i}`);
      parts.push(part);
      expectStatus(await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'new', quantity: 10, unitCostMinor: 100 }), 201);
    }
    const start = await counts(w, 'buyer').post({ binIds: [bin] });
    const id = start.body.id as string;
    const ls = start.body.lines as Line[];
    // Mechanic and buyer each count three lines at the same moment, and both add 1 to the same line 10 times.
    const shared = ls[0]!;
    const calls = [
      ...ls.slice(1).map((l, i) => counts(w, i % 2 ? 'mechanic' : 'buyer', `/${id}/entries`).post({ lineId: l.id, quantity: 9 })),
      ...Array.from({ length: 10 }, (_, i) => counts(w, i % 2 ? 'mechanic' : 'buyer', `/${id}/entries`).post({ lineId: shared.id, quantity: 1, mode: 'add' })),
    ];
    for (const res of await Promise.all(calls)) expectStatus(res, 201);
    const detail = await counts(w, 'viewer', `/${id}`).get();
    const after = detail.body.lines as Line[];
    expect(after.find((l) => l.id === shared.id)!.countedQuantity).toBe(10);
    expect(after.filter((l) => l.id !== shared.id).every((l) => l.countedQuantity === 9 && l.variance === -1)).toBe(true);
    expect(detail.body).toMatchObject({ countedCount: 6, differenceCount: 5 });
    expectStatus(await counts(w, 'buyer', `/${id}/abandon`).post(), 200);
  });

  it('a line can be in one open count at a time', async () => {
    const part = await w.addPart('OV-1', { category: 'Overlap' });
    const bin = await w.addBin('OV-BIN');
    expectStatus(await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'new', quantity: 1, unitCostMinor: 100 }), 201);
    const first = await counts(w, 'owner').post({ binIds: [bin] });
    expectStatus(first, 201);
    const second = await counts(w, 'owner').post({ categories: ['Overlap'] });
    expectStatus(second, 409);
    expect(second.body.error.details.reason).toBe('count_overlap');
    expectStatus(await counts(w, 'owner', `/${first.body.id}/abandon`).post(), 200);
  });

  it('a serialised line with a variance is refused at posting, and nothing is written', async () => {
    const part = await w.addPart('SR-ENGINE');
    const bin = await w.addBin('SR-BIN');
    expectStatus(await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'used_good', quantity: 2, unitCostMinor: 90_000, serials: ['E-1001', 'E-1002'] }), 201);
    const start = await counts(w, 'owner').post({ binIds: [bin] });
    expect(start.body.lines[0].serialised).toBe(true);
    expectStatus(await counts(w, 'owner', `/${start.body.id}/entries`).post({ lineId: start.body.lines[0].id, quantity: 1 }), 201);
    const movements = await w.rows('stock_movements');
    const res = await counts(w, 'owner', `/${start.body.id}/post`).post();
    expectStatus(res, 409);
    expect(res.body.error.details.reason).toBe('serialised');
    expect(res.body.error.message).toContain('SR-ENGINE');
    expect(await w.rows('stock_movements')).toBe(movements);
    expect((await counts(w, 'viewer', `/${start.body.id}`).get()).body.status).toBe('open');
    // Counted right, it posts (a zero-variance count confirms the balance).
    expectStatus(await counts(w, 'owner', `/${start.body.id}/entries`).post({ lineId: start.body.lines[0].id, quantity: 2 }), 201);
    expectStatus(await counts(w, 'owner', `/${start.body.id}/post`).post(), 200);
    expect(await w.rows('stock_movements')).toBe(movements + 1);
  });

  it('another shop’s count, line or bin is a 404; a viewer changes nothing; input is validated', async () => {
    const bin = await w.addBin('TN-BIN');
    const mine = await counts(w, 'owner').post({ binIds: [bin] });
    expectStatus(mine, 201);
    const id = mine.body.id as string;
    for (const res of [
      await counts(other, 'owner', `/${id}`).get(),
      await counts(other, 'owner', `/${id}/variances`).get(),
      await counts(other, 'owner', `/${id}/entries`).post({ partId: other.shopId, binId: bin, condition: 'new', quantity: 1 }),
      await counts(other, 'owner', `/${id}/post`).post(),
      await counts(other, 'owner', `/${id}/abandon`).post(),
      await counts(other, 'owner').post({ binIds: [bin] }),
    ]) {
      expectStatus(res, 404);
    }
    expect((await counts(other, 'owner').get()).body.counts).toEqual([]);
    const otherBin = await other.addBin('TN-OTHER');
    const otherPart = await other.addPart('TN-P');
    expectStatus(await counts(w, 'owner', `/${id}/entries`).post({ partId: otherPart, binId: bin, condition: 'new', quantity: 1 }), 404);
    expectStatus(await counts(w, 'owner', `/${id}/entries`).post({ partId: otherPart, binId: otherBin, condition: 'new', quantity: 1 }), 404);

    expectStatus(await counts(w, 'viewer').post({ binIds: [bin] }), 403);
    expectStatus(await counts(w, 'mechanic').post({ binIds: [bin] }), 403);
    expectStatus(await counts(w, 'viewer', `/${id}/entries`).post({ partId: otherPart, binId: bin, condition: 'new', quantity: 1 }), 403);
    expectStatus(await counts(w, 'owner').post({}), 400);
    expectStatus(await counts(w, 'owner').post({ binIds: [bin], categories: ['Brakes'] }), 400);
    expectStatus(await counts(w, 'owner', `/${id}/entries`).post({ quantity: -1, lineId: id }), 400);
    expectStatus(await counts(w, 'owner', `/${id}/entries`).post({ quantity: 1 }), 400);
    expectStatus(await counts(w, 'owner', `/${id}/entries`).post({ lineId: id, quantity: 1, extra: true }), 400);
    expectStatus(await counts(w, 'owner', `/${id}/entries`).post({ lineId: id, quantity: 1 }), 404);
    expectStatus(await counts(w, 'owner', `/${id}/abandon`).post(), 200);
  });

  it('every write is audited under the count', async () => {
    const events = await w.ctx.db.reader.find(AuditEventEntity, { where: { shopId: w.shopId, entity: 'stock_count' } });
    const actions = new Set(events.map((e) => e.action));
    for (const action of ['stock_count.started', 'stock_count.counted', 'stock_count.posted', 'stock_count.abandoned']) expect(actions.has(action), action).toBe(true);
  });
});
