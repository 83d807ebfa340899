import { templateInputSchema, type ChecklistTemplate, type TemplateItemInput } from '@tappet/contracts';
import { itemKinds, type ItemKind } from '@tappet/domain';
import { Button, FormMessage, Select, TextField, useToast } from '@tappet/ui';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { templateSchema } from '@tappet/contracts';
import { api, ApiError, errorMessage } from '../../../lib/api-client';
import { shopQueryKey } from '../../../lib/query-client';

const kindWords: Record<ItemKind, string> = { check: 'Result only', measure: 'Measured value', tyre_date: 'Tyre DOT date codes', compression: 'Compression per cylinder (kPa)' };

type Draft = { name: string; description: string; items: Array<TemplateItemInput & { min: number | null; max: number | null }> };

const toDraft = (t: ChecklistTemplate | null): Draft => ({
  name: t?.name ?? '',
  description: t?.description ?? '',
  items: (t?.items ?? [{ key: 'item-1', section: 'General', label: '', guidance: null, kind: 'check', safety: false, cautions: [], unit: null, min: null, max: null, outsideFails: false }]).map((i) => ({ ...i })),
});

/** A fresh key for a new item, unique in the draft (results are stored against keys). */
function newKey(items: Draft['items']): string {
  let n = items.length + 1;
  while (items.some((i) => i.key === `item-${n}`)) n++;
  return `item-${n}`;
}

/**
 * Edits one template (or a new one): its items in order, each with a section, a label, the kind
 * of reading, whether it is safety-critical and an expected range. Checklists already started
 * keep the items they started with.
 */
export function TemplateEditor({ shopId, template, onDone }: { shopId: string; template: ChecklistTemplate | null; onDone: () => void }) {
  const queryClient = useQueryClient();
  const toast = useToast();
  const [draft, setDraft] = useState<Draft>(() => toDraft(template));
  const [error, setError] = useState<string | null>(null);
  const save = useMutation({
    mutationFn: (body: Draft) =>
      template
        ? api.patch(`/shops/${encodeURIComponent(shopId)}/checklist-templates/${encodeURIComponent(template.id)}`, body, { schema: templateSchema })
        : api.post(`/shops/${encodeURIComponent(shopId)}/checklist-templates`, body, { schema: templateSchema }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: shopQueryKey(shopId, 'checklist-templates') }),
  });
  const setItem = (index: number, patch: Partial<Draft['items'][number]>) => setDraft((d) => ({ ...d, items: d.items.map((i, j) => (j === index ? { ...i, ...patch } : i)) }));
  const moveItem = (index: number, by: number) =>
    setDraft((d) => {
      const items = [...d.items];
      const [it] = items.splice(index, 1);
      if (it) items.splice(Math.max(0, Math.min(items.length, index + by)), 0, it);
      return { ...d, items };
    });

  const submit = async () => {
    const checked = templateInputSchema.safeParse(draft);
    if (!checked.success) {
      const issue = checked.error.issues[0];
      const where = issue?.path[0] === 'items' && typeof issue.path[1] === 'number' ? `Item ${issue.path[1] + 1}: ` : '';
      setError(`${where}${issue?.message ?? 'Check the template.'}`);
      return;
    }
    try {
      await save.mutateAsync(draft);
      toast.show(`Template “${draft.name}” saved.`);
      onDone();
    } catch (e) {
      setError(e instanceof ApiError ? errorMessage(e) : errorMessage(e));
    }
  };

  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      onSubmit={(e) => {
        e.preventDefault();
        void submit();
      }}
    >
      {error && <FormMessage>{error}</FormMessage>}
      <TextField label="Template name" value={draft.name} onChange={(e) => setDraft({ ...draft, name: e.target.value })} />
      <TextField label="Description" value={draft.description} onChange={(e) => setDraft({ ...draft, description: e.target.value })} />
      <ol className="flex flex-col gap-3">
        {draft.items.map((item, i) => (
          <li key={item.key} className="rounded-md border-2 border-line p-3">
            <fieldset className="grid gap-2 md:grid-cols-2">
              <legend className="mb-1 font-bold">Item {i + 1}</legend>
              <TextField label={`Item ${i + 1} section`} value={item.section} onChange={(e) => setItem(i, { section: e.target.value })} />
              <TextField label={`Item ${i + 1} label`} value={item.label} onChange={(e) => setItem(i, { label: e.target.value })} />
              <Select label={`Item ${i + 1} kind`} value={item.kind} onChange={(e) => setItem(i, { kind: e.target.value as ItemKind, unit: e.target.value === 'compression' ? 'kPa' : e.target.value === 'measure' ? (item.unit ?? 'mm') : null })} options={itemKinds.map((k) => ({ value: k, label: kindWords[k] }))} />
              {item.kind === 'measure' && <TextField label={`Item ${i + 1} unit`} value={item.unit ?? ''} onChange={(e) => setItem(i, { unit: e.target.value || null })} hint="mm, in, kPa, psi, bar, N_m …" />}
              {(item.kind === 'measure' || item.kind === 'compression') && (
                <>
                  <TextField label={`Item ${i + 1} lowest expected`} inputMode="decimal" value={item.min ?? ''} onChange={(e) => setItem(i, { min: e.target.value === '' ? null : Number(e.target.value) })} />
                  <TextField label={`Item ${i + 1} highest expected`} inputMode="decimal" value={item.max ?? ''} onChange={(e) => setItem(i, { max: e.target.value === '' ? null : Number(e.target.value) })} />
                </>
              )}
              <label className="flex min-h-touch items-center gap-2">
                <input type="checkbox" className="h-5 w-5" checked={item.safety} onChange={(e) => setItem(i, { safety: e.target.checked })} />
                Safety-critical (blocks hand-over when failed or not recorded)
              </label>
            </fieldset>
            <div className="mt-2 flex flex-wrap gap-2">
              <Button variant="ghost" size="sm" onClick={() => moveItem(i, -1)} disabled={i === 0} aria-label={`Move item ${i + 1} up`}>
                Up
              </Button>
              <Button variant="ghost" size="sm" onClick={() => moveItem(i, 1)} disabled={i === draft.items.length - 1} aria-label={`Move item ${i + 1} down`}>
                Down
              </Button>
              <Button variant="ghost" size="sm" onClick={() => setDraft((d) => ({ ...d, items: d.items.filter((_, j) => j !== i) }))} disabled={draft.items.length === 1} aria-label={`Remove item ${i + 1}`}>
                Remove
              </Button>
            </div>
          </li>
        ))}
      </ol>
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" onClick={() => setDraft((d) => ({ ...d, items: [...d.items, { key: newKey(d.items), section: d.items.at(-1)?.section ?? 'General', label: '', guidance: null, kind: 'check', safety: false, cautions: [], unit: null, min: null, max: null, outsideFails: false }] }))}>
          Add item
        </Button>
        <Button type="submit" loading={save.isPending}>
          Save template
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
