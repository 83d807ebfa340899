import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { csrf } from '../../../test-support/test-app';
import { expectStatus, stockWorld, type StockWorld } from './helpers';

let w: StockWorld;
beforeAll(async () => {
  w = await stockWorld();
});
afterAll(() => w.ctx.close());

describe('lookup with stock', () => {
  it('shows "none of this number, but 3 of its replacement in bin B-04", in the lookup and on the part page', async () => {
    const old = await w.addPart('LK-7100', { description: 'Clutch cable, early', status: 'nla' });
    const current = await w.addPart('LK-7100A', { description: 'Clutch cable' });
    expectStatus(await w.as.owner.post(`/api/shops/${w.shopId}/part-links`).set(csrf).send({ fromPartId: old, kind: 'replaced_by', toNumber: 'LK-7100A' }), 201);
    const b04 = await w.addBin('B-04');
    const b07 = await w.addBin('B-07');
    await w.post('buyer', '/receipts', { partId: current, binId: b04, condition: 'new', quantity: 3, unitCostMinor: 640 });
    await w.post('buyer', '/receipts', { partId: current, binId: b07, condition: 'used_good', quantity: 2, unitCostMinor: 200 });
    await w.post('mechanic', '/holds', { partId: current, binId: b07, condition: 'used_good', quantity: 2, purpose: 'Held for the grey twin' });

    const search = await w.as.mechanic.get(`/api/shops/${w.shopId}/parts/search?q=lk 7100`);
    expectStatus(search, 200);
    const byNumber = new Map(search.body.results.map((r: { number: string }) => [r.number, r]));
    expect(byNumber.get('LK-7100')).toMatchObject({ match: 'exact', stock: { onHand: 0, held: 0, free: 0, lines: [] } });
    expect(byNumber.get('LK-7100A')).toMatchObject({
      match: 'lineage',
      reason: 'replaces LK-7100',
      stock: {
        onHand: 5,
        held: 2,
        free: 3,
        lines: [
          { binCode: 'B-04', condition: 'new', onHand: 3, held: 0, free: 3 },
          { binCode: 'B-07', condition: 'used_good', onHand: 2, held: 2, free: 0 },
        ],
      },
    });

    const page = await w.get('mechanic', `/parts/${old}`);
    expectStatus(page, 200);
    expect(page.body.stock).toEqual({ onHand: 0, held: 0, free: 0, lines: [] });
    expect(page.body.fillOptions).toEqual([
      expect.objectContaining({ needsChanges: false, parts: [expect.objectContaining({ number: 'LK-7100A', description: 'Clutch cable', quantity: 1, stock: expect.objectContaining({ free: 3 }) })] }),
    ]);
  });
});
