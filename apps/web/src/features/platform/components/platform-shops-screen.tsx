import { billingStates, onboardShopRequestSchema, shopStateChangeRequestSchema, type BillingStateName, type PlanView, type PlatformShop, type PlatformShopListQuery } from '@tappet/contracts';
import { Button, createColumnHelper, DataTable, Dialog, EmptyState, ErrorState, FormMessage, LoadingState, Select, StatusPill, TextField, useToast } from '@tappet/ui';
import { useMemo, useRef, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { formValues, useFormErrors } from '../../../lib/forms';
import { billingPill, formatDate, formatPrice } from '../../billing/components/words';
import { useChangeShopState, useOnboardShop, usePlatformShops } from '../api/platform-api';
import { formatDateTime } from '../../../lib/dates';

const column = createColumnHelper<PlatformShop>();
const usage = (used: number, limit: number | null) => `${used.toLocaleString()} / ${limit === null ? '∞' : limit.toLocaleString()}`;

function OnboardDialog({ open, onClose, plans }: { open: boolean; onClose: () => void; plans: PlanView[] }) {
  const formRef = useRef<HTMLFormElement>(null);
  const errors = useFormErrors(formRef);
  const onboard = useOnboardShop();
  const toast = useToast();
  const active = plans.filter((p) => p.isActive);

  function close() {
    errors.clear();
    onboard.reset();
    onClose();
  }

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const parsed = onboardShopRequestSchema.safeParse(formValues(e.currentTarget));
    if (!parsed.success) return errors.failValidation(parsed.error);
    onboard.mutate(parsed.data, {
      onSuccess: (shop) => {
        toast.show(`${shop.name} is on its 14-day trial. The invitation went to ${parsed.data.ownerEmail}.`, 'ok');
        close();
      },
      onError: (err) => errors.failApi(err, ['name', 'planId', 'ownerEmail']),
    });
  }

  return (
    <Dialog open={open} onClose={close} title="Onboard a shop" description="Creates the shop on a 14-day trial (no card needed) and e-mails its owner an invitation.">
      <form ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
        <TextField label="Shop name" name="name" autoComplete="organization" error={errors.fieldErrors['name']} />
        <Select
          label="Plan"
          name="planId"
          placeholder="Choose a plan"
          options={active.map((p) => ({ value: p.id, label: `${p.name} (${formatPrice(p.monthlyPriceMinor, p.currency)} a month)` }))}
          error={errors.fieldErrors['planId'] ? 'Choose a plan.' : undefined}
        />
        <TextField label="Owner’s e-mail address" name="ownerEmail" type="email" autoComplete="off" hint="The invitation link works for 7 days." error={errors.fieldErrors['ownerEmail']} />
        <div className="flex flex-wrap justify-end gap-2 border-t border-line pt-4">
          <Button type="button" variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" loading={onboard.isPending}>
            Create shop and invite owner
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

function StateChangeDialog({ target, onClose }: { target: { shop: PlatformShop; to: 'suspend' | 'reactivate' } | null; onClose: () => void }) {
  const formRef = useRef<HTMLFormElement>(null);
  const errors = useFormErrors(formRef);
  const change = useChangeShopState();
  const toast = useToast();
  const suspending = target?.to === 'suspend';

  function close() {
    errors.clear();
    change.reset();
    onClose();
  }

  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    if (!target) return;
    const parsed = shopStateChangeRequestSchema.safeParse(formValues(e.currentTarget));
    if (!parsed.success) return errors.failValidation(parsed.error);
    change.mutate(
      { shopId: target.shop.id, to: target.to, reason: parsed.data.reason },
      {
        onSuccess: () => {
          toast.show(suspending ? `${target.shop.name} is suspended and read-only.` : `${target.shop.name} is reactivated.`, 'ok');
          close();
        },
        onError: (err) => errors.failApi(err, ['reason']),
      },
    );
  }

  return (
    <Dialog
      open={target !== null}
      onClose={close}
      title={suspending ? `Suspend ${target?.shop.name ?? ''}?` : `Reactivate ${target?.shop.name ?? ''}?`}
      description={
        suspending
          ? 'The shop becomes read-only at once: its people can still look things up and export, but change nothing. Nothing is deleted. The reason is shown to them and kept in the audit log.'
          : 'The hand suspension is lifted; the shop’s state follows its subscription again. The reason is kept in the audit log.'
      }
    >
      <form ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
        <TextField label="Reason" name="reason" error={errors.fieldErrors['reason']} />
        <div className="flex flex-wrap justify-end gap-2 border-t border-line pt-4">
          <Button type="button" variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" variant={suspending ? 'danger' : 'primary'} loading={change.isPending}>
            {suspending ? 'Suspend shop' : 'Reactivate shop'}
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

/** The platform console's shops: plan, state, usage and activity; search, filter, onboard, suspend. */
export function PlatformShopsScreen() {
  const [query, setQuery] = useState<PlatformShopListQuery>({});
  const shops = usePlatformShops(query);
  const [onboarding, setOnboarding] = useState(false);
  const [changing, setChanging] = useState<{ shop: PlatformShop; to: 'suspend' | 'reactivate' } | null>(null);
  const plans = shops.data?.plans ?? [];

  const columns = useMemo(
    () => [
      column.accessor('name', {
        header: 'Shop',
        cell: (info) => (
          <span className="flex flex-col">
            <span className="font-bold">{info.getValue()}</span>
            <span className="text-sm text-ink-muted">{info.row.original.slug}</span>
          </span>
        ),
      }),
      column.accessor((s) => s.plan?.name ?? '', { id: 'plan', header: 'Plan', cell: (info) => info.getValue() || <span className="text-ink-muted">None</span> }),
      column.accessor('billingState', {
        header: 'State',
        cell: (info) => {
          const s = info.row.original;
          const pill = billingPill[s.billingState];
          return (
            <span className="flex flex-col items-start gap-1">
              <StatusPill status={pill.status} label={pill.label} />
              {s.manualSuspensionReason && <span className="text-sm">By hand: {s.manualSuspensionReason}</span>}
              {s.trialEndsAt && <span className="text-sm text-ink-muted">Trial until {formatDate(s.trialEndsAt)}</span>}
            </span>
          );
        },
      }),
      column.accessor('seatsUsed', { header: 'Seats', meta: { numeric: true }, cell: (info) => <span className="font-mono whitespace-nowrap tabular-nums">{usage(info.getValue(), info.row.original.seatLimit)}</span> }),
      column.accessor('catalogueSize', { header: 'Parts', meta: { numeric: true }, cell: (info) => <span className="font-mono whitespace-nowrap tabular-nums">{usage(info.getValue(), info.row.original.catalogueLimit)}</span> }),
      column.accessor('lastActivityAt', {
        header: 'Last activity',
        sortUndefined: 'last',
        cell: (info) => {
          const v = info.getValue();
          return v ? <time dateTime={v}>{formatDateTime((v))}</time> : <span className="text-ink-muted">None yet</span>;
        },
      }),
      column.accessor('supportAccessUntil', {
        header: 'Support access',
        cell: (info) => {
          const v = info.getValue();
          if (!v) return <span className="text-ink-muted">Not granted</span>;
          // Granted by the shop's owner: open the shop (every look and change is shown to them).
          return (
            <span className="flex flex-col items-start gap-1">
              <span>Until {formatDateTime((v))}</span>
              <Link className="font-bold underline underline-offset-2" to={paths.shop.home.getHref(info.row.original.id)}>
                Open {info.row.original.name}
              </Link>
            </span>
          );
        },
      }),
      column.display({
        id: 'actions',
        header: () => <span className="sr-only">Actions</span>,
        cell: (info) => {
          const s = info.row.original;
          return s.manualSuspensionReason ? (
            <Button size="sm" variant="secondary" aria-label={`Reactivate ${s.name}`} onClick={() => setChanging({ shop: s, to: 'reactivate' })}>
              Reactivate
            </Button>
          ) : (
            <Button size="sm" variant="secondary" aria-label={`Suspend ${s.name}`} onClick={() => setChanging({ shop: s, to: 'suspend' })}>
              Suspend
            </Button>
          );
        },
      }),
    ],
    [],
  );

  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-wrap items-end justify-between gap-4">
        <form
          role="search"
          aria-label="Find shops"
          className="flex flex-wrap items-end gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            const v = formValues(e.currentTarget);
            setQuery({ q: v['q'] || undefined, state: (v['state'] || undefined) as BillingStateName | undefined, planId: v['planId'] || undefined });
          }}
        >
          <TextField label="Search" name="q" type="search" hint="Name or web name" fieldClassName="w-64" />
          <Select label="State" name="state" placeholder="Any state" options={billingStates.map((s) => ({ value: s, label: billingPill[s].label }))} />
          <Select label="Plan" name="planId" placeholder="Any plan" options={plans.map((p) => ({ value: p.id, label: p.name }))} />
          <Button type="submit" variant="secondary">
            Show shops
          </Button>
        </form>
        <Button onClick={() => setOnboarding(true)}>Onboard a shop</Button>
      </div>
      {shops.isPending ? (
        <LoadingState label="Loading shops…" />
      ) : shops.isError ? (
        <ErrorState message={errorMessage(shops.error)} onRetry={() => void shops.refetch()} />
      ) : (
        <DataTable
          caption="Shops"
          columns={columns}
          data={shops.data.shops}
          getRowId={(s) => s.id}
          initialSorting={[{ id: 'name', desc: false }]}
          empty={
            <EmptyState title={Object.values(query).some(Boolean) ? 'No shop matches' : 'No shops yet'} action={<Button variant="secondary" onClick={() => setOnboarding(true)}>Onboard a shop</Button>}>
              {Object.values(query).some(Boolean) ? 'Try another name, or clear the filters.' : 'Onboard the first shop: it starts on a 14-day trial.'}
            </EmptyState>
          }
        />
      )}
      <p className="max-w-prose text-sm text-ink-muted">
        Shop data stays private: you can open a shop only while its owner grants support access, and everything you do there is shown to the owner.
      </p>
      <OnboardDialog open={onboarding} onClose={() => setOnboarding(false)} plans={plans} />
      <StateChangeDialog target={changing} onClose={() => setChanging(null)} />
    </div>
  );
}
