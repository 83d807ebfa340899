import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkLedger } from '../stock.ledger-check';
import { stockWorld, type StockWorld } from './helpers';

let w: StockWorld;
beforeAll(async () => {
  w = await stockWorld();
});
afterAll(() => w.ctx.close());

describe('the last units under concurrent requests', () => {
  it('lets exactly the free quantity through holds and issues fired at once; the rest get 409; nothing lost or doubled', async () => {
    const part = await w.addPart('CC-100');
    const bin = await w.addBin('CC-1');
    const base = { partId: part, binId: bin, condition: 'new' };
    await w.post('buyer', '/receipts', { ...base, quantity: 7, unitCostMinor: 300 });
    const before = await w.rows('stock_movements');

    // 12 holds of one and 12 issues of one, interleaved, all in flight together, as two people.
    const requests = Array.from({ length: 24 }, (_, i) =>
      i % 2 === 0 ? w.post('mechanic', '/holds', { ...base, quantity: 1, purpose: `Rush job ${i}` }) : w.post(i % 4 === 1 ? 'owner' : 'mechanic', '/issues', { ...base, quantity: 1, reference: `Counter ${i}` }),
    );
    const results = await Promise.all(requests.map((r) => r.then((res) => res)));
    const ok = results.filter((r) => r.status === 201);
    const refused = results.filter((r) => r.status !== 201);
    expect(ok).toHaveLength(7);
    expect(refused).toHaveLength(17);
    for (const r of refused) {
      expect(r.status).toBe(409);
      expect(r.body.error).toMatchObject({ code: 'conflict', details: { reason: 'insufficient_free_stock', free: 0 } });
      expect(r.body.error.message).toMatch(/No free stock of CC-100/);
    }

    const issued = ok.filter((r) => 'movements' in r.body).length;
    const held = ok.length - issued;
    // Exactly one movement per successful issue, none for a refusal.
    expect(await w.rows('stock_movements')).toBe(before + issued);
    const stock = (await w.get('viewer', `/parts/${part}`)).body;
    expect(stock.stock).toEqual({ onHand: 7 - issued, held, free: 0, lines: [expect.objectContaining({ onHand: 7 - issued, held, free: 0 })] });
    expect(stock.valuation[0]).toMatchObject({ quantity: 7 - issued, valueMinor: (7 - issued) * 300 });
    expect(await checkLedger(w.ctx.db.reader, w.shopId)).toEqual([]);
  });

  it('issues against one hold fired at once never take more than it holds', async () => {
    const part = await w.addPart('CC-200');
    const bin = await w.addBin('CC-2');
    const base = { partId: part, binId: bin, condition: 'nos' };
    await w.post('buyer', '/receipts', { ...base, quantity: 10, unitCostMinor: 1000 });
    const hold = await w.post('mechanic', '/holds', { ...base, quantity: 4, purpose: 'Restoration, green single' });
    const results = await Promise.all(Array.from({ length: 10 }, () => w.post('mechanic', '/issues', { ...base, quantity: 1, holdId: hold.body.id })));
    expect(results.filter((r) => r.status === 201)).toHaveLength(4);
    expect(results.filter((r) => r.status === 409)).toHaveLength(6);
    const stock = (await w.get('viewer', `/parts/${part}`)).body.stock;
    expect(stock).toMatchObject({ onHand: 6, held: 0, free: 6 });
    expect(await checkLedger(w.ctx.db.reader, w.shopId)).toEqual([]);
  });
});
