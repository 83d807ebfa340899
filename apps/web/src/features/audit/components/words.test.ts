import { describe, expect, it } from 'vitest';
import { actionWord, entityOptions } from './words';

describe('the audit log’s words', () => {
  it('names the actions of every module in plain words', () => {
    expect(actionWord('stock_count.counted')).toBe('Counted a line of a stock count');
    expect(actionWord('purchase_order.approved')).toBe('Approved an order');
    expect(actionWord('job.safety_item_signed_off')).toBe('Signed off a safety item');
  });

  it('spells out a code it does not know, such as one an older version recorded', () => {
    expect(actionWord('widget.polished_up')).toBe('Widget polished up');
  });

  it('offers every kind of record in the filter, in the order of their names', () => {
    const values = entityOptions.map((o) => o.value);
    for (const kind of ['job', 'invoice', 'purchase_order', 'stock_hold', 'stock_count', 'vehicle', 'part']) expect(values).toContain(kind);
    const labels = entityOptions.map((o) => o.label);
    expect(labels).toEqual([...labels].sort((a, b) => a.localeCompare(b, 'en')));
  });
});
