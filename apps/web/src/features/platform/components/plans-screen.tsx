import { createPlanRequestSchema, updatePlanRequestSchema, type PlanView } from '@tappet/contracts';
import { Button, createColumnHelper, DataTable, Dialog, EmptyState, ErrorState, FormMessage, LoadingState, StatusPill, TextField, useToast } from '@tappet/ui';
import { useMemo, useRef, useState, type FormEvent } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { formValues, useFormErrors } from '../../../lib/forms';
import { formatPrice, limitText } from '../../billing/components/words';
import { useCreatePlan, usePlatformPlans, useUpdatePlan } from '../api/platform-api';

const column = createColumnHelper<PlanView>();
const fields = ['name', 'monthlyPriceMinor', 'currency', 'stripeLookupKey', 'seatLimit', 'catalogueLimit', 'vehicleLimit'] as const;

/** Form text to the API's shape: a price in major units to minor units, empty limits to "no limit". */
function planInput(values: Record<string, string>) {
  const limit = (v: string | undefined) => (v === undefined || v.trim() === '' ? null : Number(v));
  const price = values['monthlyPrice']?.trim() ?? '';
  return {
    name: values['name'] ?? '',
    monthlyPriceMinor: price === '' ? undefined : Math.round(Number(price) * 100),
    currency: values['currency'] ?? '',
    stripeLookupKey: values['stripeLookupKey'] ?? '',
    seatLimit: limit(values['seatLimit']),
    catalogueLimit: limit(values['catalogueLimit']),
    vehicleLimit: limit(values['vehicleLimit']),
  };
}

function PlanDialog({ plan, open, onClose }: { plan: PlanView | null; open: boolean; onClose: () => void }) {
  const formRef = useRef<HTMLFormElement>(null);
  const errors = useFormErrors(formRef);
  const create = useCreatePlan();
  const update = useUpdatePlan();
  const toast = useToast();
  const pending = create.isPending || update.isPending;

  function close() {
    errors.clear();
    create.reset();
    update.reset();
    onClose();
  }

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const input = planInput(formValues(e.currentTarget));
    const onError = (err: unknown) => errors.failApi(err, fields);
    if (plan) {
      const parsed = updatePlanRequestSchema.safeParse(input);
      if (!parsed.success) return errors.failValidation(parsed.error);
      update.mutate({ planId: plan.id, patch: parsed.data }, { onSuccess: (p) => (toast.show(`${p.name} is saved.`, 'ok'), close()), onError });
    } else {
      const parsed = createPlanRequestSchema.safeParse(input);
      if (!parsed.success) return errors.failValidation(parsed.error);
      create.mutate(parsed.data, { onSuccess: (p) => (toast.show(`${p.name} is offered from now on.`, 'ok'), close()), onError });
    }
  }

  const fe = errors.fieldErrors;
  return (
    <Dialog open={open} onClose={close} title={plan ? `Change ${plan.name}` : 'Add a plan'} description="Leave a limit empty for no limit. Stripe’s price is found by the lookup key; a new price is made there when the amount changes.">
      <form ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-4" key={plan?.id ?? 'new'}>
        {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
        <TextField label="Name" name="name" defaultValue={plan?.name} error={fe['name']} />
        <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
          <TextField label="Monthly price" name="monthlyPrice" inputMode="decimal" defaultValue={plan ? (plan.monthlyPriceMinor / 100).toFixed(2) : ''} hint="e.g. 49.00" error={fe['monthlyPriceMinor']} />
          <TextField label="Currency" name="currency" defaultValue={plan?.currency.toUpperCase() ?? 'GBP'} hint="Three letters, e.g. GBP" error={fe['currency']} />
        </div>
        <TextField label="Stripe lookup key" name="stripeLookupKey" defaultValue={plan?.stripeLookupKey} hint="e.g. tappet_workbench_monthly" className="font-mono" error={fe['stripeLookupKey']} />
        <div className="grid grid-cols-1 gap-4 sm:grid-cols-3">
          <TextField label="Seats" name="seatLimit" inputMode="numeric" defaultValue={plan?.seatLimit ?? ''} error={fe['seatLimit']} />
          <TextField label="Parts" name="catalogueLimit" inputMode="numeric" defaultValue={plan?.catalogueLimit ?? ''} error={fe['catalogueLimit']} />
          <TextField label="Vehicles" name="vehicleLimit" inputMode="numeric" defaultValue={plan?.vehicleLimit ?? ''} error={fe['vehicleLimit']} />
        </div>
        <div className="flex flex-wrap justify-end gap-2 border-t border-line pt-4">
          <Button type="button" variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" loading={pending}>
            {plan ? 'Save plan' : 'Add plan'}
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

/** Plans (platform admins): names, prices, limits and Stripe lookup keys; add, change, retire. */
export function PlansScreen() {
  const plans = usePlatformPlans();
  const update = useUpdatePlan();
  const toast = useToast();
  const [editing, setEditing] = useState<PlanView | 'new' | null>(null);
  const columns = useMemo(
    () => [
      column.accessor('name', { header: 'Plan', cell: (info) => <span className="font-bold">{info.getValue()}</span> }),
      column.accessor('monthlyPriceMinor', { header: 'A month', meta: { numeric: true }, cell: (info) => <span className="font-mono tabular-nums">{formatPrice(info.getValue(), info.row.original.currency)}</span> }),
      column.accessor('seatLimit', { header: 'Seats', cell: (info) => limitText(info.getValue(), 'seat', 'seats') }),
      column.accessor('catalogueLimit', { header: 'Parts', cell: (info) => limitText(info.getValue(), 'part', 'parts') }),
      column.accessor('vehicleLimit', { header: 'Vehicles', cell: (info) => limitText(info.getValue(), 'vehicle', 'vehicles') }),
      column.accessor('stripeLookupKey', { header: 'Stripe lookup key', cell: (info) => <span className="font-mono text-sm break-all">{info.getValue()}</span> }),
      column.accessor((p) => (p.isActive ? 'Offered' : 'Retired'), { id: 'status', header: 'Status', cell: (info) => (info.row.original.isActive ? <StatusPill status="ok" label="Offered" /> : <StatusPill status="na" label="Retired" />) }),
      column.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        cell: (info) => {
          const p = info.row.original;
          return (
            <span className="flex flex-col items-start gap-1">
              <Button size="sm" variant="secondary" aria-label={`Change ${p.name}`} onClick={() => setEditing(p)}>
                Change
              </Button>
              <Button
                size="sm"
                variant="ghost"
                aria-label={p.isActive ? `Retire ${p.name}` : `Offer ${p.name} again`}
                onClick={() =>
                  update.mutate(
                    { planId: p.id, patch: { isActive: !p.isActive } },
                    { onSuccess: () => toast.show(p.isActive ? `${p.name} is no longer offered; shops on it keep it.` : `${p.name} is offered again.`, 'ok'), onError: (err) => toast.show(errorMessage(err), 'fail') },
                  )
                }
              >
                {p.isActive ? 'Retire' : 'Offer again'}
              </Button>
            </span>
          );
        },
      }),
    ],
    [update, toast],
  );

  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-wrap items-center justify-between gap-4">
        <p className="max-w-prose text-ink-muted">What shops can subscribe to. Retiring a plan stops new subscriptions to it; shops already on it keep it.</p>
        <Button onClick={() => setEditing('new')}>Add a plan</Button>
      </div>
      {plans.isPending ? (
        <LoadingState label="Loading plans…" />
      ) : plans.isError ? (
        <ErrorState message={errorMessage(plans.error)} onRetry={() => void plans.refetch()} />
      ) : (
        <DataTable
          caption="Plans"
          columns={columns}
          data={plans.data.plans}
          getRowId={(p) => p.id}
          empty={<EmptyState title="No plans yet" action={<Button variant="secondary" onClick={() => setEditing('new')}>Add a plan</Button>}>Add the first plan before onboarding shops.</EmptyState>}
        />
      )}
      <PlanDialog plan={editing === 'new' ? null : editing} open={editing !== null} onClose={() => setEditing(null)} />
    </div>
  );
}
