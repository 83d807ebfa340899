import { stockConditionLabels, stockConditions, type MovementKind, type StockCondition } from '@tappet/contracts';
import { formatMoney } from '@tappet/domain';

/** Condition options for selects. */
export const conditionOptions = stockConditions.map((c) => ({ value: c, label: stockConditionLabels[c] }));

export const conditionLabel = (c: StockCondition) => stockConditionLabels[c];

/** Words for the ledger's movement kinds. */
export const movementLabels: Record<MovementKind, string> = {
  received: 'Received',
  issued: 'Issued',
  returned: 'Returned',
  adjusted: 'Adjusted',
  moved: 'Moved',
  counted: 'Counted',
};

/** Money in the shop's currency, from minor units, with a real minus sign. */
export const money = (minor: number, currency: string) => formatMoney(minor, currency).replace(/^-/, '−');

/** "+3", "−2", "0" with a real minus sign. */
export const signed = (n: number) => (n > 0 ? `+${n}` : n < 0 ? `−${Math.abs(n)}` : '0');
