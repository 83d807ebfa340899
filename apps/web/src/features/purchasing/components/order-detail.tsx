import type { PurchaseOrder } from '@tappet/contracts';
import { Button, CameraScanButton, ConfirmDialog, Dialog, ErrorState, FormDialogFooter, FormMessage, LoadingState, Num, PartNumber, Select, StatusPill, TextField, useToast } from '@tappet/ui';
import { useId, useRef, useState, type FormEvent, type KeyboardEvent, type ReactNode } from 'react';
import { useCan } from '../../../lib/ability';
import { useSettings } from '../../../lib/shop-settings';
import { errorMessage } from '../../../lib/api-client';
import { useBins } from '../api/get-bins';
import { useListings } from '../api/get-listings';
import { orderPdfHref, useOrder } from '../api/get-order';
import { approveOrder, cancelOrder, closeBackOrder, createReturn, receiveOrder, rejectOrder, requestApproval, sendOrder } from '../api/write-purchasing';
import { usePurchasingMutation } from '../api/purchasing-mutation';
import { OrderLinesDialog } from './order-lines-dialog';
import { money, orderStatusWords } from './words';

/** A number as scanners and people write it: upper case, without spaces, dashes, dots or slashes. */
const squash = (s: string) => s.toUpperCase().replace(/[\s\-./]/g, '');

/**
 * The open line a scanned or typed code names: its part number or the supplier's number, compared
 * without punctuation; a code that is a link is matched by its last path segment too.
 */
export function lineForCode<L extends { partNumber: string; supplierNumber: string | null }>(lines: L[], code: string): L | null {
  const raw = code.trim();
  if (!raw) return null;
  const candidates = new Set([squash(raw)]);
  const last = raw.split(/[/?#]/).filter(Boolean).at(-1);
  if (last) candidates.add(squash(decodeURIComponent(last)));
  return lines.find((l) => candidates.has(squash(l.partNumber)) || (l.supplierNumber !== null && candidates.has(squash(l.supplierNumber)))) ?? null;
}

type ReasonAction = 'reject' | 'cancel' | 'close';
const reasonWords: Record<ReasonAction, { title: string; label: string; submit: string; hint: string }> = {
  reject: { title: 'Reject this order', label: 'Reason for the buyer', submit: 'Reject order', hint: 'The order goes back to draft with this reason.' },
  cancel: { title: 'Cancel this order', label: 'Reason', submit: 'Cancel order', hint: 'Nothing has arrived against it; the supplier should be told.' },
  close: { title: 'Close the back-order', label: 'Reason', submit: 'Close back-order', hint: 'What is still outstanding will no longer be expected.' },
};

/** Asks for the reason of a rejection, cancellation or closed back-order. */
function ReasonDialog({ shopId, order, action, onClose }: { shopId: string; order: PurchaseOrder; action: ReasonAction; onClose: () => void }) {
  const formId = useId();
  const write = usePurchasingMutation(shopId, action === 'reject' ? rejectOrder : action === 'cancel' ? cancelOrder : closeBackOrder);
  const [error, setError] = useState<string | null>(null);
  const words = reasonWords[action];
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const reason = String(new FormData(event.currentTarget).get('reason') ?? '').trim();
    if (reason.length < 3) return setError('Give a reason (at least 3 characters).');
    write.mutate({ orderId: order.id, reason }, { onSuccess: onClose, onError: (e) => setError(errorMessage(e)) });
  }
  return (
    <Dialog open onClose={onClose} title={words.title} description={words.hint} footer={<FormDialogFooter formId={formId} submitLabel={words.submit} loading={write.isPending} onCancel={onClose} />}>
      <form id={formId} noValidate onSubmit={onSubmit}>
        <TextField label={words.label} name="reason" error={error ?? undefined} autoComplete="off" />
      </form>
    </Dialog>
  );
}

/** Receives what arrived: a quantity and a bin per open line (blank = none of that line). */
function ReceiveDialog({ shopId, order, onClose }: { shopId: string; order: PurchaseOrder; onClose: () => void }) {
  const formId = useId();
  const bins = useBins(shopId);
  const receive = usePurchasingMutation(shopId, receiveOrder);
  const toast = useToast();
  const [error, setError] = useState<string | null>(null);
  const [scanNote, setScanNote] = useState<string | null>(null);
  const formRef = useRef<HTMLFormElement>(null);
  const open = order.lines.filter((l) => l.outstandingQuantity > 0);

  /** A scanned (or typed) code picks its line: the quantity field is focused, ready to be checked. */
  function pick(code: string) {
    const line = lineForCode(open, code);
    if (!line) return setScanNote(`Nothing outstanding on ${order.reference} matches ${code.trim()}.`);
    setScanNote(`${line.partNumber}: ${line.outstandingQuantity} outstanding.`);
    const field = formRef.current?.elements.namedItem(`qty-${line.id}`);
    if (field instanceof HTMLInputElement) {
      field.focus();
      field.select();
    }
  }
  function onScanKey(event: KeyboardEvent<HTMLInputElement>) {
    if (event.key !== 'Enter') return;
    // A scanner types the code and presses Enter: pick the line instead of submitting the form.
    event.preventDefault();
    pick(event.currentTarget.value);
    event.currentTarget.value = '';
  }
  const binOptions = (bins.data?.bins ?? []).filter((b) => b.active).map((b) => ({ value: b.id, label: b.code }));

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const form = new FormData(event.currentTarget);
    const lines: Array<{ lineId: string; quantity: number; binId: string }> = [];
    for (const l of open) {
      const raw = String(form.get(`qty-${l.id}`) ?? '').trim();
      if (raw === '') continue;
      const quantity = Number(raw);
      if (!Number.isInteger(quantity) || quantity < 1 || quantity > l.outstandingQuantity) return setError(`${l.partNumber}: receive a whole number from 1 to ${l.outstandingQuantity}.`);
      const binId = String(form.get(`bin-${l.id}`) ?? '');
      if (!binId) return setError(`${l.partNumber}: choose the bin it goes into.`);
      lines.push({ lineId: l.id, quantity, binId });
    }
    if (lines.length === 0) return setError('Enter what arrived on at least one line.');
    receive.mutate(
      { orderId: order.id, lines },
      {
        onSuccess: (o) => {
          toast.show(o.status === 'received' ? `${o.reference} is fully received.` : `Received; ${o.lines.reduce((s, l) => s + l.outstandingQuantity, 0)} still on back-order.`, 'ok');
          onClose();
        },
        onError: (e) => setError(errorMessage(e)),
      },
    );
  }

  return (
    <Dialog open onClose={onClose} title={`Receive against ${order.reference}`} description="Goods go into the bins chosen, at the order's price; the average cost updates." footer={<FormDialogFooter formId={formId} submitLabel="Receive" loading={receive.isPending} onCancel={onClose} />}>
      {bins.isPending ? (
        <LoadingState label="Loading bins…" />
      ) : binOptions.length === 0 ? (
        <FormMessage>Add a bin under Stock → Bins first: goods need somewhere to go.</FormMessage>
      ) : (
        <form id={formId} ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
          {error && <FormMessage>{error}</FormMessage>}
          <div className="flex flex-wrap items-end gap-3">
            <TextField label="Scan or type a part number" name="scan" onKeyDown={onScanKey} autoComplete="off" className="font-mono" hint="Enter picks the line." fieldClassName="grow" />
            <CameraScanButton onDetected={pick} label="Scan with camera" />
          </div>
          <p role="status" className="min-h-6 text-sm">
            {scanNote}
          </p>
          {open.map((l) => (
            <fieldset key={l.id} className="grid gap-2 border-b border-line pb-3 sm:grid-cols-2">
              <legend className="mb-1 font-bold">
                <PartNumber>{l.partNumber}</PartNumber> — {l.outstandingQuantity} outstanding
              </legend>
              <TextField label={`Quantity of ${l.partNumber} received`} name={`qty-${l.id}`} inputMode="numeric" defaultValue={String(l.outstandingQuantity)} autoComplete="off" />
              <Select label={`Bin for ${l.partNumber}`} name={`bin-${l.id}`} options={binOptions} placeholder="Choose a bin" defaultValue={binOptions[0]?.value} />
            </fieldset>
          ))}
        </form>
      )}
    </Dialog>
  );
}

type OrderLine = PurchaseOrder['lines'][number];

/** Sends parts of a received line back (stock goes down), or its cores for their deposit. */
function ReturnDialog({ shopId, order, line, onClose }: { shopId: string; order: PurchaseOrder; line: OrderLine; onClose: () => void }) {
  const formId = useId();
  const create = usePurchasingMutation(shopId, createReturn);
  const toast = useToast();
  const [error, setError] = useState<string | null>(null);
  const bins = [...new Map(order.receipts.filter((r) => r.lineId === line.id).map((r) => [r.binId, { value: r.binId, label: r.binCode }])).values()];
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const f = new FormData(event.currentTarget);
    const kind = String(f.get('kind') ?? 'return');
    const quantity = Number(String(f.get('quantity') ?? ''));
    const reason = String(f.get('reason') ?? '').trim();
    if (!Number.isInteger(quantity) || quantity < 1 || quantity > line.receivedQuantity) return setError(`Return a whole number from 1 to ${line.receivedQuantity}.`);
    if (reason.length < 3) return setError('Give a reason (at least 3 characters).');
    create.mutate(
      { kind, supplierId: order.supplierId, lineId: line.id, partId: line.partId, quantity, reason, ...(kind === 'return' ? { binId: String(f.get('binId') ?? '') } : {}) },
      {
        onSuccess: (r) => {
          toast.show(`${r.kind === 'core' ? 'Core' : 'Return'} recorded: ${money(r.expectedCreditMinor, r.currency)} to be credited.`, 'ok');
          onClose();
        },
        onError: (e) => setError(errorMessage(e)),
      },
    );
  }
  return (
    <Dialog open onClose={onClose} title={`Return ${line.partNumber} to ${order.supplierName}`} description="Tracked under Returns until the supplier credits it." footer={<FormDialogFooter formId={formId} submitLabel="Record return" loading={create.isPending} onCancel={onClose} />}>
      <form id={formId} noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        {error && <FormMessage>{error}</FormMessage>}
        {line.coreDepositMinor > 0 && (
          <Select
            label="What goes back"
            name="kind"
            options={[
              { value: 'return', label: 'Faulty or wrong parts (taken out of stock)' },
              { value: 'core', label: `Old cores for their deposit (${money(line.coreDepositMinor, order.currency)} each)` },
            ]}
          />
        )}
        <TextField label="Quantity" name="quantity" inputMode="numeric" defaultValue="1" />
        <Select label="From bin" name="binId" options={bins} />
        <TextField label="Reason" name="reason" autoComplete="off" />
      </form>
    </Dialog>
  );
}

/** What arrived in the latest receipt, per part, for printing labels. */
export interface ArrivedPart {
  partId: string;
  partNumber: string;
  quantity: number;
  /** The receipts (one per line and bin) that brought it in. */
  receiptIds: string[];
}

/**
 * A purchase order: its lines and receipts, and the actions its state and the person's role allow.
 * `labelsAction` renders the label printing for what arrived last (the route composes it from the
 * labels feature).
 */
export function OrderDetail({ shopId, orderId, labelsAction }: { shopId: string; orderId: string; labelsAction?: (arrived: ArrivedPart[]) => ReactNode }) {
  const order = useOrder(shopId, orderId);
  const settings = useSettings(shopId);
  const listings = useListings(shopId, order.data?.supplierId ?? '');
  const canUpdate = useCan('update', 'PurchaseOrder', { shopId });
  const canApprove = useCan('approve', 'PurchaseOrder', { shopId });
  const canReceive = useCan('receive', 'Stock', { shopId });
  const canSendTotal = useCan('send', 'PurchaseOrder', { shopId, totalMinor: order.data?.totalShopMinor ?? Number.MAX_SAFE_INTEGER });
  const toast = useToast();
  const request = usePurchasingMutation(shopId, requestApproval);
  const approve = usePurchasingMutation(shopId, approveOrder);
  const send = usePurchasingMutation(shopId, sendOrder);
  const [reason, setReason] = useState<ReasonAction | null>(null);
  const [receiving, setReceiving] = useState(false);
  const [returning, setReturning] = useState<OrderLine | null>(null);
  const [confirmSend, setConfirmSend] = useState(false);
  const [editingLines, setEditingLines] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);

  if (order.isPending) return <LoadingState label="Loading the order…" />;
  if (order.isError) return <ErrorState message={errorMessage(order.error)} onRetry={() => void order.refetch()} />;
  const o = order.data;
  const words = orderStatusWords[o.status];
  const foreign = o.currency !== o.shopCurrency;
  const fail = (e: unknown) => setProblem(errorMessage(e));
  const mayDirectSend = o.status === 'draft' && canSendTotal;
  const editable = ['draft', 'awaiting_approval', 'approved'].includes(o.status);
  const lastAt = o.receipts.at(-1)?.receivedAt;
  const arrived: ArrivedPart[] = [];
  for (const r of o.receipts.filter((x) => x.receivedAt === lastAt)) {
    const line = o.lines.find((l) => l.id === r.lineId);
    if (!line) continue;
    const seen = arrived.find((a) => a.partId === line.partId);
    if (seen) {
      seen.quantity += r.quantity;
      seen.receiptIds.push(r.id);
    } else arrived.push({ partId: line.partId, partNumber: line.partNumber, quantity: r.quantity, receiptIds: [r.id] });
  }

  return (
    <div className="flex flex-col gap-6">
      <div className="flex flex-wrap items-center gap-4">
        <StatusPill status={words.status} label={words.label} />
        <span>
          {o.supplierName}
          {o.supplierEmail ? ` · ${o.supplierEmail}` : ' · no e-mail address'}
        </span>
        <a className="text-accent underline" href={orderPdfHref(shopId, o.id)} target="_blank" rel="noreferrer">
          Order PDF
        </a>
      </div>
      {o.rejectionReason && o.status === 'draft' && <FormMessage>Rejected by the owner: {o.rejectionReason}</FormMessage>}
      {o.closedReason && <p>Reason: {o.closedReason}</p>}
      {problem && <FormMessage>{problem}</FormMessage>}

      <div className="flex flex-wrap gap-3">
        {canUpdate && o.status === 'draft' && !mayDirectSend && (
          <Button loading={request.isPending} onClick={() => request.mutate(o.id, { onSuccess: () => toast.show('The owner has been asked to approve it.', 'ok'), onError: fail })}>
            Ask for approval
          </Button>
        )}
        {(mayDirectSend || (canUpdate && o.status === 'approved')) && <Button onClick={() => setConfirmSend(true)}>Send to supplier</Button>}
        {canUpdate && editable && (
          <Button variant="secondary" onClick={() => setEditingLines(true)} disabled={listings.isPending}>
            Change lines…
          </Button>
        )}
        {canApprove && o.status === 'awaiting_approval' && (
          <>
            <Button loading={approve.isPending} onClick={() => approve.mutate(o.id, { onError: fail })}>
              Approve
            </Button>
            <Button variant="secondary" onClick={() => setReason('reject')}>
              Reject…
            </Button>
          </>
        )}
        {canReceive && (o.status === 'sent' || o.status === 'partly_received') && <Button onClick={() => setReceiving(true)}>Receive goods…</Button>}
        {canUpdate && (o.status === 'sent' || o.status === 'partly_received') && (
          <Button variant="secondary" onClick={() => setReason('close')}>
            Close back-order…
          </Button>
        )}
        {canUpdate && ['draft', 'awaiting_approval', 'approved', 'sent'].includes(o.status) && (
          <Button variant="secondary" onClick={() => setReason('cancel')}>
            Cancel order…
          </Button>
        )}
      </div>

      <div className="relative overflow-x-auto">
        <table className="w-full border-collapse text-left">
          <caption className="sr-only">Lines of {o.reference}</caption>
          <thead>
            <tr className="border-b-2 border-line">
              <th scope="col" className="p-2">Part</th>
              <th scope="col" className="p-2">Their number</th>
              <th scope="col" className="p-2 text-right">Ordered</th>
              <th scope="col" className="p-2 text-right">Received</th>
              <th scope="col" className="p-2 text-right">Outstanding</th>
              <th scope="col" className="p-2 text-right">Unit price</th>
              <th scope="col" className="p-2 text-right">Line total</th>
            </tr>
          </thead>
          <tbody>
            {o.lines.map((l) => (
              <tr key={l.id} className="border-b border-line">
                <td className="p-2">
                  <PartNumber>{l.partNumber}</PartNumber> <span className="text-ink-muted">{l.description}</span>
                  {l.purpose && <div className="text-sm font-bold">{l.purpose}</div>}
                  {l.coreDepositMinor > 0 && <div className="text-sm">Core deposit {money(l.coreDepositMinor, o.currency)} a unit</div>}
                  {canUpdate && l.receivedQuantity > 0 && (
                    <div className="mt-1">
                      <Button size="sm" variant="secondary" aria-label={`Return ${l.partNumber}`} onClick={() => setReturning(l)}>
                        Return…
                      </Button>
                    </div>
                  )}
                </td>
                <td className="p-2 font-mono">{l.supplierNumber ?? '—'}</td>
                <td className="p-2 text-right">
                  <Num>{l.quantity}</Num>
                </td>
                <td className="p-2 text-right">
                  <Num>{l.receivedQuantity}</Num>
                </td>
                <td className="p-2 text-right">
                  <Num>{l.outstandingQuantity}</Num>
                  {l.cancelledQuantity > 0 && <div className="text-sm">{l.cancelledQuantity} closed</div>}
                </td>
                <td className="p-2 text-right">
                  <Num>{money(l.unitPriceMinor, o.currency)}</Num>
                </td>
                <td className="p-2 text-right">
                  <Num>{money(l.lineTotalMinor, o.currency)}</Num>
                </td>
              </tr>
            ))}
          </tbody>
          <tfoot>
            <tr>
              <th scope="row" colSpan={6} className="p-2 text-right">
                Total
              </th>
              <td className="p-2 text-right font-bold">
                <Num>{money(o.totalMinor, o.currency)}</Num>
                {foreign && (
                  <div className="text-sm font-normal">
                    = {money(o.totalShopMinor, o.shopCurrency)} at {o.exchangeRate}
                  </div>
                )}
              </td>
            </tr>
          </tfoot>
        </table>
      </div>

      {o.receipts.length > 0 && (
        <section>
          <div className="mb-2 flex flex-wrap items-center justify-between gap-3">
            <h2 className="text-lg font-bold">Received</h2>
            {labelsAction && arrived.length > 0 && labelsAction(arrived)}
          </div>
          <ul className="flex flex-col gap-1">
            {o.receipts.map((r) => {
              const line = o.lines.find((l) => l.id === r.lineId);
              return (
                <li key={r.id}>
                  {r.receivedAt.slice(0, 10)}: <Num>{r.quantity}</Num> × <PartNumber>{line?.partNumber ?? ''}</PartNumber> into bin <span className="font-mono">{r.binCode}</span> at {money(r.unitCostShopMinor, o.shopCurrency)} each
                </li>
              );
            })}
          </ul>
        </section>
      )}

      {editingLines && (
        <OrderLinesDialog
          shopId={shopId}
          supplier={{ id: o.supplierId, name: o.supplierName, currency: o.currency }}
          shopCurrency={settings.data?.currency ?? o.shopCurrency}
          listings={listings.data?.listings ?? []}
          order={o}
          onClose={() => setEditingLines(false)}
        />
      )}
      {reason && <ReasonDialog shopId={shopId} order={o} action={reason} onClose={() => setReason(null)} />}
      {receiving && <ReceiveDialog shopId={shopId} order={o} onClose={() => setReceiving(false)} />}
      {returning && <ReturnDialog shopId={shopId} order={o} line={returning} onClose={() => setReturning(null)} />}
      <ConfirmDialog
        open={confirmSend}
        title={`Send ${o.reference} to ${o.supplierName}?`}
        message={o.supplierEmail ? `The order PDF goes by e-mail to ${o.supplierEmail}. It cannot be changed afterwards.` : 'Add an e-mail address to the supplier first.'}
        confirmLabel="Send order"
        loading={send.isPending}
        onCancel={() => setConfirmSend(false)}
        onConfirm={() =>
          send.mutate(o.id, {
            onSuccess: (r) => {
              setConfirmSend(false);
              toast.show(r.message, r.emailed ? 'ok' : 'fail');
            },
            onError: (e) => {
              setConfirmSend(false);
              fail(e);
            },
          })
        }
      />
    </div>
  );
}
