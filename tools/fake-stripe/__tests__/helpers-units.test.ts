// Pure helpers: billing-period arithmetic, metadata updates, expansion paths and page escaping.
import { describe, expect, it } from 'vitest';
import { addInterval, applyMetadata } from '../billing.ts';
import { FakeStripeError } from '../errors.ts';
import { expand } from '../expand.ts';
import { esc, money } from '../pages.ts';
import { newId } from '../store.ts';

const utc = (iso: string) => Date.parse(iso) / 1000;

describe('addInterval', () => {
  it('adds calendar months and clamps to the end of a shorter month', () => {
    expect(addInterval(utc('2025-01-31T10:00:00Z'), 'month', 1)).toBe(utc('2025-02-28T10:00:00Z'));
    expect(addInterval(utc('2024-01-31T10:00:00Z'), 'month', 1)).toBe(utc('2024-02-29T10:00:00Z'));
    expect(addInterval(utc('2025-03-15T00:00:00Z'), 'month', 3)).toBe(utc('2025-06-15T00:00:00Z'));
  });
  it('adds years, weeks and days', () => {
    expect(addInterval(utc('2024-02-29T00:00:00Z'), 'year', 1)).toBe(utc('2025-02-28T00:00:00Z'));
    expect(addInterval(utc('2025-01-01T00:00:00Z'), 'week', 2)).toBe(utc('2025-01-15T00:00:00Z'));
    expect(addInterval(utc('2025-01-01T00:00:00Z'), 'day', 1)).toBe(utc('2025-01-02T00:00:00Z'));
  });
  it('refuses an interval it does not know', () => {
    expect(() => addInterval(0, 'fortnight', 1)).toThrow(/fortnight/);
  });
});

describe('applyMetadata', () => {
  it("merges, removes keys set to '' and clears everything on ''", () => {
    expect(applyMetadata({ a: '1', b: '2' }, { b: '', c: '3' })).toEqual({ a: '1', c: '3' });
    expect(applyMetadata({ a: '1' }, '')).toEqual({});
    expect(applyMetadata({ a: '1' }, undefined)).toEqual({ a: '1' });
  });
});

describe('expand', () => {
  const objects: Record<string, unknown> = { prod_1: { id: 'prod_1', object: 'product' }, sub_1: { id: 'sub_1', latest_invoice: 'in_1' }, in_1: { id: 'in_1', object: 'invoice' } };
  const resolve = (id: string) => structuredClone(objects[id]);

  it('walks list data and expands intermediate ids', () => {
    const list = { object: 'list', data: [{ product: 'prod_1' }, { product: 'prod_1' }] };
    expect(expand(list, ['data.product'], resolve).data[1]).toEqual({ product: { id: 'prod_1', object: 'product' } });
    const session = expand({ subscription: 'sub_1' as unknown }, ['subscription.latest_invoice'], resolve);
    expect(session.subscription).toEqual({ id: 'sub_1', latest_invoice: { id: 'in_1', object: 'invoice' } });
  });
  it('leaves null relations alone and refuses paths that name no id', () => {
    expect(expand({ customer: null }, ['customer'], resolve)).toEqual({ customer: null });
    expect(() => expand({ currency: 'gbp' }, ['currency'], resolve)).toThrow(FakeStripeError);
    expect(() => expand({}, ['nothing'], resolve)).toThrow(/cannot be expanded/);
    expect(() => expand({}, ['a.b.c.d.e'], resolve)).toThrow(/four levels/);
  });
});

describe('page helpers', () => {
  it('escapes markup in names that come from API callers', () => {
    expect(esc('<script>"x"</script>&\'')).toBe('&lt;script&gt;&quot;x&quot;&lt;/script&gt;&amp;&#39;');
  });
  it('formats minor units, with zero-decimal currencies left whole', () => {
    expect(money(4900, 'gbp')).toBe('£49.00');
    expect(money(500, 'jpy')).toBe('JP¥500');
  });
  it('makes Stripe-style ids of the requested length', () => {
    const id = newId('cus', 14);
    expect(id).toMatch(/^cus_[0-9A-Za-z]{14}$/);
    expect(new Set(Array.from({ length: 200 }, () => newId('evt'))).size).toBe(200);
  });
});
