import type { BillingOverview, PlanView } from '@tappet/contracts';
import { Button, ErrorState, FormMessage, IconOk, LoadingState, StatusPill } from '@tappet/ui';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { useBilling } from '../api/get-billing';
import { useOpenPortal, useStartCheckout } from '../api/hosted-pages';
import { billingPill, formatDate, formatPrice, limitText } from './words';

function Usage({ label, used, limit, one, many }: { label: string; used: number | null; limit: number | null; one: string; many: string }) {
  const over = used !== null && limit !== null && used >= limit;
  return (
    <div className="flex flex-col gap-0.5">
      <dt className="text-sm text-ink-muted">{label}</dt>
      <dd className="font-mono text-num tabular-nums">
        {used === null ? limitText(limit, one, many) : `${used.toLocaleString()} of ${limit === null ? 'no limit' : limit.toLocaleString()}`}
        {over && <span className="ml-2 font-sans text-sm font-bold text-advise">Limit reached</span>}
      </dd>
    </div>
  );
}

function StatusSection({ data }: { data: BillingOverview }) {
  const { status, plan, subscription } = data;
  const pill = billingPill[status.state];
  return (
    <section aria-labelledby="billing-status" className="flex flex-col gap-3 rounded-md border-2 border-line bg-surface p-4">
      <div className="flex flex-wrap items-center gap-3">
        <h2 id="billing-status" className="text-lg font-bold">
          {plan ? plan.name : 'No plan chosen'}
        </h2>
        <StatusPill status={pill.status} label={pill.label} />
        {plan && <span className="text-ink-muted">{formatPrice(plan.monthlyPriceMinor, plan.currency)} a month</span>}
      </div>
      {status.state === 'trial' && status.trialDaysLeft !== null && status.trialEndsAt && (
        <p data-testid="trial-days">
          <span className="font-bold">
            {status.trialDaysLeft} {status.trialDaysLeft === 1 ? 'day' : 'days'} left
          </span>{' '}
          in the free trial (until {formatDate(status.trialEndsAt)}). No card is needed until you subscribe.
        </p>
      )}
      {status.state === 'active' && subscription.currentPeriodEnd && (
        <p>
          {subscription.cancelAtPeriodEnd ? 'Cancelled: it ends on ' : 'Renews on '}
          {formatDate(subscription.currentPeriodEnd)}.
        </p>
      )}
      {status.state === 'past_due' && status.suspendsAt && <p>Payment is overdue. Unless it is paid by {formatDate(status.suspendsAt)}, the shop becomes read-only.</p>}
      {status.readOnly && <p className="font-bold">{status.readOnlyReason}</p>}
      <dl className="grid grid-cols-1 gap-3 sm:grid-cols-3">
        <Usage label="Seats (members and open invitations)" used={data.usage.seats.used} limit={data.usage.seats.limit} one="seat" many="seats" />
        <Usage label="Parts in the catalogue" used={data.usage.catalogue.used} limit={data.usage.catalogue.limit} one="part" many="parts" />
        <Usage label="Vehicles" used={data.usage.vehicles.used} limit={data.usage.vehicles.limit} one="vehicle" many="vehicles" />
      </dl>
    </section>
  );
}

function PlanChoice({ plans, current, onChoose, pending, error }: { plans: PlanView[]; current: string | null; onChoose: (planId: string) => void; pending: boolean; error: string | null }) {
  const [chosen, setChosen] = useState<string>(current ?? plans[0]?.id ?? '');
  if (plans.length === 0) return <p>No plans are offered at the moment. Contact Tappet support.</p>;
  return (
    <section aria-labelledby="choose-plan" className="flex flex-col gap-3">
      <h2 id="choose-plan" className="text-lg font-bold">
        Subscribe
      </h2>
      <p className="max-w-prose text-ink-muted">Choose a plan and pay by card on Stripe’s secure checkout page. Writing is restored as soon as the payment goes through.</p>
      {error && <FormMessage>{error}</FormMessage>}
      <form
        className="flex flex-col gap-3"
        onSubmit={(e) => {
          e.preventDefault();
          if (chosen) onChoose(chosen);
        }}
      >
        <fieldset className="grid grid-cols-1 gap-3 md:grid-cols-3">
          <legend className="sr-only">Plan</legend>
          {plans.map((p) => (
            <label
              key={p.id}
              className="flex cursor-pointer flex-col gap-1 rounded-md border-2 border-line bg-surface p-4 has-[:checked]:border-accent has-[:checked]:bg-accent-soft has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-accent"
            >
              <span className="flex items-center gap-2">
                <input type="radio" name="planId" value={p.id} checked={chosen === p.id} onChange={() => setChosen(p.id)} className="size-5" />
                <span className="font-bold">{p.name}</span>
                {p.id === current && <span className="text-sm text-ink-muted">(current plan)</span>}
              </span>
              <span className="font-mono text-num tabular-nums">{formatPrice(p.monthlyPriceMinor, p.currency)} a month</span>
              <span className="text-sm">{limitText(p.seatLimit, 'seat', 'seats')}</span>
              <span className="text-sm">{limitText(p.catalogueLimit, 'part', 'parts')}</span>
              <span className="text-sm">{limitText(p.vehicleLimit, 'vehicle', 'vehicles')}</span>
            </label>
          ))}
        </fieldset>
        <div>
          <Button type="submit" loading={pending}>
            Subscribe with Stripe Checkout
          </Button>
        </div>
      </form>
    </section>
  );
}

/** The owner's billing page: plan, state, trial, usage; subscribe through Checkout or manage in the portal. */
export function BillingScreen({ shopId, returned }: { shopId: string; returned: 'done' | 'cancelled' | null }) {
  const billing = useBilling(shopId);
  const checkout = useStartCheckout(shopId);
  const portal = useOpenPortal(shopId);

  if (billing.isPending) return <LoadingState label="Loading billing…" />;
  if (billing.isError) return <ErrorState message={errorMessage(billing.error)} onRetry={() => void billing.refetch()} />;
  const data = billing.data;

  return (
    <div className="flex flex-col gap-6">
      {returned === 'done' && (
        <p role="status" className="flex max-w-prose items-center gap-2 rounded-md border-2 border-ok bg-ok-soft p-3 font-bold">
          <IconOk className="shrink-0 text-ok" />
          {data.status.state === 'active' ? 'Thank you: the payment went through and the subscription is active.' : 'Thank you: the payment is being confirmed. This page updates when Stripe tells us.'}
        </p>
      )}
      {returned === 'cancelled' && (
        <p role="status" className="max-w-prose rounded-md border-2 border-line-strong bg-sunk p-3">
          Checkout was cancelled. Nothing was charged.
        </p>
      )}
      <StatusSection data={data} />
      {data.subscription.canOpenPortal && (
        <section aria-labelledby="manage" className="flex flex-col gap-2">
          <h2 id="manage" className="text-lg font-bold">
            Card, plan and cancellation
          </h2>
          <p className="max-w-prose text-ink-muted">Stripe’s billing portal shows your invoices and lets you change the card, switch plan or cancel.</p>
          {portal.isError && <FormMessage>{errorMessage(portal.error)}</FormMessage>}
          <div>
            <Button variant={data.subscription.subscribed ? 'primary' : 'secondary'} onClick={() => portal.mutate()} loading={portal.isPending}>
              Manage in the billing portal
            </Button>
          </div>
        </section>
      )}
      {!data.subscription.subscribed && (
        <PlanChoice plans={data.plans} current={data.plan?.id ?? null} onChoose={(id) => checkout.mutate(id)} pending={checkout.isPending} error={checkout.isError ? errorMessage(checkout.error) : null} />
      )}
      <p className="text-ink-muted">
        Need help from Tappet? <Link to={paths.shop.supportAccess.getHref(shopId)}>Grant support access</Link> for a limited time.
      </p>
    </div>
  );
}
