import { randomUUID } from 'node:crypto';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { StockCondition } from '@tappet/contracts';
import { createTestContext, seedShop, type TestContext } from '../../../test-support/test-app';
import { HttpError } from '../../../lib/http-error';
import { PartEntity } from '../../catalogue/catalogue.entity';
import { checkLedger } from '../stock.ledger-check';
import { apportion, valuedLines } from '../stock.queries';
import { adjustStock, countStock, createBin, holdStock, issueStock, moveStock, receiveStock, releaseHold, returnStock } from '../stock.service';

let ctx: TestContext;
let shopId: string;
beforeAll(async () => {
  ctx = await createTestContext();
  shopId = (await seedShop(ctx, ['owner'])).shop.id;
});
afterAll(() => ctx.close());

type Op =
  | { op: 'receive'; bin: number; quantity: number; unitCostMinor: number }
  | { op: 'issue'; bin: number; quantity: number }
  | { op: 'return'; bin: number; quantity: number; unitCostMinor?: number }
  | { op: 'adjust'; bin: number; delta: number; unitCostMinor?: number }
  | { op: 'move'; bin: number; quantity: number }
  | { op: 'count'; bin: number; counted: number }
  | { op: 'hold'; bin: number; quantity: number }
  | { op: 'release' };

const bin = fc.integer({ min: 0, max: 1 });
const qty = fc.integer({ min: 1, max: 40 });
const cost = fc.integer({ min: 0, max: 250_000 });
const opArb: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ op: fc.constant('receive' as const), bin, quantity: qty, unitCostMinor: cost }),
  fc.record({ op: fc.constant('issue' as const), bin, quantity: qty }),
  fc.record({ op: fc.constant('return' as const), bin, quantity: qty, unitCostMinor: fc.option(cost, { nil: undefined }) }),
  fc.record({ op: fc.constant('adjust' as const), bin, delta: fc.integer({ min: -30, max: 30 }).filter((d) => d !== 0), unitCostMinor: fc.option(cost, { nil: undefined }) }),
  fc.record({ op: fc.constant('move' as const), bin, quantity: qty }),
  fc.record({ op: fc.constant('count' as const), bin, counted: fc.integer({ min: 0, max: 60 }) }),
  fc.record({ op: fc.constant('hold' as const), bin, quantity: qty }),
  fc.constant({ op: 'release' as const }),
);

describe('the ledger under any sequence of movements (fast-check, real SQLite)', () => {
  it('never goes negative, refuses only what it must, keeps value = Σ quantity × unit cost within the rounding policy, and check:ledger agrees', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(opArb, { minLength: 1, maxLength: 18 }), async (ops) => {
        const at = new Date(Date.UTC(2026, 0, 15));
        const c = { actor: { userId: null }, at };
        const condition: StockCondition = 'new';
        const partId = randomUUID();
        const bins = await ctx.db.write(async (m) => {
          await m.insert(PartEntity, { id: partId, shopId, number: `PB-${partId.slice(0, 8)}`, key: `PB${partId.slice(0, 8).toUpperCase()}`, description: 'Property part', origin: 'genuine', maker: null, category: null, unit: 'each', status: 'available', notes: null, createdAt: at, updatedAt: at });
          return [(await createBin(m, shopId, { code: `P-${randomUUID().slice(0, 8)}` }, c)).id, (await createBin(m, shopId, { code: `P-${randomUUID().slice(0, 8)}` }, c)).id];
        });
        // A model of what is on hand and held per bin, to judge each refusal.
        const onHand = [0, 0];
        const held = [0, 0];
        const holds: Array<{ id: string; bin: number; quantity: number }> = [];
        for (const o of ops) {
          const b = 'bin' in o ? o.bin : 0;
          const free = onHand[b]! - held[b]!;
          const total = onHand[0]! + onHand[1]!;
          let expectRefusal: boolean;
          let run: Parameters<typeof ctx.db.write>[0];
          switch (o.op) {
            case 'receive':
              expectRefusal = false;
              run = (m) => receiveStock(m, shopId, { partId, binId: bins[b]!, condition, quantity: o.quantity, unitCostMinor: o.unitCostMinor }, c);
              break;
            case 'issue':
              expectRefusal = o.quantity > free;
              run = (m) => issueStock(m, shopId, { partId, binId: bins[b]!, condition, quantity: o.quantity }, c);
              break;
            case 'return':
              expectRefusal = o.unitCostMinor === undefined && total === 0;
              run = (m) => returnStock(m, shopId, { partId, binId: bins[b]!, condition, quantity: o.quantity, unitCostMinor: o.unitCostMinor }, c);
              break;
            case 'adjust':
              expectRefusal = o.delta < 0 ? -o.delta > free : o.unitCostMinor === undefined && total === 0;
              run = (m) => adjustStock(m, shopId, { partId, binId: bins[b]!, condition, quantityDelta: o.delta, unitCostMinor: o.unitCostMinor, reason: 'Property test' }, c);
              break;
            case 'move':
              expectRefusal = o.quantity > free;
              run = (m) => moveStock(m, shopId, { partId, condition, fromBinId: bins[b]!, toBinId: bins[1 - b]!, quantity: o.quantity }, c);
              break;
            case 'count':
              expectRefusal = o.counted < held[b]! || (o.counted > onHand[b]! && total === 0);
              run = (m) => countStock(m, shopId, { partId, binId: bins[b]!, condition, countedQuantity: o.counted }, c);
              break;
            case 'hold':
              expectRefusal = o.quantity > free;
              run = async (m) => {
                const h = await holdStock(m, shopId, { partId, binId: bins[b]!, condition, quantity: o.quantity, purpose: 'Property test' }, c);
                holds.push({ id: h.id, bin: b, quantity: o.quantity });
                return h;
              };
              break;
            case 'release':
              expectRefusal = holds.length === 0;
              run = (m) => (holds.length ? releaseHold(m, shopId, holds[0]!.id, c) : Promise.reject(new HttpError(409, 'conflict', 'no hold')));
              break;
          }
          let refused = false;
          try {
            await ctx.db.write(run);
          } catch (error) {
            if (!(error instanceof HttpError) || error.status !== 409) throw error;
            refused = true;
          }
          expect(refused, `${JSON.stringify(o)} with on hand ${onHand} held ${held}`).toBe(expectRefusal);
          if (refused) continue;
          if (o.op === 'receive' || o.op === 'return') onHand[b]! += o.quantity;
          if (o.op === 'issue') onHand[b]! -= o.quantity;
          if (o.op === 'adjust') onHand[b]! += o.delta;
          if (o.op === 'count') onHand[b] = o.counted;
          if (o.op === 'move') {
            onHand[b]! -= o.quantity;
            onHand[1 - b]! += o.quantity;
          }
          if (o.op === 'hold') held[b]! += o.quantity;
          if (o.op === 'release') {
            const h = holds.shift()!;
            held[h.bin]! -= h.quantity;
          }
        }
        const [pool] = await ctx.db.reader.query<Array<{ quantity: number; value: number }>>(`SELECT quantity, value_minor AS value FROM stock_pools WHERE shop_id = ? AND part_id = ?`, [shopId, partId]);
        const quantity = Number(pool?.quantity ?? 0);
        const value = Number(pool?.value ?? 0);
        expect(quantity).toBe(onHand[0]! + onHand[1]!);
        expect(value).toBeGreaterThanOrEqual(0);
        if (quantity === 0) expect(value).toBe(0);
        // Value = Σ quantity × unit cost, the unit cost being the exact average: the per-bin
        // shares add up to the pool's value to the minor unit, each within one of its exact share.
        const lines = (await valuedLines(ctx.db.reader, shopId)).filter((l) => l.partId === partId);
        expect(lines.reduce((s, l) => s + l.valueMinor, 0)).toBe(value);
        for (const l of lines) expect(Math.abs(l.valueMinor - (value * l.onHand) / quantity)).toBeLessThan(1);
        // And the ledger agrees with every cached balance.
        expect(await checkLedger(ctx.db.reader, shopId)).toEqual([]);
      }),
      { numRuns: 40 },
    );
  }, 120_000);
});

describe('apportion', () => {
  it('splits a value over weights in whole minor units that add up exactly, each within one of its exact share', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 1e12 }), fc.array(fc.integer({ min: 0, max: 10_000 }), { minLength: 1, maxLength: 12 }), (total, weights) => {
        const shares = apportion(total, weights);
        const sum = weights.reduce((a, b) => a + b, 0);
        if (sum === 0) {
          expect(shares.every((s) => s === 0)).toBe(true);
          return;
        }
        expect(shares.reduce((a, b) => a + b, 0)).toBe(total);
        shares.forEach((s, i) => expect(Math.abs(s - (total * weights[i]!) / sum)).toBeLessThan(1));
      }),
    );
    expect(apportion(1000, [1, 1, 1])).toEqual([334, 333, 333]);
  });
});
