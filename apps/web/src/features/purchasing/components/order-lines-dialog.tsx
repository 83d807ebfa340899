import type { Listing, PurchaseOrder } from '@tappet/contracts';
import { Button, Dialog, FormDialogFooter, FormMessage, TextField } from '@tappet/ui';
import { minorUnitExponent, parseMinorUnits } from '@tappet/domain';
import { useId, useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { partFor } from '../api/find-part';
import { createOrder, updateOrder } from '../api/write-purchasing';
import { usePurchasingMutation } from '../api/purchasing-mutation';

/** One line being written: what a person typed, and what it was (part, special order) when it came from the order. */
interface Row {
  key: number;
  partNumber: string;
  partId: string | null;
  quantity: string;
  price: string;
  core: string;
  purpose: string | null;
  specialOrderId: string | null;
}

const emptyRow = (key: number): Row => ({ key, partNumber: '', partId: null, quantity: '', price: '', core: '', purpose: null, specialOrderId: null });

/** "12.50" for 1250 minor units of a currency. */
function decimal(minor: number, currency: string): string {
  const exp = minorUnitExponent(currency);
  return exp === 0 ? String(minor) : (minor / 10 ** exp).toFixed(exp);
}

export interface OrderLinesDialogProps {
  shopId: string;
  supplier: { id: string; name: string; currency: string };
  shopCurrency: string;
  /** The supplier's listings: a line left without a price takes the listed one. */
  listings: Listing[];
  /** The order to change; without it a new draft is written. */
  order?: PurchaseOrder;
  onClose: () => void;
}

/**
 * Writes a draft order by hand, or changes the lines of one that is not sent yet: part number,
 * quantity, unit price (blank = the supplier's listed price) and core deposit per line; lines can
 * be added and removed. Nothing typed is lost when the server refuses.
 */
export function OrderLinesDialog({ shopId, supplier, shopCurrency, listings, order, onClose }: OrderLinesDialogProps) {
  const formId = useId();
  const [rows, setRows] = useState<Row[]>(() =>
    order
      ? order.lines.map((l, i) => ({
        key: i + 1,
        partNumber: l.partNumber,
        partId: l.partId,
        quantity: String(l.quantity),
        price: decimal(l.unitPriceMinor, order.currency),
        core: l.coreDepositMinor > 0 ? decimal(l.coreDepositMinor, order.currency) : '',
        purpose: l.purpose,
        specialOrderId: l.specialOrderId,
      }))
      : [emptyRow(1)],
  );
  const [note, setNote] = useState(order?.note ?? '');
  const [rate, setRate] = useState(order && order.currency !== shopCurrency ? order.exchangeRate : '');
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [checking, setChecking] = useState(false);
  const create = usePurchasingMutation(shopId, createOrder);
  const update = usePurchasingMutation(shopId, updateOrder);
  const navigate = useNavigate();
  const foreign = supplier.currency !== shopCurrency;
  const byPart = new Map(listings.map((l) => [l.partId, l]));

  const change = (key: number, patch: Partial<Row>) => setRows((old) => old.map((r) => (r.key === key ? { ...r, ...patch } : r)));
  const addRow = () => setRows((old) => [...old, emptyRow(Math.max(0, ...old.map((r) => r.key)) + 1)]);
  const removeRow = (key: number) => setRows((old) => old.filter((r) => r.key !== key));

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const found: Record<string, string> = {};
    if (rows.length === 0) found['form'] = 'Add at least one line.';
    const exp = minorUnitExponent(supplier.currency);
    const lines: Array<Record<string, unknown>> = [];
    setChecking(true);
    try {
      for (const [i, r] of rows.entries()) {
        let partId = r.partId;
        if (!partId) {
          const part = await partFor(shopId, r.partNumber);
          if (typeof part === 'string') found[`part-${r.key}`] = part;
          else {
            partId = part.id;
            change(r.key, { partId: part.id, partNumber: part.number });
          }
        }
        const quantity = Number(r.quantity.trim());
        if (!/^\d+$/.test(r.quantity.trim()) || quantity < 1) found[`qty-${r.key}`] = 'Order a whole number, at least 1.';
        let unitPriceMinor: number | undefined;
        if (r.price.trim()) {
          try {
            unitPriceMinor = parseMinorUnits(r.price.trim(), exp);
          } catch {
            found[`price-${r.key}`] = `Write the price in ${supplier.currency} like 12.50.`;
          }
        } else if (partId && !byPart.has(partId)) found[`price-${r.key}`] = `${supplier.name} does not list this part: enter its price.`;
        let coreDepositMinor = 0;
        if (r.core.trim()) {
          try {
            coreDepositMinor = parseMinorUnits(r.core.trim(), exp);
          } catch {
            found[`core-${r.key}`] = `Write the deposit in ${supplier.currency} like 25.00, or leave it blank.`;
          }
        }
        if (partId) lines.push({ partId, quantity, ...(unitPriceMinor !== undefined ? { unitPriceMinor } : {}), coreDepositMinor, purpose: r.purpose, specialOrderId: r.specialOrderId, line: i });
      }
      if (foreign && !/^\d+(\.\d+)?$/.test(rate.trim())) found['rate'] = `Enter the rate: ${shopCurrency} for 1 ${supplier.currency}, e.g. 0.8571.`;
    } finally {
      setChecking(false);
    }
    setErrors(found);
    if (Object.keys(found).length > 0) return;
    const body = {
      lines: lines.map(({ line: _line, ...l }) => l),
      note: note.trim() ? note.trim() : null,
      ...(foreign ? { exchangeRate: rate.trim() } : {}),
    };
    const onError = (e: unknown) => setErrors({ form: errorMessage(e) });
    if (order) update.mutate({ orderId: order.id, body }, { onSuccess: onClose, onError });
    else create.mutate({ supplierId: supplier.id, ...body }, { onSuccess: (o) => navigate(paths.shop.purchasingOrder.getHref(shopId, o.id)), onError });
  }

  return (
    <Dialog
      open
      onClose={onClose}
      title={order ? `Change ${order.reference}` : `Write an order to ${supplier.name}`}
      description={order && order.status !== 'draft' ? 'Changing it sends it back to draft: it needs approving or sending again.' : `Prices in ${supplier.currency}; leave a price blank for the listed one.`}
      footer={<FormDialogFooter formId={formId} submitLabel={order ? 'Save lines' : 'Write draft'} loading={checking || create.isPending || update.isPending} onCancel={onClose} />}
    >
      <form id={formId} noValidate onSubmit={(e) => void onSubmit(e)} className="flex flex-col gap-4">
        {errors['form'] && <FormMessage>{errors['form']}</FormMessage>}
        {rows.map((r, i) => {
          const listed = r.partId ? byPart.get(r.partId) : undefined;
          return (
            <fieldset key={r.key} className="grid gap-3 border-b border-line pb-4 sm:grid-cols-2">
              <legend className="mb-1 flex w-full flex-wrap items-center justify-between gap-2 font-bold">
                <span>
                  Line {i + 1}
                  {r.purpose && <span className="ml-2 font-normal text-ink-muted">{r.purpose}</span>}
                </span>
                <Button size="sm" variant="secondary" onClick={() => removeRow(r.key)} aria-label={`Remove line ${i + 1}`}>
                  Remove
                </Button>
              </legend>
              <TextField
                label={`Part number, line ${i + 1}`}
                value={r.partNumber}
                onChange={(e) => change(r.key, { partNumber: e.target.value, partId: null, specialOrderId: null, purpose: null })}
                error={errors[`part-${r.key}`]}
                className="font-mono"
                autoComplete="off"
                hint={r.specialOrderId ? 'Bought for a job: changing the part unlinks it.' : undefined}
              />
              <TextField label={`Quantity, line ${i + 1}`} value={r.quantity} onChange={(e) => change(r.key, { quantity: e.target.value })} inputMode="numeric" error={errors[`qty-${r.key}`]} autoComplete="off" hint={listed && listed.packSize > 1 ? `Packs of ${listed.packSize}` : undefined} />
              <TextField
                label={`Unit price (${supplier.currency}), line ${i + 1}`}
                value={r.price}
                onChange={(e) => change(r.key, { price: e.target.value })}
                inputMode="decimal"
                error={errors[`price-${r.key}`]}
                autoComplete="off"
                hint={listed ? `Listed at ${decimal(listed.priceMinor, supplier.currency)}` : undefined}
              />
              <TextField label={`Core deposit a unit (${supplier.currency}), line ${i + 1}`} value={r.core} onChange={(e) => change(r.key, { core: e.target.value })} inputMode="decimal" error={errors[`core-${r.key}`]} autoComplete="off" hint="Refundable when the old part goes back." />
            </fieldset>
          );
        })}
        <div>
          <Button variant="secondary" onClick={addRow}>
            Add a line
          </Button>
        </div>
        {foreign && <TextField label={`Exchange rate (${shopCurrency} per 1 ${supplier.currency})`} value={rate} onChange={(e) => setRate(e.target.value)} inputMode="decimal" error={errors['rate']} autoComplete="off" />}
        <TextField label="Note on the order (optional)" value={note} onChange={(e) => setNote(e.target.value)} autoComplete="off" />
      </form>
    </Dialog>
  );
}
