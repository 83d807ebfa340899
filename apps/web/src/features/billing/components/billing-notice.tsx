import { Button, buttonClasses, IconAdvise, IconFail } from '@tappet/ui';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { Link } from 'react-router-dom';
import { meQueryKey, useMe } from '../../../lib/auth';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { useCan } from '../../../lib/ability';
import { useBillingStatus } from '../api/get-billing-status';
import { useOpenPortal } from '../api/hosted-pages';
import { formatDate } from './words';

/**
 * Shown above every shop screen: a banner while payment is overdue (with the way to pay) and a
 * notice while the shop is read-only (with the reason). Nothing in any other state.
 */
export function BillingNotice({ shopId }: { shopId: string }) {
  const status = useBillingStatus(shopId);
  const isOwner = useCan('update', 'Billing', { shopId });
  const portal = useOpenPortal(shopId);
  const data = status.data;
  const queryClient = useQueryClient();
  const me = useMe();
  const knownReadOnly = me?.memberships.find((m) => m.shopId === shopId)?.readOnly ?? false;
  // The state changed since /api/me was read (a payment, a suspension): refresh what the app hides.
  useEffect(() => {
    if (data && data.readOnly !== knownReadOnly) void queryClient.invalidateQueries({ queryKey: meQueryKey });
  }, [data, knownReadOnly, queryClient]);
  if (!data || (data.state !== 'past_due' && !data.readOnly)) return null;

  if (data.readOnly) {
    return (
      <section aria-label="Read-only shop" className="mb-5 flex flex-wrap items-start gap-3 rounded-md border-2 border-fail bg-fail-soft p-4 text-ink">
        <IconFail className="mt-0.5 shrink-0 text-fail" />
        <div className="flex min-w-0 flex-1 flex-col gap-2">
          <h2 className="font-bold">This shop is read-only</h2>
          <p className="max-w-prose">{data.readOnlyReason}</p>
          <p className="max-w-prose text-sm">You can still look everything up and download the shop export.</p>
        </div>
        {isOwner && !data.suspendedByHand && (
          <Link to={paths.shop.billing.getHref(shopId)} className={buttonClasses('primary')}>
            Go to Billing
          </Link>
        )}
      </section>
    );
  }

  return (
    <section aria-label="Payment overdue" className="mb-5 flex flex-wrap items-start gap-3 rounded-md border-2 border-advise bg-advise-soft p-4 text-ink">
      <IconAdvise className="mt-0.5 shrink-0 text-advise" />
      <div className="flex min-w-0 flex-1 flex-col gap-1">
        <h2 className="font-bold">Payment overdue</h2>
        <p className="max-w-prose">
          {data.pastDueSince ? <>The subscription has been unpaid since {formatDate(data.pastDueSince)}. </> : null}
          {data.suspendsAt ? <>Unless it is paid by {formatDate(data.suspendsAt)}, the shop becomes read-only. Nothing is deleted.</> : null}
        </p>
        {!isOwner && <p className="text-sm">Ask the shop’s owner to update the payment.</p>}
        {portal.isError && (
          <p role="alert" className="font-bold text-fail">
            {errorMessage(portal.error)}
          </p>
        )}
      </div>
      {isOwner &&
        (data.canOpenPortal ? (
          <Button onClick={() => portal.mutate()} loading={portal.isPending}>
            Pay in the billing portal
          </Button>
        ) : (
          // A trial that ended without a card has nothing to pay in the portal yet: subscribe instead.
          <Link to={paths.shop.billing.getHref(shopId)} className={buttonClasses('primary')}>
            Choose a plan
          </Link>
        ))}
    </section>
  );
}
