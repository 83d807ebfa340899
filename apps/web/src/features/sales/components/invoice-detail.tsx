import type { Invoice } from '@tappet/contracts';
import { Badge, Button, buttonClasses, ConfirmDialog, Dialog, EmptyState, ErrorState, FormDialogFooter, FormMessage, LoadingState, Num, Select, StatusPill, TextField, useToast } from '@tappet/ui';
import { useState, type FormEvent } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { ApiError, errorMessage } from '../../../lib/api-client';
import { invoicePdfHref, useInvoice } from '../api/get-invoice';
import { creditInvoice, deleteDraft, emailInvoice, issueInvoice, recordPayment, startCardCheckout, updateInvoice } from '../api/write-sales';
import { useSalesMutation } from '../api/sales-mutation';
import { documentTitle, methodWords, minorFrom, money, paymentWords, percent, sourceWords } from './words';

export interface InvoiceCan {
  issue: boolean;
  pay: boolean;
  edit: boolean;
  remove: boolean;
  email: boolean;
}

/** One invoice or credit note: lines, tax per rate, paid and due, payments, and what can be done now. */
export function InvoiceDetail({ shopId, invoiceId, can, cardReturn }: { shopId: string; invoiceId: string; can: InvoiceCan; cardReturn: boolean }) {
  // Back from the card checkout page: the payment arrives by webhook, so look again every 2 s for a while.
  const [waitingForCard, setWaitingForCard] = useState(cardReturn);
  const invoice = useInvoice(shopId, invoiceId, { refetchInterval: waitingForCard ? 2000 : false });
  if (waitingForCard && invoice.data && invoice.data.paymentStatus === 'paid') setWaitingForCard(false);
  if (invoice.isPending) return <LoadingState label="Loading the invoice…" />;
  if (invoice.isError) {
    if (invoice.error instanceof ApiError && invoice.error.status === 404) return <EmptyState title="No such invoice">It may have been a draft that was deleted.</EmptyState>;
    return <ErrorState message={errorMessage(invoice.error)} onRetry={() => void invoice.refetch()} />;
  }
  const inv = invoice.data;
  return (
    <div className="grid gap-6">
      {waitingForCard && inv.paymentStatus !== 'paid' && (
        <p role="status" className="rounded border-2 border-line bg-sunk p-3">
          Card payment sent. It shows here once the card company confirms it, usually within seconds.
        </p>
      )}
      {inv.overpaidMinor > 0 && (
        <p role="status" className="rounded border-2 border-advise bg-advise-soft p-3">
          <strong>Paid {money(inv.overpaidMinor, inv.currency)} more than the total.</strong> This happens when two card payments complete at once. Refund the difference to the customer through the card company, or agree to keep it as their credit; Tappet does not refund by itself.
        </p>
      )}
      <Summary inv={inv} />
      <Actions shopId={shopId} inv={inv} can={can} />
      <Lines inv={inv} shopId={shopId} canEdit={can.edit && inv.status === 'draft'} />
      <Totals inv={inv} />
      {inv.kind === 'invoice' && <Payments inv={inv} />}
    </div>
  );
}

function Summary({ inv }: { inv: Invoice }) {
  return (
    <section aria-label="Summary" className="flex flex-wrap items-start justify-between gap-4">
      <div>
        <div className="flex flex-wrap items-center gap-2">
          {inv.status === 'draft' ? <StatusPill status="na" label="Draft" /> : <StatusPill status="ok" label="Issued" />}
          {inv.kind === 'invoice' && inv.status === 'issued' && <StatusPill status={paymentWords[inv.paymentStatus].status} label={paymentWords[inv.paymentStatus].label} />}
          <Badge>{sourceWords[inv.source]}</Badge>
        </div>
        <p className="mt-2 font-bold">{inv.customerName}</p>
        {inv.customerEmail && <p className="text-ink-muted">{inv.customerEmail}</p>}
        {inv.customerAddress && <p className="whitespace-pre-line text-ink-muted">{inv.customerAddress}</p>}
        {inv.notes && <p className="mt-2 max-w-prose">{inv.notes}</p>}
        {inv.creditedInvoiceId && (
          <p className="mt-2">
            Credits invoice {inv.creditedInvoiceNumber}
            {inv.creditReason ? `: ${inv.creditReason}` : ''}
          </p>
        )}
      </div>
      <dl className="grid grid-cols-[auto_auto] gap-x-4 gap-y-1 text-right">
        <dt className="text-ink-muted">Total</dt>
        <dd className="font-bold">
          <Num>{money(inv.grossMinor, inv.currency)}</Num>
        </dd>
        {inv.kind === 'invoice' && (
          <>
            <dt className="text-ink-muted">Paid</dt>
            <dd>
              <Num>{money(inv.paidMinor, inv.currency)}</Num>
            </dd>
            <dt className="text-ink-muted">Due</dt>
            <dd className="font-bold">
              <Num>{money(inv.dueMinor, inv.currency)}</Num>
            </dd>
            {inv.overpaidMinor > 0 && (
              <>
                <dt className="text-ink-muted">Overpaid</dt>
                <dd className="font-bold">
                  <Num>{money(inv.overpaidMinor, inv.currency)}</Num>
                </dd>
              </>
            )}
          </>
        )}
        {inv.issuedAt && (
          <>
            <dt className="text-ink-muted">Issued</dt>
            <dd>{inv.issuedAt.slice(0, 10)}</dd>
          </>
        )}
      </dl>
    </section>
  );
}

function Actions({ shopId, inv, can }: { shopId: string; inv: Invoice; can: InvoiceCan }) {
  const navigate = useNavigate();
  const toast = useToast();
  const [dialog, setDialog] = useState<null | 'issue' | 'pay' | 'credit' | 'delete'>(null);
  const [sendEmail, setSendEmail] = useState(true);
  const issue = useSalesMutation(shopId, issueInvoice);
  const remove = useSalesMutation(shopId, deleteDraft);
  const card = useSalesMutation(shopId, startCardCheckout);
  const email = useSalesMutation(shopId, emailInvoice);
  const close = () => setDialog(null);
  const isInvoice = inv.kind === 'invoice';
  const failed = (error: unknown) => toast.show(errorMessage(error), 'fail');
  return (
    <section aria-label="Actions" className="flex flex-wrap gap-2">
      {can.issue && inv.status === 'draft' && (
        <Button onClick={() => setDialog('issue')} disabled={inv.lines.length === 0}>
          Issue invoice
        </Button>
      )}
      {can.pay && isInvoice && inv.dueMinor > 0 && (
        <Button variant="secondary" onClick={() => setDialog('pay')}>
          {inv.status === 'draft' ? 'Record deposit' : 'Record payment'}
        </Button>
      )}
      {can.pay && isInvoice && inv.status === 'issued' && inv.dueMinor > 0 && (
        <Button
          variant="secondary"
          loading={card.isPending}
          onClick={() => card.mutate({ invoiceId: inv.id }, { onSuccess: (r) => window.location.assign(r.url), onError: failed })}
        >
          Take card payment
        </Button>
      )}
      {can.issue && isInvoice && inv.status === 'issued' && inv.creditedMinor < inv.grossMinor && (
        <Button variant="secondary" onClick={() => setDialog('credit')}>
          Credit note
        </Button>
      )}
      <a className={buttonClasses('secondary')} href={invoicePdfHref(shopId, inv.id)} target="_blank" rel="noreferrer">
        PDF
      </a>
      {can.email && inv.status === 'issued' && inv.customerEmail && (
        <Button variant="secondary" loading={email.isPending} onClick={() => email.mutate(inv.id, { onSuccess: () => toast.show(`E-mailed to ${inv.customerEmail}.`, 'ok'), onError: failed })}>
          E-mail
        </Button>
      )}
      {can.remove && inv.status === 'draft' && inv.source !== 'counter' && inv.payments.length === 0 && (
        <Button variant="danger" onClick={() => setDialog('delete')}>
          Delete draft
        </Button>
      )}
      {inv.creditNotes.map((c) => (
        <Link key={c.id} className={buttonClasses('ghost')} to={paths.shop.salesInvoice.getHref(shopId, c.id)}>
          Credit note {c.number}
        </Link>
      ))}

      <Dialog
        open={dialog === 'issue'}
        onClose={close}
        title="Issue this invoice?"
        description={
          <>
            It takes the next invoice number and can no longer be changed: a credit note corrects an issued invoice. Total {money(inv.grossMinor, inv.currency)}.
          </>
        }
        footer={
          <>
            <Button variant="secondary" onClick={close}>
              Cancel
            </Button>
            <Button
              loading={issue.isPending}
              onClick={() =>
                issue.mutate(
                  { invoiceId: inv.id, sendEmail },
                  {
                    onSuccess: (r) => {
                      close();
                      toast.show(`${r.number} issued${r.emailed ? ` and e-mailed to ${r.customerEmail}` : ''}.`, 'ok');
                    },
                    onError: failed,
                  },
                )
              }
            >
              Issue
            </Button>
          </>
        }
      >
        {inv.customerEmail ? (
          <label className="flex min-h-touch items-center gap-3">
            <input type="checkbox" checked={sendEmail} onChange={(e) => setSendEmail(e.target.checked)} className="size-5" />
            E-mail the PDF to {inv.customerEmail}
          </label>
        ) : (
          <p className="text-ink-muted">The customer has no e-mail address, so nothing is sent.</p>
        )}
      </Dialog>
      {dialog === 'pay' && <PaymentDialog shopId={shopId} inv={inv} onClose={close} />}
      {dialog === 'credit' && <CreditDialog shopId={shopId} inv={inv} onClose={close} />}
      <ConfirmDialog
        open={dialog === 'delete'}
        onCancel={close}
        destructive
        title="Delete this draft?"
        message="The draft and its lines are removed. Nothing has been numbered or sent."
        confirmLabel="Delete draft"
        loading={remove.isPending}
        onConfirm={() => remove.mutate(inv.id, { onSuccess: () => navigate(paths.shop.salesInvoices.getHref(shopId)), onError: failed })}
      />
    </section>
  );
}

function PaymentDialog({ shopId, inv, onClose }: { shopId: string; inv: Invoice; onClose: () => void }) {
  const pay = useSalesMutation(shopId, recordPayment);
  const [method, setMethod] = useState<'cash' | 'bank_transfer'>('cash');
  const [amount, setAmount] = useState((inv.dueMinor / 100).toFixed(2));
  const [receivedOn, setReceivedOn] = useState(new Date().toISOString().slice(0, 10));
  const [reference, setReference] = useState('');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const minor = minorFrom(amount);
    const found: Record<string, string> = {};
    if (minor === null || minor <= 0) found['amount'] = 'Enter the amount received, such as 120.00.';
    else if (minor > inv.dueMinor) found['amount'] = `At most ${money(inv.dueMinor, inv.currency)} is due.`;
    if (!receivedOn) found['receivedOn'] = 'Enter the date it was received.';
    setErrors(found);
    if (Object.keys(found).length) return;
    pay.mutate({ invoiceId: inv.id, method, amountMinor: minor!, receivedOn, reference: reference.trim() || null }, { onSuccess: onClose });
  };
  return (
    <Dialog open onClose={onClose} title="Record a payment" description={`Due now: ${money(inv.dueMinor, inv.currency)}.`} footer={<FormDialogFooter formId="record-payment" submitLabel="Record payment" loading={pay.isPending} onCancel={onClose} />}>
      <form id="record-payment" className="grid gap-4" onSubmit={submit} noValidate>
        <Select label="Method" value={method} onChange={(e) => setMethod(e.target.value as 'cash' | 'bank_transfer')} options={[{ value: 'cash', label: 'Cash' }, { value: 'bank_transfer', label: 'Bank transfer' }]} />
        <TextField label={`Amount (${inv.currency})`} inputMode="decimal" value={amount} onChange={(e) => setAmount(e.target.value)} error={errors['amount']} />
        <TextField label="Received on" type="date" value={receivedOn} onChange={(e) => setReceivedOn(e.target.value)} error={errors['receivedOn']} />
        <TextField label="Reference (optional)" value={reference} onChange={(e) => setReference(e.target.value)} maxLength={120} hint="A bank reference or receipt number." />
        {pay.isError && <FormMessage>{errorMessage(pay.error)}</FormMessage>}
      </form>
    </Dialog>
  );
}

function CreditDialog({ shopId, inv, onClose }: { shopId: string; inv: Invoice; onClose: () => void }) {
  const credit = useSalesMutation(shopId, creditInvoice);
  const navigate = useNavigate();
  const [reason, setReason] = useState('');
  const [error, setError] = useState<string>();
  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (reason.trim().length < 3) return setError('Say why (at least 3 characters); it is printed on the credit note.');
    setError(undefined);
    credit.mutate({ invoiceId: inv.id, reason: reason.trim() }, { onSuccess: (r) => navigate(paths.shop.salesInvoice.getHref(shopId, r.id)) });
  };
  return (
    <Dialog
      open
      onClose={onClose}
      title="Credit this invoice"
      description="A credit note is issued at once, in its own numbered series, for everything on the invoice not yet credited."
      footer={<FormDialogFooter formId="credit-note" submitLabel="Issue credit note" loading={credit.isPending} onCancel={onClose} />}
    >
      <form id="credit-note" className="grid gap-4" onSubmit={submit} noValidate>
        <TextField label="Reason" value={reason} onChange={(e) => setReason(e.target.value)} error={error} maxLength={500} />
        {credit.isError && <FormMessage>{errorMessage(credit.error)}</FormMessage>}
      </form>
    </Dialog>
  );
}

function Lines({ inv, shopId, canEdit }: { inv: Invoice; shopId: string; canEdit: boolean }) {
  const [editing, setEditing] = useState(false);
  return (
    <section aria-labelledby="lines-heading">
      <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <h2 id="lines-heading" className="text-lg font-bold">
          Lines
        </h2>
        {canEdit && inv.lines.length > 0 && (
          <Button size="sm" variant="secondary" onClick={() => setEditing(true)}>
            Change prices
          </Button>
        )}
      </div>
      {inv.lines.length === 0 ? (
        <p className="text-ink-muted">No lines yet.</p>
      ) : (
        <div className="relative overflow-x-auto">
          <table className="w-full border-collapse text-left">
            <caption className="sr-only">Lines of {documentTitle(inv)}</caption>
            <thead>
              <tr className="border-b-2 border-line">
                <th scope="col" className="py-2 pr-3">
                  Description
                </th>
                <th scope="col" className="py-2 pr-3 text-right">
                  Qty
                </th>
                <th scope="col" className="py-2 pr-3 text-right">
                  Unit price
                </th>
                <th scope="col" className="py-2 pr-3 text-right">
                  Tax
                </th>
                <th scope="col" className="py-2 text-right">
                  Net
                </th>
              </tr>
            </thead>
            <tbody>
              {inv.lines.map((l) => (
                <tr key={l.id} className="border-b border-line align-top">
                  <td className="py-2 pr-3">
                    {l.description}
                    {l.discountPercent > 0 && <span className="text-ink-muted"> (less {percent(l.discountPercent)})</span>}
                    {l.priceOverridden && (
                      <span className="ml-2">
                        <Badge>price set by hand, listed {money(l.listedUnitPriceMinor, inv.currency)}</Badge>
                      </span>
                    )}
                  </td>
                  <td className="py-2 pr-3 text-right">
                    <Num>{l.quantity}</Num>
                  </td>
                  <td className="py-2 pr-3 text-right">
                    <Num>{money(l.unitPriceMinor, inv.currency)}</Num>
                  </td>
                  <td className="py-2 pr-3 text-right">
                    <Num>{percent(l.taxRatePercent)}</Num>
                  </td>
                  <td className="py-2 text-right">
                    <Num>{money(l.netMinor, inv.currency)}</Num>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {editing && <PricesDialog shopId={shopId} inv={inv} onClose={() => setEditing(false)} />}
    </section>
  );
}

/** Set line prices by hand on a draft (the owner's permission); the listed price stays on record. */
function PricesDialog({ shopId, inv, onClose }: { shopId: string; inv: Invoice; onClose: () => void }) {
  const update = useSalesMutation(shopId, updateInvoice);
  const [prices, setPrices] = useState(() => inv.lines.map((l) => (l.unitPriceMinor / 100).toFixed(2)));
  const [errors, setErrors] = useState<Record<number, string>>({});
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const found: Record<number, string> = {};
    const minors = prices.map((p, i) => {
      const m = minorFrom(p);
      if (m === null) found[i] = 'Enter a price such as 12.50.';
      return m ?? 0;
    });
    setErrors(found);
    if (Object.keys(found).length) return;
    const lines = inv.lines.map((l, i) => ({
      kind: l.kind,
      partId: l.partId,
      description: l.description,
      quantity: l.quantity,
      unitPriceMinor: minors[i],
      discountPercent: l.discountPercent,
      taxRatePercent: l.taxRatePercent,
    }));
    update.mutate({ invoiceId: inv.id, body: { lines } }, { onSuccess: onClose });
  };
  return (
    <Dialog open onClose={onClose} title="Change line prices" description="Prices set by hand are marked on the invoice with the listed price." footer={<FormDialogFooter formId="line-prices" submitLabel="Save prices" loading={update.isPending} onCancel={onClose} />}>
      <form id="line-prices" className="grid gap-4" onSubmit={submit} noValidate>
        {inv.lines.map((l, i) => (
          <TextField
            key={l.id}
            label={`${l.description} (${inv.currency})`}
            inputMode="decimal"
            value={prices[i]}
            error={errors[i]}
            onChange={(e) => setPrices((p) => p.map((v, j) => (j === i ? e.target.value : v)))}
          />
        ))}
        {update.isError && <FormMessage>{errorMessage(update.error)}</FormMessage>}
      </form>
    </Dialog>
  );
}

function Totals({ inv }: { inv: Invoice }) {
  return (
    <section aria-labelledby="totals-heading" className="ml-auto w-full max-w-md">
      <h2 id="totals-heading" className="sr-only">
        Totals
      </h2>
      <dl className="grid grid-cols-[1fr_auto] gap-x-4 gap-y-1">
        <dt>Net</dt>
        <dd className="text-right">
          <Num>{money(inv.netMinor, inv.currency)}</Num>
        </dd>
        {inv.taxByRate.map((r) => (
          <div key={r.ratePercent} className="contents">
            <dt>
              Tax at {percent(r.ratePercent)} on {money(r.netMinor, inv.currency)}
            </dt>
            <dd className="text-right">
              <Num>{money(r.taxMinor, inv.currency)}</Num>
            </dd>
          </div>
        ))}
        <dt className="font-bold">Total</dt>
        <dd className="text-right font-bold">
          <Num>{money(inv.grossMinor, inv.currency)}</Num>
        </dd>
        {inv.creditedMinor > 0 && (
          <>
            <dt>Credited</dt>
            <dd className="text-right">
              <Num>−{money(inv.creditedMinor, inv.currency)}</Num>
            </dd>
          </>
        )}
        {inv.kind === 'invoice' && (
          <>
            <dt>Paid</dt>
            <dd className="text-right">
              <Num>−{money(inv.paidMinor, inv.currency)}</Num>
            </dd>
            <dt className="font-bold">Due</dt>
            <dd className="text-right font-bold">
              <Num>{money(inv.dueMinor, inv.currency)}</Num>
            </dd>
          </>
        )}
        {inv.marginMinor !== undefined && inv.marginMinor !== null && (
          <>
            <dt className="text-ink-muted">Margin (not printed)</dt>
            <dd className="text-right text-ink-muted">
              <Num>{money(inv.marginMinor, inv.currency)}</Num>
            </dd>
          </>
        )}
      </dl>
      <p className="mt-2 text-sm text-ink-muted">Tax rounded {inv.taxRounding === 'per-line' ? 'on each line' : 'once per rate on the whole document'}.</p>
    </section>
  );
}

function Payments({ inv }: { inv: Invoice }) {
  return (
    <section aria-labelledby="payments-heading">
      <h2 id="payments-heading" className="mb-2 text-lg font-bold">
        Payments
      </h2>
      {inv.payments.length === 0 ? (
        <p className="text-ink-muted">No payments yet.</p>
      ) : (
        <ul className="grid gap-1">
          {inv.payments.map((p) => (
            <li key={p.id} className="flex flex-wrap justify-between gap-2 border-b border-line py-1">
              <span>
                {p.receivedOn} · {methodWords[p.method]}
                {p.reference ? ` · ${p.reference}` : ''}
                {p.recordedBy ? ` · recorded by ${p.recordedBy}` : ''}
              </span>
              <Num>{money(p.amountMinor, inv.currency)}</Num>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
