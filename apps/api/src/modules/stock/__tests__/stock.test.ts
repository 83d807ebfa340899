import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEventEntity } from '../../audit/audit.entity';
import { checkLedger } from '../stock.ledger-check';
import { expectStatus, stockWorld, type StockWorld } from './helpers';

let w: StockWorld;
let other: StockWorld;
beforeAll(async () => {
  w = await stockWorld();
  other = await stockWorld(w.ctx);
});
afterAll(() => w.ctx.close());

const line = async (world: StockWorld, partId: string) => (await world.get('viewer', `/parts/${partId}`)).body as { stock: { onHand: number; held: number; free: number; lines: Array<{ binCode: string; condition: string; onHand: number; held: number; free: number }> }; valuation: Array<{ condition: string; method: string; quantity: number; valueMinor: number; unitCostMinor: number | null }> };

describe('bins', () => {
  it('owner and buyer add bins; codes are unique whatever the case; mechanic and viewer may not', async () => {
    expectStatus(await w.post('owner', '/bins', { code: 'A-01', description: 'Aisle A, shelf 1' }), 201);
    expectStatus(await w.post('buyer', '/bins', { code: 'A-02' }), 201);
    expectStatus(await w.post('owner', '/bins', { code: 'a-01' }), 409);
    expectStatus(await w.post('mechanic', '/bins', { code: 'M-01' }), 403);
    expectStatus(await w.post('viewer', '/bins', { code: 'V-01' }), 403);
    expectStatus(await w.post('owner', '/bins', { code: '' }), 400);
    const list = await w.get('viewer', '/bins');
    expectStatus(list, 200);
    expect(list.body.bins.map((b: { code: string }) => b.code)).toEqual(['A-01', 'A-02']);
  });

  it('a bin with stock cannot be taken out of use; an empty one can', async () => {
    const part = await w.addPart('BN-100');
    const full = await w.addBin('BN-FULL');
    const empty = await w.addBin('BN-EMPTY');
    expectStatus(await w.post('owner', '/receipts', { partId: part, binId: full, condition: 'new', quantity: 1, unitCostMinor: 100 }), 201);
    const refused = await w.as.owner.patch(`/api/shops/${w.shopId}/stock/bins/${full}`).set('X-CSRF', '1').send({ active: false });
    expectStatus(refused, 409);
    const ok = await w.as.owner.patch(`/api/shops/${w.shopId}/stock/bins/${empty}`).set('X-CSRF', '1').send({ active: false });
    expectStatus(ok, 200);
    expect(ok.body.active).toBe(false);
    // Nothing is received into a bin no longer in use.
    expectStatus(await w.post('owner', '/receipts', { partId: part, binId: empty, condition: 'new', quantity: 1, unitCostMinor: 100 }), 409);
  });
});

describe('every movement kind', () => {
  it('receives, issues, returns, adjusts, moves and counts, keeping quantity and moving-average value', async () => {
    const part = await w.addPart('MV-100', { category: 'Brakes' });
    const b1 = await w.addBin('MV-1');
    const b2 = await w.addBin('MV-2');
    const base = { partId: part, condition: 'new' };

    // 10 @ 5.00, then 10 @ 8.00: average 6.50.
    let res = await w.post('buyer', '/receipts', { ...base, binId: b1, quantity: 10, unitCostMinor: 500, reference: 'Delivery 41' });
    expectStatus(res, 201);
    expect(res.body.movements[0]).toMatchObject({ kind: 'received', quantityDelta: 10, valueChangeMinor: 5000, reference: 'Delivery 41', binCode: 'MV-1' });
    expectStatus(await w.post('buyer', '/receipts', { ...base, binId: b1, quantity: 10, unitCostMinor: 800 }), 201);
    expect((await line(w, part)).valuation[0]).toMatchObject({ quantity: 20, valueMinor: 13_000, unitCostMinor: 650 });

    // Issue 4 at the average.
    res = await w.post('mechanic', '/issues', { ...base, binId: b1, quantity: 4, reference: 'Job 7' });
    expectStatus(res, 201);
    expect(res.body.movements[0]).toMatchObject({ kind: 'issued', quantityDelta: -4, valueChangeMinor: -2600 });

    // One comes back at the average, one at a cost given.
    res = await w.post('mechanic', '/returns', { ...base, binId: b1, quantity: 1 });
    expectStatus(res, 201);
    expect(res.body.movements[0]).toMatchObject({ kind: 'returned', quantityDelta: 1, valueChangeMinor: 650 });
    res = await w.post('owner', '/returns', { ...base, binId: b1, quantity: 1, unitCostMinor: 500 });
    expect(res.body.movements[0]).toMatchObject({ valueChangeMinor: 500 });

    // Two damaged: written off at the average (18 units worth 11,550 → 641.67 each).
    res = await w.post('owner', '/adjustments', { ...base, binId: b1, quantityDelta: -2, reason: 'Damaged in the parts washer' });
    expectStatus(res, 201);
    expect(res.body.movements[0]).toMatchObject({ kind: 'adjusted', quantityDelta: -2, reason: 'Damaged in the parts washer', valueChangeMinor: -1283 });

    // Move 6 to the second bin: quantity moves, value does not.
    res = await w.post('buyer', '/moves', { partId: part, condition: 'new', fromBinId: b1, toBinId: b2, quantity: 6 });
    expectStatus(res, 201);
    expect(res.body.movements[0]).toMatchObject({ kind: 'moved', quantityDelta: -6, binCode: 'MV-1', toBinCode: 'MV-2', valueChangeMinor: 0 });

    // Count the second bin: 5, one missing.
    res = await w.post('owner', '/counts', { ...base, binId: b2, countedQuantity: 5 });
    expectStatus(res, 201);
    expect(res.body.movements[0]).toMatchObject({ kind: 'counted', quantityDelta: -1, countedQuantity: 5 });

    const stock = await line(w, part);
    expect(stock.stock.lines.map((l) => [l.binCode, l.onHand])).toEqual([
      ['MV-1', 10],
      ['MV-2', 5],
    ]);
    expect(stock.valuation[0]!.quantity).toBe(15);
    // The movements add up to the pool's value exactly.
    const history = await w.get('viewer', `/movements?partId=${part}`);
    expect(history.body.total).toBe(8);
    const sum = history.body.movements.reduce((s: number, m: { valueChangeMinor: number }) => s + m.valueChangeMinor, 0);
    expect(sum).toBe(stock.valuation[0]!.valueMinor);
    expect(await checkLedger(w.ctx.db.reader, w.shopId)).toEqual([]);
  });

  it('filters the history by kind, bin and date', async () => {
    const part = await w.addPart('MV-200');
    const bin = await w.addBin('MV-3');
    await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'nos', quantity: 3, unitCostMinor: 1200 });
    await w.post('mechanic', '/issues', { partId: part, binId: bin, condition: 'nos', quantity: 1 });
    const issued = await w.get('viewer', `/movements?partId=${part}&kind=issued`);
    expect(issued.body.movements.map((m: { kind: string }) => m.kind)).toEqual(['issued']);
    expect((await w.get('viewer', `/movements?binId=${bin}`)).body.total).toBe(2);
    expect((await w.get('viewer', `/movements?partId=${part}&from=2026-01-15&to=2026-01-15`)).body.total).toBe(2);
    expect((await w.get('viewer', `/movements?partId=${part}&to=2026-01-14`)).body.total).toBe(0);
    expectStatus(await w.get('viewer', `/movements?kind=stolen`), 400);
  });

  it('refuses movements that would take more than is free, or stock in without a cost', async () => {
    const part = await w.addPart('MV-300');
    const bin = await w.addBin('MV-4');
    const res = await w.post('mechanic', '/issues', { partId: part, binId: bin, condition: 'new', quantity: 1 });
    expectStatus(res, 409);
    expect(res.body.error.details.reason).toBe('insufficient_free_stock');
    const ret = await w.post('mechanic', '/returns', { partId: part, binId: bin, condition: 'new', quantity: 1 });
    expectStatus(ret, 409);
    expect(ret.body.error.details.reason).toBe('no_cost_basis');
    expectStatus(await w.post('owner', '/adjustments', { partId: part, binId: bin, condition: 'new', quantityDelta: -1, reason: 'Lost' }), 409);
    // An adjustment asks why.
    expectStatus(await w.post('owner', '/adjustments', { partId: part, binId: bin, condition: 'new', quantityDelta: 1, unitCostMinor: 10 }), 400);
    expectStatus(await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'mint', quantity: 1, unitCostMinor: 10 }), 400);
    expectStatus(await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'new', quantity: 0, unitCostMinor: 10 }), 400);
    expectStatus(await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'new', quantity: 1, unitCostMinor: 10.5 }), 400);
    expectStatus(await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'new', quantity: 1, unitCostMinor: 10, shopId: other.shopId }), 400);
  });
});

describe('holds', () => {
  it('sets stock aside, keeps free = on hand − held, releases and issues through a hold', async () => {
    const part = await w.addPart('HD-100');
    const bin = await w.addBin('HD-1');
    const base = { partId: part, binId: bin, condition: 'used_good' };
    await w.post('buyer', '/receipts', { ...base, quantity: 5, unitCostMinor: 300 });

    const hold = await w.post('mechanic', '/holds', { ...base, quantity: 3, purpose: 'Recommissioning, blue twin' });
    expectStatus(hold, 201);
    expect(hold.body).toMatchObject({ quantity: 3, status: 'active', purpose: 'Recommissioning, blue twin', jobId: null });
    expect((await line(w, part)).stock).toMatchObject({ onHand: 5, held: 3, free: 2 });

    // Only the free 2 can be held, issued, moved or written off.
    const more = await w.post('mechanic', '/holds', { ...base, quantity: 3, purpose: 'Another job' });
    expectStatus(more, 409);
    expect(more.body.error.details).toMatchObject({ reason: 'insufficient_free_stock', free: 2 });
    expectStatus(await w.post('mechanic', '/issues', { ...base, quantity: 3 }), 409);
    expectStatus(await w.post('owner', '/counts', { ...base, countedQuantity: 2 }), 409);
    expectStatus(await w.post('mechanic', '/holds', { ...base, quantity: 1, purpose: 'x' }), 400);

    // Issue 2 of the 3 held, then the last one: the hold closes as issued.
    let res = await w.post('mechanic', '/issues', { ...base, quantity: 2, holdId: hold.body.id });
    expectStatus(res, 201);
    expect(res.body.movements[0].holdId).toBe(hold.body.id);
    expect((await line(w, part)).stock).toMatchObject({ onHand: 3, held: 1, free: 2 });
    expectStatus(await w.post('mechanic', '/issues', { ...base, quantity: 2, holdId: hold.body.id }), 409);
    res = await w.post('mechanic', '/issues', { ...base, quantity: 1, holdId: hold.body.id });
    expectStatus(res, 201);
    const closed = await w.get('viewer', `/holds?status=issued&partId=${part}`);
    expect(closed.body.holds).toHaveLength(1);
    expect(closed.body.holds[0]).toMatchObject({ status: 'issued', quantity: 0 });

    // Release: the stock is free again; a second release is refused.
    const second = await w.post('mechanic', '/holds', { ...base, quantity: 2, purpose: 'Customer to collect' });
    expect((await line(w, part)).stock.free).toBe(0);
    expectStatus(await w.post('mechanic', `/holds/${second.body.id}/release`), 200);
    expect((await line(w, part)).stock).toMatchObject({ onHand: 2, held: 0, free: 2 });
    expectStatus(await w.post('mechanic', `/holds/${second.body.id}/release`), 409);
    expect(await checkLedger(w.ctx.db.reader, w.shopId)).toEqual([]);
  });

  it('pages the holds: active ones oldest first, closed ones newest first, with the count of all', async () => {
    const part = await w.addPart('HD-300');
    const bin = await w.addBin('HD-3');
    const base = { partId: part, binId: bin, condition: 'new' };
    await w.post('buyer', '/receipts', { ...base, quantity: 10, unitCostMinor: 100 });
    const ids: string[] = [];
    for (let i = 1; i <= 5; i++) {
      w.ctx.clock.advance(60_000);
      const hold = await w.post('mechanic', '/holds', { ...base, quantity: 1, purpose: `Job ${i}` });
      expectStatus(hold, 201);
      ids.push(hold.body.id);
    }
    const purposes = (res: { body: { holds: Array<{ purpose: string }> } }) => res.body.holds.map((h) => h.purpose);
    const first = await w.get('viewer', `/holds?partId=${part}&pageSize=2`);
    expect(first.body).toMatchObject({ total: 5, page: 1, pageSize: 2 });
    expect(purposes(first)).toEqual(['Job 1', 'Job 2']);
    expect(purposes(await w.get('viewer', `/holds?partId=${part}&pageSize=2&page=3`))).toEqual(['Job 5']);
    expect((await w.get('viewer', `/holds?partId=${part}&pageSize=2&page=4`)).body).toMatchObject({ holds: [], total: 5 });

    // Released in the order 2, 4, 1: the released list starts with the latest release.
    for (const i of [1, 3, 0]) {
      w.ctx.clock.advance(60_000);
      expectStatus(await w.post('mechanic', `/holds/${ids[i]}/release`), 200);
    }
    const released = await w.get('viewer', `/holds?partId=${part}&status=released`);
    expect(released.body.total).toBe(3);
    expect(purposes(released)).toEqual(['Job 1', 'Job 4', 'Job 2']);
    expect(purposes(await w.get('viewer', `/holds?partId=${part}`))).toEqual(['Job 3', 'Job 5']);
    expectStatus(await w.get('viewer', `/holds?pageSize=201`), 400);
    expectStatus(await w.get('viewer', `/holds?page=0`), 400);
  });

  it('a hold for another line cannot be used to issue', async () => {
    const part = await w.addPart('HD-200');
    const bin = await w.addBin('HD-2');
    await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'new', quantity: 2, unitCostMinor: 100 });
    await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'nos', quantity: 2, unitCostMinor: 100 });
    const hold = await w.post('mechanic', '/holds', { partId: part, binId: bin, condition: 'new', quantity: 1, purpose: 'Bench test' });
    const res = await w.post('mechanic', '/issues', { partId: part, binId: bin, condition: 'nos', quantity: 1, holdId: hold.body.id });
    expectStatus(res, 409);
    expect(res.body.error.details.reason).toBe('hold_mismatch');
  });
});

describe('serialised items (specific identification, IAS 2 ¶23)', () => {
  it('tracks numbered engines one by one, each at its own cost', async () => {
    const part = await w.addPart('EN-350', { description: 'Engine unit, 350 single' });
    const bin = await w.addBin('EN-BAY');
    const bin2 = await w.addBin('EN-BAY2');
    const base = { partId: part, binId: bin, condition: 'used_good' };
    let res = await w.post('owner', '/receipts', { ...base, quantity: 1, unitCostMinor: 185_000, serials: ['E 10412'] });
    expectStatus(res, 201);
    res = await w.post('owner', '/receipts', { ...base, quantity: 1, unitCostMinor: 92_500, serials: ['E 22071'] });
    expectStatus(res, 201);
    // The same number twice on the shelf is refused, as is one number for two units.
    expectStatus(await w.post('owner', '/receipts', { ...base, quantity: 1, unitCostMinor: 1, serials: ['e-10412'] }), 409);
    expectStatus(await w.post('owner', '/receipts', { ...base, quantity: 2, unitCostMinor: 1, serials: ['E 1'] }), 400);
    // Counted stock cannot join a serialised pool.
    expect((await w.post('owner', '/receipts', { ...base, quantity: 1, unitCostMinor: 1 })).body.error.details.reason).toBe('serialised');

    // Issue needs the number; it leaves at its own cost, not at the average (138,750).
    expect((await w.post('mechanic', '/issues', { ...base, quantity: 1 })).body.error.details.reason).toBe('serial_required');
    res = await w.post('mechanic', '/issues', { ...base, quantity: 1, serial: 'E 10412' });
    expectStatus(res, 201);
    expect(res.body.movements[0]).toMatchObject({ valueChangeMinor: -185_000, serial: 'E 10412' });
    let stock = await line(w, part);
    expect(stock.valuation[0]).toMatchObject({ method: 'specific', quantity: 1, valueMinor: 92_500, unitCostMinor: null });

    // It comes back at its own cost; moves carry the item with them.
    res = await w.post('mechanic', '/returns', { ...base, quantity: 1, serial: 'E 10412' });
    expect(res.body.movements[0].valueChangeMinor).toBe(185_000);
    expectStatus(await w.post('owner', '/moves', { partId: part, condition: 'used_good', fromBinId: bin, toBinId: bin2, quantity: 1, serial: 'E 22071' }), 201);
    expectStatus(await w.post('mechanic', '/issues', { ...base, quantity: 1, serial: 'E 22071' }), 409);
    const detail = await w.get('viewer', `/parts/${part}`);
    expect(detail.body.serials.filter((s: { inStock: boolean }) => s.inStock).map((s: { serial: string; binCode: string; costMinor: number }) => [s.serial, s.binCode, s.costMinor])).toEqual(
      expect.arrayContaining([
        ['E 10412', 'EN-BAY', 185_000],
        ['E 22071', 'EN-BAY2', 92_500],
      ]),
    );
    stock = await line(w, part);
    expect(stock.valuation[0]).toMatchObject({ quantity: 2, valueMinor: 277_500 });
    expect(await checkLedger(w.ctx.db.reader, w.shopId)).toEqual([]);
  });
});

describe('moving average through the ledger against a published worked example', () => {
  it('Weygandt, Kimmel & Kieso, Accounting Principles, ch. 6 appendix 6A (moving-average illustration)', async () => {
    // Source: Weygandt, Kimmel & Kieso, *Accounting Principles*, chapter 6, appendix 6A, perpetual
    // inventory with the moving-average method. Figures from memory (as in
    // libs/domain/src/valuation/moving-average.test.ts), re-check against the edition in hand:
    // 100 @ $10, 200 @ $11, 300 @ $12, sale of 550, 400 @ $13; the book shows averages $10.667 and
    // $11.333, cost of goods sold $6,233 and ending inventory $5,767 (whole dollars). Cents here.
    const part = await w.addPart('WK-6A');
    const bin = await w.addBin('WK');
    const base = { partId: part, binId: bin, condition: 'new' };
    await w.post('buyer', '/receipts', { ...base, quantity: 100, unitCostMinor: 1000 });
    await w.post('buyer', '/receipts', { ...base, quantity: 200, unitCostMinor: 1100 });
    expect((await line(w, part)).valuation[0]!.unitCostMinor).toBe(1066.6667);
    await w.post('buyer', '/receipts', { ...base, quantity: 300, unitCostMinor: 1200 });
    expect((await line(w, part)).valuation[0]!.unitCostMinor).toBe(1133.3333);
    const sale = await w.post('mechanic', '/issues', { ...base, quantity: 550 });
    expect(sale.body.movements[0].valueChangeMinor).toBe(-623_333); // book: $6,233
    await w.post('buyer', '/receipts', { ...base, quantity: 400, unitCostMinor: 1300 });
    const end = (await line(w, part)).valuation[0]!;
    expect(end.quantity).toBe(450);
    expect(end.valueMinor).toBe(576_667); // book: $5,767
  });
});

describe('roles', () => {
  it('a viewer reads stock but cannot move it; a mechanic holds and issues but does not receive; a buyer receives but does not issue', async () => {
    const part = await w.addPart('RL-100');
    const bin = await w.addBin('RL-1');
    const bin2 = await w.addBin('RL-2');
    const base = { partId: part, binId: bin, condition: 'new' };
    await w.post('buyer', '/receipts', { ...base, quantity: 10, unitCostMinor: 100 });
    for (const path of ['', '/bins', '/movements', '/holds', `/parts/${part}`, '/valuation', '/valuation/history', '/valuation.csv']) expectStatus(await w.get('viewer', path), 200);
    const writes: Array<[string, Record<string, unknown>]> = [
      ['/receipts', { ...base, quantity: 1, unitCostMinor: 100 }],
      ['/issues', { ...base, quantity: 1 }],
      ['/returns', { ...base, quantity: 1 }],
      ['/adjustments', { ...base, quantityDelta: -1, reason: 'Viewer tries' }],
      ['/moves', { partId: part, condition: 'new', fromBinId: bin, toBinId: bin2, quantity: 1 }],
      ['/counts', { ...base, countedQuantity: 9 }],
      ['/holds', { ...base, quantity: 1, purpose: 'Viewer tries' }],
    ];
    const before = await w.rows('stock_movements');
    for (const [path, body] of writes) expectStatus(await w.post('viewer', path, body), 403);
    expect(await w.rows('stock_movements')).toBe(before);

    expectStatus(await w.post('mechanic', '/holds', { ...base, quantity: 1, purpose: 'Mechanic holds' }), 201);
    expectStatus(await w.post('mechanic', '/issues', { ...base, quantity: 1 }), 201);
    expectStatus(await w.post('mechanic', '/receipts', { ...base, quantity: 1, unitCostMinor: 100 }), 403);
    expectStatus(await w.post('mechanic', '/adjustments', { ...base, quantityDelta: -1, reason: 'Mechanic tries' }), 403);
    expectStatus(await w.post('buyer', '/receipts', { ...base, quantity: 1, unitCostMinor: 100 }), 201);
    expectStatus(await w.post('buyer', '/moves', { partId: part, condition: 'new', fromBinId: bin, toBinId: bin2, quantity: 1 }), 201);
    expectStatus(await w.post('buyer', '/issues', { ...base, quantity: 1 }), 403);
    expectStatus(await w.post('buyer', '/holds', { ...base, quantity: 1, purpose: 'Buyer tries' }), 403);
  });
});

describe('another shop', () => {
  it("cannot see or touch this shop's stock, bins or holds, also as ids inside bodies (404, nothing changed)", async () => {
    const part = await w.addPart('IS-100');
    const bin = await w.addBin('IS-1');
    await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'new', quantity: 4, unitCostMinor: 100 });
    const hold = await w.post('mechanic', '/holds', { partId: part, binId: bin, condition: 'new', quantity: 1, purpose: 'Ours' });
    const theirPart = await other.addPart('IS-100');
    const theirBin = await other.addBin('IS-1');

    const tables = ['stock_movements', 'stock_lines', 'stock_holds', 'stock_pools', 'stock_bins'];
    const before = await Promise.all(tables.map((t) => w.rows(t)));
    const auditBefore = await w.ctx.db.reader.count(AuditEventEntity);
    // Their ids in our URLs.
    expectStatus(await other.get('viewer', `/parts/${part}`), 404);
    expectStatus(await other.post('mechanic', `/holds/${hold.body.id}/release`), 404);
    expectStatus(await other.as.owner.patch(`/api/shops/${other.shopId}/stock/bins/${bin}`).set('X-CSRF', '1').send({ code: 'MINE' }), 404);
    // Our ids inside their bodies, alone or mixed with theirs.
    expectStatus(await other.post('buyer', '/receipts', { partId: part, binId: theirBin, condition: 'new', quantity: 1, unitCostMinor: 1 }), 404);
    expectStatus(await other.post('buyer', '/receipts', { partId: theirPart, binId: bin, condition: 'new', quantity: 1, unitCostMinor: 1 }), 404);
    expectStatus(await other.post('mechanic', '/issues', { partId: part, binId: bin, condition: 'new', quantity: 1 }), 404);
    expectStatus(await other.post('mechanic', '/issues', { partId: theirPart, binId: theirBin, condition: 'new', quantity: 1, holdId: hold.body.id }), 404);
    expectStatus(await other.post('mechanic', '/holds', { partId: part, binId: bin, condition: 'new', quantity: 1, purpose: 'Theirs' }), 404);
    expectStatus(await other.post('owner', '/moves', { partId: theirPart, condition: 'new', fromBinId: theirBin, toBinId: bin, quantity: 1 }), 404);
    expectStatus(await other.post('owner', '/counts', { partId: part, binId: bin, condition: 'new', countedQuantity: 0 }), 404);
    expectStatus(await other.post('owner', '/adjustments', { partId: part, binId: bin, condition: 'new', quantityDelta: -1, reason: 'Theirs' }), 404);
    // Their member asking for our shop's routes.
    expectStatus(await other.as.owner.get(`/api/shops/${w.shopId}/stock`), 404);
    expectStatus(await other.as.owner.get(`/api/shops/${w.shopId}/stock/bins`), 404);

    expect(await Promise.all(tables.map((t) => w.rows(t)))).toEqual(before);
    expect(await w.ctx.db.reader.count(AuditEventEntity)).toBe(auditBefore);
    // Their lists show none of ours.
    const theirs = await other.get('owner', '/movements');
    expect(theirs.body.total).toBe(0);
    expect((await other.get('owner', '/bins')).body.bins.map((b: { code: string }) => b.code)).toEqual(['IS-1']);
  });
});

describe('audit', () => {
  it('records one event per write, naming who and what', async () => {
    const part = await w.addPart('AU-100');
    const bin = await w.addBin('AU-1');
    const count = () => w.ctx.db.reader.count(AuditEventEntity, { where: { shopId: w.shopId } });
    let before = await count();
    const res = await w.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'new', quantity: 2, unitCostMinor: 100 });
    expect(await count()).toBe(before + 1);
    const [event] = await w.ctx.db.reader.find(AuditEventEntity, { where: { shopId: w.shopId, action: 'stock.received', entityId: part } });
    expect(event?.changes).toMatchObject({ quantity: { after: 2 }, movement: { after: res.body.movements[0].id } });
    before = await count();
    const hold = await w.post('mechanic', '/holds', { partId: part, binId: bin, condition: 'new', quantity: 1, purpose: 'Audit' });
    await w.post('mechanic', `/holds/${hold.body.id}/release`);
    expect(await count()).toBe(before + 2);
  });
});

describe('valuation report', () => {
  it('adds up by category, origin, condition and bin, exports CSV and charts value over time', async () => {
    const ctxWorld = await stockWorld(w.ctx);
    const a = await ctxWorld.addPart('VR-1', { category: 'Electrics' });
    const b = await ctxWorld.addPart('VR-2', { category: 'Brakes', origin: 'reproduction' });
    const b1 = await ctxWorld.addBin('V-1');
    const b2 = await ctxWorld.addBin('V-2');
    // 3 units worth 10.00 over two bins: the bins get 6.67 and 3.33, never a penny more or less.
    await ctxWorld.post('buyer', '/receipts', { partId: a, binId: b1, condition: 'new', quantity: 3, unitCostMinor: 333 });
    await ctxWorld.post('owner', '/adjustments', { partId: a, binId: b1, condition: 'new', quantityDelta: 0 + 1, unitCostMinor: 1, reason: 'Found one' });
    await ctxWorld.post('buyer', '/moves', { partId: a, condition: 'new', fromBinId: b1, toBinId: b2, quantity: 2 });
    await ctxWorld.post('buyer', '/receipts', { partId: b, binId: b2, condition: 'used_fair', quantity: 2, unitCostMinor: 450 });
    const report = await ctxWorld.get('viewer', '/valuation');
    expectStatus(report, 200);
    expect(report.body.totalMinor).toBe(999 + 1 + 900);
    const sum = (groups: Array<{ valueMinor: number }>) => groups.reduce((s, g) => s + g.valueMinor, 0);
    for (const g of ['byCategory', 'byOrigin', 'byCondition', 'byBin']) expect(sum(report.body[g]), g).toBe(1900);
    expect(report.body.byCategory).toEqual([
      { key: 'Electrics', quantity: 4, valueMinor: 1000 },
      { key: 'Brakes', quantity: 2, valueMinor: 900 },
    ]);
    expect(report.body.byBin).toEqual([
      { key: 'V-2', quantity: 4, valueMinor: 1400 },
      { key: 'V-1', quantity: 2, valueMinor: 500 },
    ]);
    const csv = await ctxWorld.get('viewer', '/valuation.csv');
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    expect(csv.text.split('\r\n')[0]).toContain('"value (GBP)"');
    expect(csv.text).toContain('"VR-2","Part VR-2","Brakes","reproduction","used_fair","V-2","2","0","moving average","9.00"');
    const history = await ctxWorld.get('viewer', '/valuation/history?months=3');
    expect(history.body.points).toHaveLength(3);
    expect(history.body.points.at(-1)).toEqual({ date: '2026-01-15', valueMinor: 1900 });
    expect(history.body.points[0].valueMinor).toBe(0);
  });
});

describe('check:ledger', () => {
  it('finds a corrupted balance, held quantity and pool value, and nothing when they agree', async () => {
    const world = await stockWorld(w.ctx);
    const part = await world.addPart('CL-100');
    const bin = await world.addBin('CL-1');
    await world.post('buyer', '/receipts', { partId: part, binId: bin, condition: 'new', quantity: 5, unitCostMinor: 120 });
    await world.post('mechanic', '/holds', { partId: part, binId: bin, condition: 'new', quantity: 2, purpose: 'Check' });
    expect(await checkLedger(world.ctx.db.reader, world.shopId)).toEqual([]);
    await world.ctx.db.write((m) => m.query(`UPDATE stock_lines SET on_hand = on_hand + 1, held = held + 1 WHERE shop_id = ?`, [world.shopId]));
    await world.ctx.db.write((m) => m.query(`UPDATE stock_pools SET value_minor = value_minor - 7 WHERE shop_id = ?`, [world.shopId]));
    const problems = await checkLedger(world.ctx.db.reader, world.shopId);
    expect(problems.map((p) => [p.kind, p.expected, p.actual])).toEqual(
      expect.arrayContaining([
        ['line', 5, 6],
        ['held', 2, 3],
        ['pool', 600, 593],
      ]),
    );
    // The ledger itself cannot be edited away.
    await expect(world.ctx.db.write((m) => m.query(`UPDATE stock_movements SET quantity_delta = 6 WHERE shop_id = ?`, [world.shopId]))).rejects.toThrow(/append-only/);
    await expect(world.ctx.db.write((m) => m.query(`DELETE FROM stock_movements WHERE shop_id = ?`, [world.shopId]))).rejects.toThrow(/append-only/);
  });
});
