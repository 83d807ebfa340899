import { stockConditionLabels, type PartSearchResult } from '@tappet/contracts';
import { Badge, Button, FormMessage, PartNumber, TextField } from '@tappet/ui';
import { useState } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { useFindParts } from '../api/find-parts';
import { useAddSpecialOrder, useHoldPart } from '../api/mutations';

/**
 * Finding a part for the job through the lookup: any number it has had (a superseded number
 * answers with the parts that can fill it), a supplier's number or words of its description.
 * Each answer shows its free stock per bin and condition with a button to hold it for the job;
 * a part with none free can be special-ordered for the job instead.
 */
export function PartsFinder({ shopId, jobId, canHold, canOrder }: { shopId: string; jobId: string; canHold: boolean; canOrder: boolean }) {
  const [q, setQ] = useState('');
  const [qty, setQty] = useState('1');
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const found = useFindParts(shopId, q);
  const hold = useHoldPart(shopId, jobId);
  const order = useAddSpecialOrder(shopId, jobId);
  const quantity = Number(qty);
  const quantityOk = Number.isInteger(quantity) && quantity >= 1 && quantity <= 9999;
  const run = (p: Promise<unknown>, message: string) =>
    p.then(
      () => {
        setError(null);
        setDone(message);
      },
      (e: unknown) => {
        setDone(null);
        setError(errorMessage(e));
      },
    );
  const results = found.data?.results ?? [];
  const searching = q.trim().length >= 2;

  return (
    <div className="mb-4 flex flex-col gap-2">
      <div className="flex flex-wrap items-end gap-2">
        <TextField label="Find a part" value={q} onChange={(e) => setQ(e.target.value)} hint="Any number it has had (old and superseded ones too), a supplier’s number, or words of its description." fieldClassName="min-w-64 flex-1" />
        <TextField label="Quantity" inputMode="numeric" value={qty} onChange={(e) => setQty(e.target.value)} error={quantityOk ? undefined : 'A whole number from 1.'} fieldClassName="w-28" />
      </div>
      {error && <FormMessage>{error}</FormMessage>}
      {done && (
        <p role="status">
          {done}
        </p>
      )}
      {searching && found.isError && <FormMessage>{errorMessage(found.error)}</FormMessage>}
      {searching && found.data && results.length === 0 && <p className="text-ink-muted">Nothing in the catalogue matches “{q.trim()}”.</p>}
      {searching && results.length > 0 && (
        <ul className="flex flex-col gap-2" aria-label="Parts that can fill it">
          {results.map((r) => (
            <ResultRow
              key={r.id}
              result={r}
              quantity={quantityOk ? quantity : 0}
              canHold={canHold}
              canOrder={canOrder}
              busy={hold.isPending || order.isPending}
              onHold={(line) => void run(hold.mutateAsync({ partId: r.id, binId: line.binId, condition: line.condition, quantity }), `Held ${quantity} × ${r.number} from ${line.binCode} for this job.`)}
              onOrder={() => void run(order.mutateAsync({ partId: r.id, quantity, note: `Looked up as “${q.trim()}”` }), `Special order for ${quantity} × ${r.number} added to this job.`)}
            />
          ))}
        </ul>
      )}
    </div>
  );
}

type StockLine = NonNullable<PartSearchResult['stock']>['lines'][number];

function ResultRow({ result: r, quantity, canHold, canOrder, busy, onHold, onOrder }: { result: PartSearchResult; quantity: number; canHold: boolean; canOrder: boolean; busy: boolean; onHold: (line: StockLine) => void; onOrder: () => void }) {
  const free = (r.stock?.lines ?? []).filter((l) => l.free > 0);
  return (
    <li className="rounded-md border-2 border-line p-3">
      <div className="flex flex-wrap items-center gap-2">
        <PartNumber>{r.number}</PartNumber>
        <span>{r.description}</span>
        {r.match === 'lineage' && <Badge tone="accent">{r.reason}</Badge>}
        {r.match !== 'lineage' && r.match !== 'exact' && <span className="text-sm text-ink-muted">({r.reason})</span>}
        {r.status === 'nla' && <Badge>No longer available</Badge>}
      </div>
      {free.length > 0 ? (
        <ul className="mt-2 flex flex-col gap-2">
          {free.map((l) => (
            <li key={`${l.binId}-${l.condition}`} className="flex flex-wrap items-center justify-between gap-2">
              <span>
                Bin <span className="font-mono">{l.binCode}</span> · {stockConditionLabels[l.condition]} · <span className="font-mono tabular-nums">{l.free}</span> free
              </span>
              {canHold && (
                <Button variant="secondary" size="sm" disabled={quantity < 1 || l.free < quantity || busy} onClick={() => onHold(l)} aria-label={`Hold ${quantity} × ${r.number} from ${l.binCode} for this job`}>
                  Hold for job
                </Button>
              )}
            </li>
          ))}
        </ul>
      ) : (
        <div className="mt-2 flex flex-wrap items-center justify-between gap-2">
          <span className="text-ink-muted">None free in stock.</span>
          {canOrder && (
            <Button variant="secondary" size="sm" disabled={quantity < 1 || busy} onClick={onOrder} aria-label={`Special order ${quantity} × ${r.number} for this job`}>
              Special order
            </Button>
          )}
        </div>
      )}
    </li>
  );
}
