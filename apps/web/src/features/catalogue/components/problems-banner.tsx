import { Button, IconAdvise } from '@tappet/ui';
import { useCatalogueProblems } from '../api/get-problems';
import { countWords } from './words';

/**
 * A note above the list when the catalogue has data problems (circles, dead ends, unknown
 * numbers), with a way to list only the parts they touch. Silent when there are none or when
 * the count cannot be had (the list itself still works).
 */
export function ProblemsBanner({ shopId, showing, onShow }: { shopId: string; showing: boolean; onShow: () => void }) {
  const problems = useCatalogueProblems(shopId);
  const count = problems.data?.problems.length ?? 0;
  if (count === 0) return null;
  const kinds = new Set(problems.data?.problems.map((p) => p.kind));
  const what = [kinds.has('cycle') && 'circular replacements', kinds.has('dead_end') && 'dead ends', kinds.has('unknown_number') && 'links to unknown numbers', kinds.has('invalid_quantity') && 'unusable quantities']
    .filter(Boolean)
    .join(', ');
  return (
    <div role="region" aria-label="Data problems" className="flex flex-wrap items-center justify-between gap-3 rounded-md border-2 border-advise bg-advise-soft p-3">
      <p className="flex items-center gap-2">
        <IconAdvise className="shrink-0 text-advise" />
        <span>
          <span className="font-bold">The catalogue has {countWords(count, 'data problem', 'data problems')}</span>
          {what && <span>: {what}</span>}. Each part page says what to fix.
        </span>
      </p>
      {!showing && (
        <Button variant="secondary" size="sm" onClick={onShow}>
          Show only parts with problems
        </Button>
      )}
    </div>
  );
}
