import type { PartStockResponse, StockSummary } from '@tappet/contracts';
import { describe, expect, it } from 'vitest';
import { stockGlance } from './part-glance';

const bin = (binCode: string, onHand: number, held = 0): StockSummary['lines'][number] => ({ binId: `id-${binCode}`, binCode, condition: 'new', onHand, held, free: Math.max(0, onHand - held) });
const summary = (...lines: StockSummary['lines']): StockSummary => ({
  onHand: lines.reduce((n, l) => n + l.onHand, 0),
  held: lines.reduce((n, l) => n + l.held, 0),
  free: lines.reduce((n, l) => n + l.free, 0),
  lines,
});
const option = (number: string, stock: StockSummary): PartStockResponse['fillOptions'][number] => ({ via: ['KV 2210', number], needsChanges: false, parts: [{ partId: `id-${number}`, number, description: 'Seal kit', quantity: 1, stock }] });

describe('the part stock glance', () => {
  it('says how many are free and where, naming up to two bins', () => {
    expect(stockGlance({ stock: summary(bin('C-08', 4), bin('CORE', 10)), fillOptions: [] })).toBe('14 free in C-08, CORE');
    expect(stockGlance({ stock: summary(bin('A-1', 1), bin('B-2', 1), bin('C-3', 1)), fillOptions: [] })).toBe('3 free in 3 bins');
  });

  it('counts a bin once when it holds the part in two conditions, and leaves out bins with nothing free', () => {
    const nos = { ...bin('B-04', 2), condition: 'nos' as const };
    expect(stockGlance({ stock: summary(bin('B-04', 1), nos, bin('C-11', 2, 2)), fillOptions: [] })).toBe('3 free in B-04 · 2 held');
  });

  it('says when everything on hand is held', () => {
    expect(stockGlance({ stock: summary(bin('B-04', 2, 2)), fillOptions: [] })).toBe('None free · 2 held');
  });

  it('points to another number with free stock when there is none of this one', () => {
    const fill = [option('KV 2210A', summary()), option('KV 2210B', summary(bin('D-02', 4)))];
    expect(stockGlance({ stock: summary(), fillOptions: fill })).toBe('None in stock · KV 2210B has 4 free');
    expect(stockGlance({ stock: summary(), fillOptions: [option('KV 2210A', summary())] })).toBe('None in stock');
  });
});
