import { Button, ErrorState, FormMessage, LoadingState, Num, Panel, Select, TextField, useToast } from '@tappet/ui';
import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { useCan } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { setPartPurchasing, usePartPurchasing } from '../api/get-part-purchasing';
import { usePurchasingMutation } from '../api/purchasing-mutation';
import { money } from './words';

/** A whole number typed in a field, null when blank, NaN when not a whole number. */
const wholeOrNull = (raw: string) => (raw.trim() === '' ? null : /^\d+$/.test(raw.trim()) ? Number(raw.trim()) : Number.NaN);

/**
 * Buying a part, for its catalogue page: the preferred supplier, the last price paid and when, the
 * minimum and maximum set by hand, and who lists it. Owners and buyers change the choices here.
 */
export function PartPurchasingPanel({ shopId, partId }: { shopId: string; partId: string }) {
  const view = usePartPurchasing(shopId, partId);
  const canUpdate = useCan('update', 'Supplier', { shopId });
  const save = usePurchasingMutation(shopId, setPartPurchasing);
  const toast = useToast();
  const [editing, setEditing] = useState(false);
  const [errors, setErrors] = useState<Record<string, string>>({});

  if (view.isPending) return <LoadingState label="Loading purchasing…" />;
  if (view.isError) return <ErrorState message={errorMessage(view.error)} onRetry={() => void view.refetch()} />;
  const v = view.data;
  const preferred = v.listings.find((l) => l.supplierId === v.preferredSupplierId) ?? null;
  const lastPaid = v.listings.filter((l) => l.lastPaidAt !== null).sort((a, b) => (b.lastPaidAt ?? '').localeCompare(a.lastPaidAt ?? ''))[0] ?? null;

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const f = new FormData(event.currentTarget);
    const body = { preferredSupplierId: String(f.get('preferredSupplierId') ?? '') || null, minQty: wholeOrNull(String(f.get('minQty') ?? '')), maxQty: wholeOrNull(String(f.get('maxQty') ?? '')) };
    const next: Record<string, string> = {};
    if (Number.isNaN(body.minQty)) next['minQty'] = 'Use a whole number, or leave it blank.';
    if (Number.isNaN(body.maxQty)) next['maxQty'] = 'Use a whole number, or leave it blank.';
    if (Object.keys(next).length === 0) {
      // The form's rules load when it is sent: zod stays off the part page until then (decision 029).
      const rules = await import('../api/part-purchasing-form-schema').catch(() => null);
      if (!rules) next['form'] = 'Tappet cannot be reached. Check the connection and try again.';
      const parsed = rules?.partPurchasingSchema.safeParse(body);
      if (parsed && !parsed.success) for (const issue of parsed.error.issues) next[String(issue.path[0] ?? 'form')] = issue.message;
    }
    setErrors(next);
    if (Object.keys(next).length > 0) return;
    save.mutate(
      { partId, body },
      {
        onSuccess: () => {
          toast.show('Purchasing choices saved.', 'ok');
          setEditing(false);
        },
        onError: (e) => setErrors({ form: errorMessage(e) }),
      },
    );
  }

  return (
    <Panel
      title="Buying this part"
      id="part-purchasing-heading"
      className="mt-6"
      actions={
        canUpdate &&
        !editing && (
          <Button
            variant="secondary"
            onClick={() => {
              void import('../api/part-purchasing-form-schema').catch(() => undefined); // ready by the time the form is sent
              setEditing(true);
            }}
          >
            Change buying choices
          </Button>
        )
      }
    >
      <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-[max-content_1fr]">
        <dt className="font-bold">Preferred supplier</dt>
        <dd>{preferred ? preferred.supplierName : v.listings.length > 0 ? 'None chosen: the cheapest listing is used' : 'No supplier lists it yet'}</dd>
        <dt className="font-bold">Last price paid</dt>
        <dd>{lastPaid ? <Num>{`${money(lastPaid.lastPaidUnitMinor, lastPaid.shopCurrency)} to ${lastPaid.supplierName} on ${(lastPaid.lastPaidAt ?? '').slice(0, 10)}`}</Num> : 'Not bought yet'}</dd>
        <dt className="font-bold">Minimum / maximum</dt>
        <dd>{v.minQty === null && v.maxQty === null ? 'Not set: the reorder list works from demand' : `${v.minQty ?? '—'} / ${v.maxQty ?? '—'} (set by hand)`}</dd>
      </dl>
      {editing && (
        <form noValidate onSubmit={(e) => void onSubmit(e)} aria-label="Buying choices" className="grid max-w-xl gap-4 sm:grid-cols-2">
          {errors['form'] && (
            <div className="sm:col-span-2">
              <FormMessage>{errors['form']}</FormMessage>
            </div>
          )}
          <Select
            label="Preferred supplier"
            name="preferredSupplierId"
            defaultValue={v.preferredSupplierId ?? ''}
            fieldClassName="sm:col-span-2"
            error={errors['preferredSupplierId']}
            options={[{ value: '', label: 'None: use the cheapest listing' }, ...v.listings.map((l) => ({ value: l.supplierId, label: `${l.supplierName} (${money(l.priceMinor, l.currency)})` }))]}
          />
          <TextField label="Minimum on hand" name="minQty" inputMode="numeric" defaultValue={v.minQty === null ? '' : String(v.minQty)} error={errors['minQty']} hint="Reorder when free stock falls to this." autoComplete="off" />
          <TextField label="Maximum on hand" name="maxQty" inputMode="numeric" defaultValue={v.maxQty === null ? '' : String(v.maxQty)} error={errors['maxQty']} hint="Order up to this." autoComplete="off" />
          <div className="flex gap-3 sm:col-span-2">
            <Button type="submit" loading={save.isPending}>
              Save choices
            </Button>
            <Button
              variant="secondary"
              onClick={() => {
                setEditing(false);
                setErrors({});
              }}
            >
              Cancel
            </Button>
          </div>
        </form>
      )}
      {v.listings.length > 0 && (
        <div className="-mx-1 overflow-x-auto px-1">
          <table className="w-full">
            <caption className="sr-only">Suppliers listing this part</caption>
            <thead>
              <tr className="border-b-2 border-line text-left">
                <th scope="col" className="py-2">Supplier</th>
                <th scope="col" className="py-2">Their number</th>
                <th scope="col" className="py-2 text-right">Price</th>
                <th scope="col" className="py-2 text-right">Pack</th>
              </tr>
            </thead>
            <tbody>
              {v.listings.map((l) => (
                <tr key={l.id} className="border-b border-line">
                  <td className="py-2">
                    <Link to={paths.shop.purchasingSupplier.getHref(shopId, l.supplierId)} className="text-accent underline underline-offset-4">
                      {l.supplierName}
                    </Link>
                  </td>
                  <td className="py-2 font-mono">{l.supplierNumber ?? '—'}</td>
                  <td className="py-2 text-right">
                    <Num>{money(l.priceMinor, l.currency)}</Num>
                  </td>
                  <td className="py-2 text-right">
                    <Num>{l.packSize}</Num>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </Panel>
  );
}
