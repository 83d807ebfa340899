import { partPurchasingResponseSchema, partStockResponseSchema, sellPricesResponseSchema } from '@tappet/contracts';
import { describe, it } from 'vitest';
import { expectAgreement, expectAgreementOnEveryChange } from '../../../testing/hand-check-agreement';
import { partPurchasingCheck } from '../../purchasing/api/part-purchasing-check';
import { sellPricesCheck } from '../../sales/api/sell-prices-check';
import { partStockCheck } from '../../stock/api/part-stock-check';

// The part page's panels check their answers by hand (docs/decisions/029-part-panels-without-zod.md):
// each check must accept and refuse what its contract's schema does, and give the same value.

const ids = ['5c1d2e3f-4a5b-4c6d-8e7f-9a0b1c2d3e4f', 'b7a6c5d4-e3f2-4a1b-9c8d-7e6f5a4b3c2d', '00000000-0000-0000-0000-000000000000', 'ffffffff-ffff-ffff-ffff-ffffffffffff'] as const;

const summary = {
  onHand: 5,
  held: 2,
  free: 3,
  lines: [
    { binId: ids[1], binCode: 'B-04', condition: 'nos', onHand: 3, held: 2, free: 1 },
    { binId: ids[2], binCode: 'C-11', condition: 'used_good', onHand: 2, held: 0, free: 2 },
  ],
};
const hold = {
  id: ids[3],
  partId: ids[0],
  partNumber: 'KV 2210',
  partDescription: 'Brake master cylinder seal kit',
  binId: ids[1],
  binCode: 'B-04',
  condition: 'nos',
  quantity: 2,
  purpose: 'Job 41: Corran Tern restoration',
  jobId: null,
  status: 'active',
  createdAt: '2026-11-20T10:00:00.000Z',
  createdByName: 'Ada Pellow',
  closedAt: null,
};
const stock = {
  partId: ids[0],
  number: 'KV 2210',
  stock: summary,
  holds: [hold],
  serials: [{ id: ids[2], serial: 'ENG-4471', binId: null, binCode: null, condition: 'reconditioned', costMinor: 42000, inStock: false, receivedAt: '2026-10-01T08:00:00.000Z' }],
  valuation: [
    { condition: 'nos', method: 'average', quantity: 3, valueMinor: 3750, unitCostMinor: 1250.3333 },
    { condition: 'reconditioned', method: 'specific', quantity: 0, valueMinor: 0, unitCostMinor: null },
  ],
  fillOptions: [{ via: ['KV 2210', 'KV 2210A'], needsChanges: true, parts: [{ partId: ids[1], number: 'KV 2210A', description: 'Seal kit, later type', quantity: 1.5, stock: { ...summary, lines: [] } }] }],
  currency: 'GBP',
};

const listing = {
  id: ids[1],
  supplierId: ids[2],
  supplierName: 'Wrenfield Spares',
  currency: 'EUR',
  partId: ids[0],
  partNumber: 'KV 2210',
  partDescription: 'Brake master cylinder seal kit',
  supplierNumber: 'WS-88120',
  priceMinor: 1899,
  packSize: 2,
  minOrderQty: 0,
  leadTimeDays: null,
  lastPaidUnitMinor: 1650,
  lastPaidAt: '2026-09-14T12:00:00.000Z',
  shopCurrency: 'GBP',
  preferred: true,
};
const purchasing = { partId: ids[0], preferredSupplierId: ids[2], minQty: 2, maxQty: null, listings: [listing] };

const prices = {
  currency: 'GBP',
  prices: [
    { partId: ids[0], unitMinor: 2499, basis: 'category-markup', markupPercent: 42.5, listPriceMinor: null, unitCostMinor: 1250, marginMinor: 1249 },
    { partId: 'not-a-uuid-but-allowed', unitMinor: null, basis: 'no-price', markupPercent: null, listPriceMinor: null },
  ],
};

type Json = unknown;

const stockCases: Array<[string, (s: typeof stock) => Json]> = [
  ['the good answer', (s) => s],
  ['nothing in stock', (s) => ({ ...s, stock: { onHand: 0, held: 0, free: 0, lines: [] }, holds: [], serials: [], valuation: [], fillOptions: [] })],
  ['extra keys (dropped)', (s) => ({ ...s, extra: 1, stock: { ...s.stock, extra: 2 }, holds: [{ ...hold, extra: 3 }] })],
  ['null', () => null],
  ['an array', (s) => [s]],
  ['part id not a uuid', (s) => ({ ...s, partId: 'p-1' })],
  ['unknown condition on a line', (s) => ({ ...s, stock: { ...s.stock, lines: [{ ...summary.lines[0], condition: 'mint' }] } })],
  ['fractional quantity on hand', (s) => ({ ...s, stock: { ...s.stock, onHand: 2.5 } })],
  ['unsafe integer held', (s) => ({ ...s, stock: { ...s.stock, held: 2 ** 60 } })],
  ['unknown hold status', (s) => ({ ...s, holds: [{ ...hold, status: 'open' }] })],
  ['hold for a job', (s) => ({ ...s, holds: [{ ...hold, jobId: ids[0] }] })],
  ['hold job id not a uuid', (s) => ({ ...s, holds: [{ ...hold, jobId: 'job-41' }] })],
  ['hold without its creator', (s) => ({ ...s, holds: [{ ...hold, createdByName: undefined }] })],
  ['serial in a bin', (s) => ({ ...s, serials: [{ ...s.serials[0], binId: ids[1], binCode: 'B-04', inStock: true }] })],
  ['serial in stock as a string', (s) => ({ ...s, serials: [{ ...s.serials[0], inStock: 'yes' }] })],
  ['unknown valuation method', (s) => ({ ...s, valuation: [{ ...s.valuation[0], method: 'fifo' }] })],
  ['valuation unit cost infinite', (s) => ({ ...s, valuation: [{ ...s.valuation[0], unitCostMinor: Infinity }] })],
  ['fill option via holding a number', (s) => ({ ...s, fillOptions: [{ ...s.fillOptions[0], via: ['KV 2210', 7] }] })],
  ['fill option part stock missing', (s) => ({ ...s, fillOptions: [{ ...s.fillOptions[0], parts: [{ ...s.fillOptions[0]!.parts[0], stock: undefined }] }] })],
  ['currency missing', ({ currency: _, ...s }) => s],
];

const purchasingCases: Array<[string, (p: typeof purchasing) => Json]> = [
  ['the good answer', (p) => p],
  ['nothing chosen, no listings', (p) => ({ ...p, preferredSupplierId: null, minQty: null, listings: [] })],
  ['extra keys (dropped)', (p) => ({ ...p, extra: 1, listings: [{ ...listing, extra: 2 }] })],
  ['a string', () => 'purchasing'],
  ['preferred supplier not a uuid', (p) => ({ ...p, preferredSupplierId: 'wrenfield' })],
  ['minimum fractional', (p) => ({ ...p, minQty: 1.5 })],
  ['maximum a string', (p) => ({ ...p, maxQty: '4' })],
  ['listing price fractional', (p) => ({ ...p, listings: [{ ...listing, priceMinor: 18.99 }] })],
  ['listing without a supplier number', (p) => ({ ...p, listings: [{ ...listing, supplierNumber: null }] })],
  ['listing preferred missing', (p) => ({ ...p, listings: [{ ...listing, preferred: undefined }] })],
  ['listings an object', (p) => ({ ...p, listings: { 0: listing } })],
];

const priceCases: Array<[string, (p: typeof prices) => Json]> = [
  ['the good answer', (p) => p],
  ['no prices', (p) => ({ ...p, prices: [] })],
  ['extra keys (dropped)', (p) => ({ ...p, extra: 1, prices: [{ ...p.prices[0], extra: 2 }] })],
  ['null', () => null],
  ['unknown basis', (p) => ({ ...p, prices: [{ ...p.prices[0], basis: 'cost-plus' }] })],
  ['markup a string', (p) => ({ ...p, prices: [{ ...p.prices[0], markupPercent: '42.5' }] })],
  ['unit price fractional', (p) => ({ ...p, prices: [{ ...p.prices[0], unitMinor: 24.99 }] })],
  ['cost null, margin left out', (p) => ({ ...p, prices: [{ ...p.prices[1], unitCostMinor: null }] })],
  ['margin a string', (p) => ({ ...p, prices: [{ ...p.prices[0], marginMinor: '1249' }] })],
  ['part id a number', (p) => ({ ...p, prices: [{ ...p.prices[0], partId: 7 }] })],
  ['currency null', (p) => ({ ...p, currency: null })],
];

describe('the part panels’ hand-written checks', () => {
  it.each(stockCases)('the stock check agrees with the contract schema: %s', (_name, change) => {
    expectAgreement(partStockCheck, partStockResponseSchema, change(structuredClone(stock)));
  });

  it.each(purchasingCases)('the purchasing check agrees with the contract schema: %s', (_name, change) => {
    expectAgreement(partPurchasingCheck, partPurchasingResponseSchema, change(structuredClone(purchasing)));
  });

  it.each(priceCases)('the sell prices check agrees with the contract schema: %s', (_name, change) => {
    expectAgreement(sellPricesCheck, sellPricesResponseSchema, change(structuredClone(prices)));
  });

  // Property: whatever single value of a good answer is changed or removed, each check still
  // agrees with its contract's schema (and gives the same result when both accept).
  it('agrees with the contract schemas when any one value of an answer is changed', () => {
    const nearMisses = ['nos', 'new', 'core', 'active', 'released', 'average', 'specific', 'list', 'no-price', 'GBP', ids[1], 2 ** 53, 1250.5];
    expectAgreementOnEveryChange(partStockCheck, partStockResponseSchema, stock, nearMisses);
    expectAgreementOnEveryChange(partPurchasingCheck, partPurchasingResponseSchema, purchasing, nearMisses);
    expectAgreementOnEveryChange(sellPricesCheck, sellPricesResponseSchema, prices, nearMisses);
  });
});
