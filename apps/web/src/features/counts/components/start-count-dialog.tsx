import { countStartSchema } from '@tappet/contracts';
import { Button, Dialog, EmptyState, ErrorState, FormMessage, LoadingState, PartNumber, TextField } from '@tappet/ui';
import { useId, useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { useCountChoices } from '../api/get-count-choices';
import { startCount, useCountMutation } from '../api/write-counts';

/**
 * Starts a count of chosen bins or of chosen categories. Starting freezes what the ledger says
 * each line holds; the count then opens for counting.
 */
export function StartCountDialog({ shopId, open, onClose }: { shopId: string; open: boolean; onClose: () => void }) {
  const formId = useId();
  const choices = useCountChoices(shopId, open);
  const start = useCountMutation(shopId, startCount);
  const navigate = useNavigate();
  const [by, setBy] = useState<'bins' | 'categories'>('bins');
  const [chosen, setChosen] = useState<Set<string>>(new Set());
  const [note, setNote] = useState('');
  const [error, setError] = useState<string | null>(null);
  if (!open) return null;

  const toggle = (value: string, on: boolean) =>
    setChosen((before) => {
      const next = new Set(before);
      if (on) next.add(value);
      else next.delete(value);
      return next;
    });

  function onSubmit(event: FormEvent) {
    event.preventDefault();
    const body = by === 'bins' ? { binIds: [...chosen], note: note || undefined } : { categories: [...chosen], note: note || undefined };
    const parsed = countStartSchema.safeParse(body);
    if (!parsed.success) {
      setError(chosen.size === 0 ? `Choose at least one ${by === 'bins' ? 'bin' : 'category'} to count.` : (parsed.error.issues[0]?.message ?? 'Check the choices.'));
      return;
    }
    setError(null);
    start.mutate(body, {
      onSuccess: (count) => navigate(paths.shop.count.getHref(shopId, count.id)),
      onError: (e) => setError(errorMessage(e)),
    });
  }

  const options = by === 'bins' ? (choices.data?.bins ?? []).map((b) => ({ value: b.id, label: b.code, detail: [b.description, `${b.lineCount} ${b.lineCount === 1 ? 'line' : 'lines'}`].filter(Boolean).join(' · ') })) : (choices.data?.categories ?? []).map((c) => ({ value: c, label: c, detail: '' }));

  return (
    <Dialog
      open
      onClose={onClose}
      title="Start a count"
      description="What the ledger says each line holds is frozen now. Stock can keep moving while you count: movements are taken into account line by line."
      footer={
        <>
          <Button variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" form={formId} loading={start.isPending}>
            Start the count
          </Button>
        </>
      }
    >
      <form id={formId} noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        {error && <FormMessage>{error}</FormMessage>}
        <fieldset className="flex flex-wrap gap-4">
          <legend className="mb-2 font-bold">Count by</legend>
          {(['bins', 'categories'] as const).map((kind) => (
            <label key={kind} className="flex min-h-touch items-center gap-2">
              <input
                type="radio"
                name="by"
                value={kind}
                checked={by === kind}
                className="h-5 w-5 accent-accent"
                onChange={() => {
                  setBy(kind);
                  setChosen(new Set());
                }}
              />
              {kind === 'bins' ? 'Bins' : 'Categories'}
            </label>
          ))}
        </fieldset>
        {choices.isPending ? (
          <LoadingState label="Loading bins and categories…" />
        ) : choices.isError ? (
          <ErrorState message={errorMessage(choices.error)} onRetry={() => void choices.refetch()} />
        ) : options.length === 0 ? (
          <EmptyState title={by === 'bins' ? 'No bins in use' : 'No categories with stock'}>{by === 'bins' ? 'Add bins on the stock screens first.' : 'Give parts a category in the catalogue, or count by bins.'}</EmptyState>
        ) : (
          <fieldset>
            <legend className="mb-2 font-bold">{by === 'bins' ? 'Bins to count' : 'Categories to count'}</legend>
            <ul className="flex max-h-72 flex-col divide-y divide-line overflow-y-auto rounded-md border border-line">
              {options.map((o) => (
                <li key={o.value}>
                  <label className="flex min-h-touch items-center gap-3 px-3 py-1">
                    <input type="checkbox" className="h-5 w-5 accent-accent" checked={chosen.has(o.value)} onChange={(e) => toggle(o.value, e.target.checked)} />
                    {by === 'bins' ? <PartNumber>{o.label}</PartNumber> : <span>{o.label}</span>}
                    {o.detail && <span className="text-sm text-ink-muted">{o.detail}</span>}
                  </label>
                </li>
              ))}
            </ul>
          </fieldset>
        )}
        <TextField label="Note" name="note" value={note} onChange={(e) => setNote(e.target.value)} hint="Optional: why, or who is counting." autoComplete="off" maxLength={500} />
      </form>
    </Dialog>
  );
}
