import { stockConditionLabels, type StockSummary } from '@tappet/contracts';
import { Num, PartNumber } from '@tappet/ui';

/**
 * A result's stock in one line, so a mechanic sees where the part sits without opening it:
 * "3 free in B-04 (new) · 2 held", or "None in stock". Nothing when stock is not known.
 */
export function LookupStock({ stock }: { stock?: StockSummary }) {
  if (!stock) return null;
  if (stock.onHand === 0) return <span className="block text-sm text-ink-muted">None in stock</span>;
  const free = stock.lines.filter((l) => l.free > 0);
  return (
    <span className="block text-sm" data-testid="lookup-stock">
      <span className="font-bold">Stock:</span>{' '}
      {free.length === 0
        ? 'none free'
        : free.map((l, i) => (
            <span key={`${l.binId}|${l.condition}`}>
              {i > 0 && ', '}
              <Num className="font-bold">{l.free}</Num> free in <PartNumber>{l.binCode}</PartNumber> ({stockConditionLabels[l.condition].toLowerCase()})
            </span>
          ))}
      {stock.held > 0 && (
        <span className="text-ink-muted">
          {' '}
          · <Num>{stock.held}</Num> held
        </span>
      )}
    </span>
  );
}
