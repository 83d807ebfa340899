import { useState } from 'react';
import type { Estimate, EstimateLine, EstimateLineInput } from '@tappet/contracts';
import { Button, Dialog, ErrorState, FormDialogFooter, LoadingState, TextField, buttonClasses, useToast } from '@tappet/ui';
import { useCan } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { useFormatMoney } from '../../../lib/shop-settings';
import { estimatePdfHref, useApprovalState, useJobEstimates } from '../api/get-estimates';
import { createEstimate, reviseEstimate, sendEstimate, updateEstimate, useEstimatesMutation } from '../api/write-estimates';
import { EstimateLineForm } from './estimate-line-form';
import { dateOf, estimateStatusWords } from './words';

/** What an estimate line was sent as, so a re-save keeps typed prices and re-prices the rest. */
const asInput = (l: EstimateLine): EstimateLineInput => ({
  kind: l.kind,
  partId: l.partId,
  description: l.description,
  quantity: l.quantity,
  ...(l.priceBasis === 'typed' ? { unitPriceMinor: l.unitPriceMinor } : {}),
  taxRatePercent: l.taxRatePercent,
});

/**
 * A job's estimate and its approval: what the customer approved against what the job is worth
 * now, with a warning when the work has gone beyond it; the current estimate with its lines and
 * totals, built line by line while a draft, sent by e-mail with a link, revised as a new version.
 */
export function EstimatePanel({ shopId, jobId, assigneeIds }: { shopId: string; jobId: string; assigneeIds: string[] }) {
  const canRead = useCan('read', 'Estimate', { shopId, assigneeIds });
  const canWrite = useCan('create', 'Estimate', { shopId });
  const estimates = useJobEstimates(shopId, jobId);
  const approval = useApprovalState(shopId, jobId, canRead);
  const money = useFormatMoney(shopId);
  const toast = useToast();
  const create = useEstimatesMutation(shopId, createEstimate);
  const update = useEstimatesMutation(shopId, updateEstimate);
  const revise = useEstimatesMutation(shopId, reviseEstimate);
  const [sending, setSending] = useState<Estimate | null>(null);
  const [lineError, setLineError] = useState<string | null>(null);

  if (!canRead) return null;
  const heading = (
    <h2 id="estimate-heading" className="text-lg font-bold">
      Estimate and approval
    </h2>
  );
  if (estimates.isPending) return <section aria-labelledby="estimate-heading">{heading}<LoadingState label="Loading the estimate…" /></section>;
  if (estimates.isError) return <section aria-labelledby="estimate-heading">{heading}<ErrorState message={errorMessage(estimates.error)} onRetry={() => void estimates.refetch()} /></section>;

  const list = estimates.data;
  const current = list.find((e) => e.status !== 'superseded') ?? null;
  const older = list.filter((e) => e !== current);
  const state = approval.data;

  const saveLines = async (estimate: Estimate, lines: EstimateLineInput[]) => {
    setLineError(null);
    try {
      await update.mutateAsync({ estimateId: estimate.id, lines });
      return true;
    } catch (error) {
      setLineError(errorMessage(error));
      return false;
    }
  };

  return (
    <section aria-labelledby="estimate-heading" className="mt-8 grid gap-4 rounded-lg border-2 border-line p-4">
      {heading}
      {state && (
        <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-3" aria-label="Approval">
          <div>
            <dt className="text-sm text-ink-muted">Approved by the customer</dt>
            <dd className="font-bold" data-testid="approved-amount">
              {state.approved ? `${money(state.approved.amountMinor)} (${state.approved.reference}, ${dateOf(state.approved.at)})` : 'Nothing approved yet'}
            </dd>
          </div>
          <div>
            <dt className="text-sm text-ink-muted">Work so far at sell prices, with tax</dt>
            <dd className="font-bold">{money(state.actualGrossMinor)}</dd>
          </div>
          <div>
            <dt className="text-sm text-ink-muted">Latest estimate</dt>
            <dd className="font-bold">{state.latest ? `${money(state.latest.grossMinor)} (${state.latest.reference})` : 'None'}</dd>
          </div>
        </dl>
      )}
      {state?.overApproved && (
        <p role="alert" className="rounded-md border-2 border-advise bg-advise-soft p-3 font-bold">
          Over the approved amount — send a revised estimate before doing more work.
        </p>
      )}

      {!current && (
        <div className="flex flex-wrap items-center gap-3">
          <p className="text-ink-muted">{list.length ? 'No estimate is open for this job.' : 'No estimate for this job yet.'}</p>
          {canWrite && (
            <Button loading={create.isPending} onClick={() => create.mutate({ jobId, lines: [] }, { onError: (e) => toast.show(errorMessage(e), 'fail') })}>
              Start an estimate
            </Button>
          )}
        </div>
      )}

      {current && (
        <article aria-label={`Estimate ${current.reference}`} className="grid gap-3">
          <div className="flex flex-wrap items-center justify-between gap-2">
            <p>
              <span className="font-mono font-bold">{current.reference}</span> · <span data-testid="estimate-status">{estimateStatusWords[current.status]}</span>
              {current.status === 'sent' && current.sentTo && <span className="text-ink-muted"> · sent to {current.sentTo} on {dateOf(current.sentAt)}, link valid until {dateOf(current.linkExpiresAt)}</span>}
              {current.status === 'approved' && <span className="text-ink-muted"> · {current.decidedByName} approved {money(current.approvedAmountMinor ?? 0)} on {dateOf(current.decidedAt)}</span>}
              {current.status === 'declined' && <span className="text-ink-muted"> · declined on {dateOf(current.decidedAt)}: “{current.declineReason}”</span>}
            </p>
            <div className="flex flex-wrap gap-2">
              <a className={buttonClasses('secondary', 'sm')} href={estimatePdfHref(shopId, current.id)} target="_blank" rel="noreferrer">
                PDF
              </a>
              {canWrite && (current.status === 'draft' || current.status === 'sent') && (
                <Button size="sm" disabled={current.lines.length === 0} onClick={() => setSending(current)}>
                  {current.status === 'sent' ? 'Send again' : 'Send to the customer'}
                </Button>
              )}
              {canWrite && current.status !== 'draft' && (
                <Button size="sm" variant="secondary" loading={revise.isPending} onClick={() => revise.mutate(current.id, { onError: (e) => toast.show(errorMessage(e), 'fail') })}>
                  Revise
                </Button>
              )}
            </div>
          </div>
          {current.lines.length === 0 ? (
            <p className="text-ink-muted">No lines yet.</p>
          ) : (
            <div className="relative overflow-x-auto">
              <table className="w-full text-left">
                <caption className="sr-only">Lines of {current.reference}</caption>
                <thead>
                  <tr className="border-b-2 border-line text-sm text-ink-muted">
                    <th scope="col" className="py-2 pr-3">Line</th>
                    <th scope="col" className="py-2 pr-3 text-right">Qty / hours</th>
                    <th scope="col" className="py-2 pr-3 text-right">Unit</th>
                    <th scope="col" className="py-2 pr-3 text-right">Tax</th>
                    <th scope="col" className="py-2 pr-3 text-right">Net</th>
                    {canWrite && current.status === 'draft' && <th scope="col" className="sr-only">Remove</th>}
                  </tr>
                </thead>
                <tbody>
                  {current.lines.map((l, i) => (
                    <tr key={l.id} className="border-b border-line">
                      <td className="py-2 pr-3">
                        {l.partNumber && <span className="mr-2 font-mono">{l.partNumber}</span>}
                        {l.description}
                      </td>
                      <td className="py-2 pr-3 text-right tabular-nums">{l.kind === 'labour' ? `${l.quantity} h` : l.quantity}</td>
                      <td className="py-2 pr-3 text-right tabular-nums">{money(l.unitPriceMinor)}</td>
                      <td className="py-2 pr-3 text-right tabular-nums">{l.taxRatePercent}%</td>
                      <td className="py-2 pr-3 text-right tabular-nums">{money(l.netMinor)}</td>
                      {canWrite && current.status === 'draft' && (
                        <td className="py-2 text-right">
                          <Button size="sm" variant="secondary" onClick={() => void saveLines(current, current.lines.filter((_, j) => j !== i).map(asInput))}>
                            Remove<span className="sr-only"> {l.description}</span>
                          </Button>
                        </td>
                      )}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
          <dl className="ml-auto grid grid-cols-[auto_auto] gap-x-4 gap-y-1 text-right">
            <dt className="text-ink-muted">Net</dt>
            <dd className="tabular-nums">{money(current.netMinor)}</dd>
            {current.taxByRate.map((r) => (
              <div key={r.ratePercent} className="contents">
                <dt className="text-ink-muted">Tax at {r.ratePercent}&nbsp;%</dt>
                <dd className="tabular-nums">{money(r.taxMinor)}</dd>
              </div>
            ))}
            <dt className="font-bold">Total with tax</dt>
            <dd className="font-bold tabular-nums" data-testid="estimate-total">
              {money(current.grossMinor)}
            </dd>
          </dl>
          {canWrite && current.status === 'draft' && <EstimateLineForm shopId={shopId} busy={update.isPending} error={lineError} onAdd={(line) => saveLines(current, [...current.lines.map(asInput), line])} />}
        </article>
      )}

      {older.length > 0 && (
        <details>
          <summary className="cursor-pointer font-bold">Earlier versions ({older.length})</summary>
          <ul className="mt-2 grid gap-1">
            {older.map((e) => (
              <li key={e.id}>
                <span className="font-mono">{e.reference}</span> · {estimateStatusWords[e.status]} · {money(e.grossMinor)}
                {e.approvedAmountMinor !== null && ` · approved ${money(e.approvedAmountMinor)} on ${dateOf(e.decidedAt)}`}
              </li>
            ))}
          </ul>
        </details>
      )}
      {sending && <SendDialog shopId={shopId} estimate={sending} onClose={() => setSending(null)} />}
    </section>
  );
}

function SendDialog({ shopId, estimate, onClose }: { shopId: string; estimate: Estimate; onClose: () => void }) {
  const [email, setEmail] = useState(estimate.sentTo ?? estimate.customerEmail ?? '');
  const [days, setDays] = useState('14');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const send = useEstimatesMutation(shopId, sendEstimate);
  const toast = useToast();
  const submit = () => {
    const found: Record<string, string> = {};
    if (!/^[^\s@]+@[^\s@]+\.[^\s@]+$/.test(email.trim())) found['email'] = 'Enter an e-mail address such as name@example.test.';
    if (!/^\d+$/.test(days) || Number(days) < 1 || Number(days) > 60) found['days'] = 'Use 1 to 60 days.';
    setErrors(found);
    if (Object.keys(found).length) return;
    send.mutate(
      { estimateId: estimate.id, email: email.trim(), linkValidDays: Number(days) },
      {
        onSuccess: (r) => {
          toast.show(r.emailed ? `Estimate ${r.estimate.reference} sent to ${r.estimate.sentTo}.` : 'The estimate is ready but the e-mail could not be sent. Try again.', r.emailed ? 'ok' : 'fail');
          onClose();
        },
        onError: (e) => setErrors({ form: errorMessage(e) }),
      },
    );
  };
  return (
    <Dialog
      open
      onClose={onClose}
      title={`Send ${estimate.reference}`}
      description="The customer gets the estimate as PDF and a link to approve or decline it without an account. The link works once."
      footer={<FormDialogFooter onCancel={onClose} submitLabel="Send" formId="send-estimate" loading={send.isPending} />}
    >
      <form
        id="send-estimate"
        className="grid gap-4"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          submit();
        }}
      >
        <TextField label="Customer’s e-mail address" type="email" value={email} onChange={(e) => setEmail(e.target.value)} error={errors['email']} />
        <TextField label="Link valid for (days)" inputMode="numeric" value={days} onChange={(e) => setDays(e.target.value)} error={errors['days']} />
        {errors['form'] && (
          <p role="alert" className="font-bold text-fail">
            {errors['form']}
          </p>
        )}
      </form>
    </Dialog>
  );
}
