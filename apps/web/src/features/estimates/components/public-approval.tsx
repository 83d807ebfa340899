import { useState } from 'react';
import { useMutation, useQuery } from '@tanstack/react-query';
import type { PublicEstimate, PublicEstimateDecision } from '@tappet/contracts';
import { formatMoney } from '@tappet/domain';
import { Button, ErrorState, FormField, LoadingState, TextField, inputClasses } from '@tappet/ui';
import { ApiError, errorMessage } from '../../../lib/api-client';
import { approveEstimate, declineEstimate, viewApproval } from '../api/public-approval';
import { formatDate, formatDateTime } from '../../../lib/dates';

const linkProblem = (error: unknown): string => {
  if (error instanceof ApiError && (error.status === 404 || error.status === 410 || error.status === 400)) return error.message;
  return errorMessage(error);
};

/**
 * The customer's page for an e-mailed estimate: no account, no app around it, readable on a
 * phone. Shows every line, the tax and the total, and lets them approve (typing their name) or
 * decline with a reason. The token comes from the link's fragment and is never put in a URL path.
 */
export function PublicApproval({ token }: { token: string | null }) {
  const view = useQuery({ queryKey: ['estimate-approval', token], queryFn: () => viewApproval(token ?? ''), enabled: Boolean(token), retry: false, staleTime: Infinity });
  const [decision, setDecision] = useState<PublicEstimateDecision | null>(null);

  if (!token) return <ErrorState title="This link is not complete" message="Open the link from the e-mail exactly as it was sent, or ask the shop to send the estimate again." />;
  if (decision) return <Decided decision={decision} currency={view.data?.currency ?? 'GBP'} />;
  if (view.isPending) return <LoadingState label="Loading the estimate…" />;
  if (view.isError) return <ErrorState title="This estimate cannot be opened" message={linkProblem(view.error)} />;
  return <EstimateForCustomer token={token} estimate={view.data} onDecided={setDecision} />;
}

function Decided({ decision, currency }: { decision: PublicEstimateDecision; currency: string }) {
  return (
    <div role="status" className="grid gap-2 rounded-lg border-2 border-ok bg-ok-soft p-4">
      <p className="text-lg font-bold">{decision.status === 'approved' ? 'Thank you: the estimate is approved.' : 'Thank you: the shop knows you declined the estimate.'}</p>
      <p>
        Estimate {decision.reference}
        {decision.approvedAmountMinor !== null && <> · approved amount {formatMoney(decision.approvedAmountMinor, currency)} including tax</>} · {formatDateTime(decision.decidedAt)}
      </p>
      <p>The shop will be in touch. Work beyond this amount needs your approval again.</p>
    </div>
  );
}

function EstimateForCustomer({ token, estimate: e, onDecided }: { token: string; estimate: PublicEstimate; onDecided: (d: PublicEstimateDecision) => void }) {
  const money = (minor: number) => formatMoney(minor, e.currency);
  const [mode, setMode] = useState<'idle' | 'decline'>('idle');
  const [name, setName] = useState(e.customerName ?? '');
  const [reason, setReason] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const approve = useMutation({ mutationFn: approveEstimate, onSuccess: onDecided, onError: (err) => setErrors({ form: linkProblem(err) }) });
  const decline = useMutation({ mutationFn: declineEstimate, onSuccess: onDecided, onError: (err) => setErrors({ form: linkProblem(err) }) });

  return (
    <div className="grid gap-6">
      <header>
        <p className="text-sm font-bold tracking-wide text-ink-muted uppercase">{e.shopName}</p>
        <h1 className="text-xl font-bold">Estimate {e.reference}</h1>
        <p>
          {e.jobTitle} · {e.vehicle}
        </p>
        {e.customerName && <p className="text-ink-muted">For {e.customerName}</p>}
      </header>
      <ul className="grid gap-2" aria-label="Lines">
        {e.lines.map((l, i) => (
          <li key={i} className="flex flex-wrap justify-between gap-x-4 border-b border-line pb-2">
            <span className="min-w-0 flex-1">
              {l.description}
              <span className="block text-sm text-ink-muted">
                {l.kind === 'labour' ? `${l.quantity} h` : `${l.quantity} ×`} {money(l.unitPriceMinor)} · tax {l.taxRatePercent}%
              </span>
            </span>
            <span className="tabular-nums">{money(l.netMinor)}</span>
          </li>
        ))}
      </ul>
      <dl className="grid grid-cols-[1fr_auto] gap-x-4 gap-y-1">
        <dt>Net</dt>
        <dd className="text-right tabular-nums">{money(e.netMinor)}</dd>
        {e.taxByRate.map((r) => (
          <div key={r.ratePercent} className="contents">
            <dt>Tax at {r.ratePercent}&nbsp;%</dt>
            <dd className="text-right tabular-nums">{money(r.taxMinor)}</dd>
          </div>
        ))}
        <dt className="text-lg font-bold">Total including tax</dt>
        <dd className="text-right text-lg font-bold tabular-nums" data-testid="public-total">
          {money(e.grossMinor)}
        </dd>
      </dl>
      {e.note && <p className="rounded-md border-2 border-line p-3">{e.note}</p>}
      <p className="text-sm text-ink-muted">This link works once, until {formatDate(e.expiresAt)}.</p>

      {errors['form'] && (
        <p role="alert" className="font-bold text-fail">
          {errors['form']}
        </p>
      )}
      {mode === 'idle' ? (
        <form
          className="grid gap-3"
          aria-label="Approve the estimate"
          noValidate
          onSubmit={(ev) => {
            ev.preventDefault();
            if (!name.trim()) return setErrors({ name: 'Type your name to approve.' });
            setErrors({});
            approve.mutate({ token, version: e.version, grossMinor: e.grossMinor, name: name.trim() });
          }}
        >
          <TextField label="Your name" autoComplete="name" value={name} onChange={(ev) => setName(ev.target.value)} error={errors['name']} maxLength={120} />
          <Button type="submit" loading={approve.isPending}>
            Approve {money(e.grossMinor)}
          </Button>
          <Button variant="secondary" onClick={() => setMode('decline')}>
            Decline…
          </Button>
        </form>
      ) : (
        <form
          className="grid gap-3"
          aria-label="Decline the estimate"
          noValidate
          onSubmit={(ev) => {
            ev.preventDefault();
            if (reason.trim().length < 3) return setErrors({ reason: 'Tell the shop why (at least 3 characters).' });
            setErrors({});
            decline.mutate({ token, reason: reason.trim() });
          }}
        >
          <FormField label="Why are you declining?" hint="The shop reads this before contacting you." error={errors['reason']}>
            {(control) => <textarea {...control} rows={4} maxLength={1000} className={inputClasses(Boolean(errors['reason']))} value={reason} onChange={(ev) => setReason(ev.target.value)} />}
          </FormField>
          <Button type="submit" variant="danger" loading={decline.isPending}>
            Decline the estimate
          </Button>
          <Button variant="secondary" onClick={() => setMode('idle')}>
            Back
          </Button>
        </form>
      )}
    </div>
  );
}
