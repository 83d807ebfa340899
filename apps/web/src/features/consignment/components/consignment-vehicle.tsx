import { useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { vehicleStatusLabels, consignmentTermsInputSchema, payoutInputSchema, settlementInputSchema, type ConsignmentVehicle } from '@tappet/contracts';
import { parseMinorUnits } from '@tappet/domain';
import { Button, ConfirmDialog, ErrorState, LoadingState, Select, TextField, buttonClasses, useToast } from '@tappet/ui';
import { paths } from '../../../config/paths';
import { useCan } from '../../../lib/ability';
import { errorMessage } from '../../../lib/api-client';
import { useFormatMoney } from '../../../lib/shop-settings';
import { recordPayout, saveTerms, settle, settlementPdfHref, useConsignmentMutation, useConsignmentVehicle } from '../api/consignment';

const today = () => new Date().toISOString().slice(0, 10);
const methodWords = { bank_transfer: 'Bank transfer', cheque: 'Cheque', cash: 'Cash' } as const;
/** Zod issues → field errors by the first path segment. */
const issuesOf = (error: { issues: Array<{ path: PropertyKey[]; message: string }> }) => Object.fromEntries(error.issues.map((i) => [String(i.path[0] ?? 'form'), i.message]));
const amountOf = (text: string): number | null => {
  try {
    return parseMinorUnits(text.trim());
  } catch {
    return null;
  }
};

/** A consigned vehicle: the terms agreed at intake, the work its owner approved, the settlement and payout. */
export function ConsignmentVehicleView({ shopId, vehicleId }: { shopId: string; vehicleId: string }) {
  const detail = useConsignmentVehicle(shopId, vehicleId);
  const canWrite = useCan('update', 'Consignment', { shopId });
  if (detail.isPending) return <LoadingState label="Loading the consignment…" />;
  if (detail.isError) return <ErrorState message={errorMessage(detail.error)} onRetry={() => void detail.refetch()} />;
  const d = detail.data;
  return (
    <div className="grid gap-8">
      <header>
        <h1 className="text-xl font-bold">{d.vehicle}</h1>
        <p className="text-ink-muted">Consigned by {d.consignor?.name ?? 'an owner not recorded'}</p>
      </header>
      {d.kind !== 'consignment' ? (
        <p>This vehicle is not on consignment.</p>
      ) : (
        <>
          <Terms shopId={shopId} d={d} canWrite={canWrite && !d.settlement} />
          {d.settlement ? <Settlement shopId={shopId} d={d} canWrite={canWrite} /> : <SettleForm shopId={shopId} d={d} canWrite={canWrite} />}
        </>
      )}
    </div>
  );
}

function Terms({ shopId, d, canWrite }: { shopId: string; d: ConsignmentVehicle; canWrite: boolean }) {
  const money = useFormatMoney(shopId);
  const toast = useToast();
  const save = useConsignmentMutation(shopId, saveTerms);
  const [editing, setEditing] = useState(!d.terms);
  const [kind, setKind] = useState<'percent' | 'fixed'>(d.terms?.commissionKind ?? 'percent');
  const [percent, setPercent] = useState(d.terms?.commissionPercent?.toString() ?? '');
  const [fixed, setFixed] = useState(d.terms?.commissionFixedMinor !== null && d.terms?.commissionFixedMinor !== undefined ? (d.terms.commissionFixedMinor / 100).toFixed(2) : '');
  const [agreedOn, setAgreedOn] = useState(d.terms?.agreedOn ?? today());
  const [note, setNote] = useState(d.terms?.note ?? '');
  const [errors, setErrors] = useState<Record<string, string>>({});

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const fixedMinor = kind === 'fixed' ? amountOf(fixed) : null;
    if (kind === 'fixed' && fixedMinor === null) return setErrors({ commissionFixedMinor: 'Write the amount as a number, e.g. 750.00.' });
    const parsed = consignmentTermsInputSchema.safeParse({ commissionKind: kind, commissionPercent: kind === 'percent' && percent.trim() ? Number(percent) : null, commissionFixedMinor: fixedMinor, agreedOn, note: note.trim() || null });
    if (!parsed.success) return setErrors(issuesOf(parsed.error));
    setErrors({});
    save.mutate(
      { vehicleId: d.vehicleId, terms: parsed.data },
      {
        onSuccess: () => {
          toast.show('Terms saved.');
          setEditing(false);
        },
        onError: (err) => setErrors({ form: errorMessage(err) }),
      },
    );
  };

  return (
    <section aria-labelledby="terms-heading" className="grid gap-3">
      <h2 id="terms-heading" className="text-lg font-bold">
        Terms agreed at intake
      </h2>
      {d.terms && !editing && (
        <div className="flex flex-wrap items-center gap-3">
          <p>
            Commission {d.terms.commissionKind === 'percent' ? `${d.terms.commissionPercent}% of the sale price` : `${money(d.terms.commissionFixedMinor ?? 0)}, fixed`} · agreed on {d.terms.agreedOn}
            {d.terms.note && <span className="text-ink-muted"> · {d.terms.note}</span>}
          </p>
          {canWrite && (
            <Button size="sm" variant="secondary" onClick={() => setEditing(true)}>
              Change the terms
            </Button>
          )}
        </div>
      )}
      {!d.terms && !canWrite && <p className="text-ink-muted">No terms recorded yet.</p>}
      {canWrite && editing && (
        <form className="grid max-w-xl gap-3" onSubmit={submit} noValidate aria-label="Consignment terms">
          <Select label="Commission" value={kind} onChange={(e) => setKind(e.target.value as 'percent' | 'fixed')} options={[{ value: 'percent', label: 'A percentage of the sale price' }, { value: 'fixed', label: 'A fixed amount' }]} />
          {kind === 'percent' ? (
            <TextField label="Commission (%)" inputMode="decimal" value={percent} onChange={(e) => setPercent(e.target.value)} error={errors['commissionPercent']} hint="Rounded half to even to the penny on the sale" />
          ) : (
            <TextField label="Commission amount" inputMode="decimal" value={fixed} onChange={(e) => setFixed(e.target.value)} error={errors['commissionFixedMinor']} />
          )}
          <TextField label="Agreed on" type="date" value={agreedOn} onChange={(e) => setAgreedOn(e.target.value)} error={errors['agreedOn']} />
          <TextField label="Note (optional)" value={note} onChange={(e) => setNote(e.target.value)} error={errors['note']} maxLength={1000} />
          {errors['form'] && (
            <p role="alert" className="font-bold text-fail">
              {errors['form']}
            </p>
          )}
          <div className="flex gap-2">
            <Button type="submit" loading={save.isPending}>
              Save the terms
            </Button>
            {d.terms && (
              <Button variant="secondary" onClick={() => setEditing(false)}>
                Cancel
              </Button>
            )}
          </div>
        </form>
      )}
    </section>
  );
}

function SettleForm({ shopId, d, canWrite }: { shopId: string; d: ConsignmentVehicle; canWrite: boolean }) {
  const money = useFormatMoney(shopId);
  const make = useConsignmentMutation(shopId, settle);
  const [price, setPrice] = useState(d.askingPriceMinor ? (d.askingPriceMinor / 100).toFixed(2) : '');
  // A vehicle already recorded as sold on its own page is settled for that sale: its day is the default.
  const soldDay = d.status === 'sold' ? d.statusSince.slice(0, 10) : null;
  const [soldOn, setSoldOn] = useState(soldDay ?? today());
  const [note, setNote] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [confirming, setConfirming] = useState<{ salePriceMinor: number; soldOn: string; note: string | null } | null>(null);
  const work = d.work.reduce((s, w) => s + w.chargedMinor, 0);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const minor = amountOf(price);
    if (minor === null) return setErrors({ salePriceMinor: 'Write the sale price as a number, e.g. 12345.00.' });
    const parsed = settlementInputSchema.safeParse({ salePriceMinor: minor, soldOn, note: note.trim() || null });
    if (!parsed.success) return setErrors(issuesOf(parsed.error));
    setErrors({});
    setConfirming(parsed.data);
  };

  return (
    <section aria-labelledby="settle-heading" className="grid gap-3">
      <h2 id="settle-heading" className="text-lg font-bold">
        Sale and settlement
      </h2>
      <h3 className="font-bold">Work the consignor approved</h3>
      {d.work.length === 0 ? (
        <p className="text-ink-muted">No approved work: nothing will be deducted for work.</p>
      ) : (
        <ul className="grid gap-1">
          {d.work.map((w) => (
            <li key={w.jobId}>
              Job {w.jobNumber} {w.title} · estimate {w.estimateReference} approved {money(w.approvedMinor)} · done so far {money(w.actualGrossMinor)} · charged <span className="font-bold">{money(w.chargedMinor)}</span>
            </li>
          ))}
          <li className="font-bold">Work charged in all: {money(work)}</li>
        </ul>
      )}
      {!d.terms ? (
        <p className="text-ink-muted">Record the terms first; then the sale can be settled.</p>
      ) : d.status !== 'ready' && d.status !== 'sold' ? (
        <p className="text-ink-muted">
          Settling records the vehicle as sold, so it must be ready first: it is “{vehicleStatusLabels[d.status]}”.{' '}
          <Link to={paths.shop.vehicle.getHref(shopId, d.vehicleId)} className="text-accent underline underline-offset-4">
            Move it on the vehicle’s page
          </Link>
          .
        </p>
      ) : canWrite ? (
        <form className="grid max-w-xl gap-3" onSubmit={submit} noValidate aria-label="Settle the sale">
          <TextField label="Sale price" inputMode="decimal" value={price} onChange={(e) => setPrice(e.target.value)} error={errors['salePriceMinor']} />
          <TextField
            label="Sold on"
            type="date"
            value={soldOn}
            max={soldDay ?? undefined}
            onChange={(e) => setSoldOn(e.target.value)}
            error={errors['soldOn']}
            hint={soldDay ? `Recorded as sold on ${soldDay} on the vehicle’s page: the sale date cannot be later.` : undefined}
          />
          <TextField label="Note (optional)" value={note} onChange={(e) => setNote(e.target.value)} maxLength={1000} />
          {errors['form'] && (
            <p role="alert" className="font-bold text-fail">
              {errors['form']}
            </p>
          )}
          <div>
            <Button type="submit">Settle the sale…</Button>
          </div>
        </form>
      ) : null}
      {confirming && (
        <ConfirmDialog
          open
          title="Settle this sale?"
          message={`Sale price ${money(confirming.salePriceMinor)}. The commission, the approved work and the payout are worked out now and cannot change afterwards.${d.status === 'sold' ? '' : ` The vehicle is recorded as sold on ${confirming.soldOn}.`}`}
          confirmLabel="Settle"
          loading={make.isPending}
          onCancel={() => setConfirming(null)}
          onConfirm={() =>
            make.mutate(
              { vehicleId: d.vehicleId, body: confirming },
              {
                onSuccess: () => setConfirming(null),
                onError: (err) => {
                  setConfirming(null);
                  setErrors({ form: errorMessage(err) });
                },
              },
            )
          }
        />
      )}
    </section>
  );
}

function Settlement({ shopId, d, canWrite }: { shopId: string; d: ConsignmentVehicle; canWrite: boolean }) {
  const money = useFormatMoney(shopId);
  const s = d.settlement!;
  const pay = useConsignmentMutation(shopId, recordPayout);
  const [paidOn, setPaidOn] = useState(today());
  const [method, setMethod] = useState<'bank_transfer' | 'cheque' | 'cash'>('bank_transfer');
  const [reference, setReference] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const parsed = payoutInputSchema.safeParse({ paidOn, method, reference });
    if (!parsed.success) return setErrors(issuesOf(parsed.error));
    setErrors({});
    pay.mutate({ vehicleId: d.vehicleId, body: parsed.data }, { onError: (err) => setErrors({ form: errorMessage(err) }) });
  };
  return (
    <section aria-labelledby="settlement-heading" className="grid gap-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="settlement-heading" className="text-lg font-bold">
          Settlement <span className="font-mono">{s.reference}</span>
        </h2>
        <a className={buttonClasses('secondary', 'sm')} href={settlementPdfHref(shopId, d.vehicleId)} target="_blank" rel="noreferrer">
          Settlement PDF
        </a>
      </div>
      <dl className="grid max-w-xl grid-cols-[1fr_auto] gap-x-4 gap-y-1" aria-label="Settlement figures">
        <dt>Sale price ({s.soldOn})</dt>
        <dd className="text-right tabular-nums">{money(s.salePriceMinor)}</dd>
        <dt>Commission {s.commissionKind === 'percent' ? `${s.commissionPercent}%` : '(fixed)'}</dt>
        <dd className="text-right tabular-nums">−{money(s.commissionMinor)}</dd>
        {s.work.map((w) => (
          <div key={w.jobId} className="contents">
            <dt>
              Approved work: job {w.jobNumber} {w.title}
            </dt>
            <dd className="text-right tabular-nums">−{money(w.chargedMinor)}</dd>
          </div>
        ))}
        <dt className="border-t-2 border-line pt-1 text-lg font-bold">{s.consignorOwesMinor > 0 ? 'Owed by the consignor' : 'Payout to the consignor'}</dt>
        <dd className="border-t-2 border-line pt-1 text-right text-lg font-bold tabular-nums" data-testid="payout">
          {money(s.consignorOwesMinor > 0 ? s.consignorOwesMinor : s.payoutMinor)}
        </dd>
      </dl>
      {s.payout ? (
        <p role="status" className="font-bold">
          Paid on {s.payout.paidOn} by {methodWords[s.payout.method].toLowerCase()}, reference {s.payout.reference}.
        </p>
      ) : canWrite && s.payoutMinor > 0 ? (
        <form className="grid max-w-xl gap-3" onSubmit={submit} noValidate aria-label="Record the payout">
          <h3 className="font-bold">Record the payout</h3>
          <TextField label="Paid on" type="date" value={paidOn} onChange={(e) => setPaidOn(e.target.value)} error={errors['paidOn']} />
          <Select label="Method" value={method} onChange={(e) => setMethod(e.target.value as typeof method)} options={Object.entries(methodWords).map(([value, label]) => ({ value, label }))} />
          <TextField label="Payment reference" value={reference} onChange={(e) => setReference(e.target.value)} error={errors['reference']} maxLength={120} />
          {errors['form'] && (
            <p role="alert" className="font-bold text-fail">
              {errors['form']}
            </p>
          )}
          <div>
            <Button type="submit" loading={pay.isPending}>
              Record the payout
            </Button>
          </div>
        </form>
      ) : (
        <p className="text-ink-muted">Not paid yet.</p>
      )}
    </section>
  );
}
