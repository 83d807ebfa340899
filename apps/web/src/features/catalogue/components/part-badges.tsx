import type { PartStatusValue } from '@tappet/contracts';
import { StatusPill } from '@tappet/ui';
import { countWords, statusWordsOf } from './words';

/** A part's status as a word and a shape: available (tick) or no longer available (grey mark). */
export function PartStatusPill({ status }: { status: PartStatusValue }) {
  return <StatusPill status={status === 'available' ? 'ok' : 'na'} label={statusWordsOf[status]} />;
}

/** How many data problems touch a part; nothing when there are none. */
export function ProblemCount({ count }: { count: number }) {
  if (count === 0) return <span className="text-ink-muted">None</span>;
  return <StatusPill status="advise" label={countWords(count, 'problem', 'problems')} />;
}
