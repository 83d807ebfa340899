import type { StockCondition } from '@tappet/contracts';
import { PartNumber } from '@tappet/ui';
import type { ReactNode } from 'react';
import { conditionLabel } from './words';

/**
 * A bin code with the stock's condition beneath it: one column instead of two, so the stock
 * tables fit a tablet in landscape. `to` is a move's other bin.
 */
export function BinWithCondition({ code, condition, to }: { code: string; condition: StockCondition; to?: string | null }): ReactNode {
  return (
    <>
      <PartNumber>
        {code}
        {to ? ` → ${to}` : ''}
      </PartNumber>
      <span className="block text-sm text-ink-muted">{conditionLabel(condition)}</span>
    </>
  );
}
