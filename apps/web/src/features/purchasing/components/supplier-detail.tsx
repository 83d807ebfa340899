import type { Listing, Supplier } from '@tappet/contracts';
import { Button, createColumnHelper, DataTable, Dialog, EmptyState, ErrorState, FormDialogFooter, FormMessage, LoadingState, Num, PartNumber, TextField, useToast } from '@tappet/ui';
import { minorUnitExponent, parseMinorUnits } from '@tappet/domain';
import { useId, useMemo, useState, type FormEvent } from 'react';
import { useNavigate } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { useCan } from '../../../lib/ability';
import { ApiError, errorMessage } from '../../../lib/api-client';
import { useListings } from '../api/get-listings';
import { useSuppliers } from '../api/get-suppliers';
import { resolveNumber } from '../api/resolve-number';
import { createListing, createOrder, usePurchasingMutation } from '../api/write-purchasing';
import { money } from './words';

const column = createColumnHelper<Listing>();

/** The catalogue part a typed number names, or an error message for the field. */
async function partFor(shopId: string, number: string): Promise<{ id: string } | string> {
  if (!number.trim()) return 'Enter the part number.';
  try {
    const found = await resolveNumber(shopId, number.trim());
    return found.part ? { id: found.part.id } : `No part numbered ${number.trim()} in the catalogue.`;
  } catch (error) {
    return error instanceof ApiError && error.status === 404 ? `No part numbered ${number.trim()} in the catalogue.` : errorMessage(error);
  }
}

/** Adds a listing: which part, their number, price, pack size, minimum order, own lead time. */
function ListingDialog({ shopId, supplier, onClose }: { shopId: string; supplier: Supplier; onClose: () => void }) {
  const formId = useId();
  const create = usePurchasingMutation(shopId, createListing);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const toast = useToast();
  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const f = new FormData(event.currentTarget);
    const text = (k: string) => String(f.get(k) ?? '').trim();
    const next: Record<string, string> = {};
    const part = await partFor(shopId, text('partNumber'));
    if (typeof part === 'string') next['partNumber'] = part;
    let priceMinor = 0;
    try {
      priceMinor = parseMinorUnits(text('price'), minorUnitExponent(supplier.currency));
    } catch {
      next['price'] = `Write the price in ${supplier.currency} like 12.50.`;
    }
    const packSize = Number(text('packSize') || '1');
    if (!Number.isInteger(packSize) || packSize < 1) next['packSize'] = 'A pack holds a whole number, at least 1.';
    const minOrderQty = Number(text('minOrderQty') || '0');
    if (!Number.isInteger(minOrderQty) || minOrderQty < 0) next['minOrderQty'] = 'Use a whole number, 0 or more.';
    setErrors(next);
    if (Object.keys(next).length > 0 || typeof part === 'string') return;
    create.mutate(
      { supplierId: supplier.id, body: { partId: part.id, supplierNumber: text('supplierNumber') || null, priceMinor, packSize, minOrderQty } },
      {
        onSuccess: (l) => {
          toast.show(`${supplier.name} now lists ${l.partNumber}.`, 'ok');
          onClose();
        },
        onError: (e) => setErrors({ form: errorMessage(e) }),
      },
    );
  }
  return (
    <Dialog open onClose={onClose} title={`Add a listing to ${supplier.name}`} footer={<FormDialogFooter formId={formId} submitLabel="Add listing" loading={create.isPending} onCancel={onClose} />}>
      <form id={formId} noValidate onSubmit={(e) => void onSubmit(e)} className="flex flex-col gap-4">
        {errors['form'] && <FormMessage>{errors['form']}</FormMessage>}
        <TextField label="Our part number" name="partNumber" error={errors['partNumber']} className="font-mono" autoComplete="off" />
        <TextField label="Their number (optional)" name="supplierNumber" className="font-mono" autoComplete="off" />
        <TextField label={`Price (${supplier.currency})`} name="price" inputMode="decimal" error={errors['price']} />
        <TextField label="Pack size" name="packSize" inputMode="numeric" defaultValue="1" error={errors['packSize']} />
        <TextField label="Minimum order quantity" name="minOrderQty" inputMode="numeric" defaultValue="0" error={errors['minOrderQty']} />
      </form>
    </Dialog>
  );
}

/** Writes a draft order by hand: one line per listed part with a quantity. */
function OrderDialog({ shopId, supplier, listings, onClose }: { shopId: string; supplier: Supplier; listings: Listing[]; onClose: () => void }) {
  const formId = useId();
  const create = usePurchasingMutation(shopId, createOrder);
  const navigate = useNavigate();
  const [error, setError] = useState<string | null>(null);
  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const f = new FormData(event.currentTarget);
    const lines: Array<{ partId: string; quantity: number }> = [];
    for (const l of listings) {
      const raw = String(f.get(`qty-${l.id}`) ?? '').trim();
      if (!raw) continue;
      const quantity = Number(raw);
      if (!Number.isInteger(quantity) || quantity < 1) return setError(`${l.partNumber}: order a whole number, at least 1.`);
      lines.push({ partId: l.partId, quantity });
    }
    if (lines.length === 0) return setError('Enter a quantity on at least one line.');
    const rate = String(f.get('exchangeRate') ?? '').trim();
    create.mutate({ supplierId: supplier.id, lines, ...(rate ? { exchangeRate: rate } : {}) }, { onSuccess: (o) => navigate(paths.shop.purchasingOrder.getHref(shopId, o.id)), onError: (e) => setError(errorMessage(e)) });
  }
  return (
    <Dialog open onClose={onClose} title={`Write an order to ${supplier.name}`} description="At the listed prices; the order starts as a draft." footer={<FormDialogFooter formId={formId} submitLabel="Write draft" loading={create.isPending} onCancel={onClose} />}>
      <form id={formId} noValidate onSubmit={onSubmit} className="flex flex-col gap-3">
        {error && <FormMessage>{error}</FormMessage>}
        {supplier.currency !== (listings[0]?.shopCurrency ?? supplier.currency) && <TextField label={`Exchange rate (shop currency per 1 ${supplier.currency})`} name="exchangeRate" inputMode="decimal" hint="As on the day, e.g. 0.8571." />}
        {listings.slice(0, 40).map((l) => (
          <TextField key={l.id} label={`Quantity of ${l.partNumber}${l.packSize > 1 ? ` (packs of ${l.packSize})` : ''}`} name={`qty-${l.id}`} inputMode="numeric" autoComplete="off" />
        ))}
      </form>
    </Dialog>
  );
}

/** One supplier: terms and listings; owners and buyers add listings and write orders by hand. */
export function SupplierDetail({ shopId, supplierId }: { shopId: string; supplierId: string }) {
  const suppliers = useSuppliers(shopId);
  const listings = useListings(shopId, supplierId);
  const canUpdate = useCan('update', 'Supplier', { shopId });
  const canOrder = useCan('create', 'PurchaseOrder', { shopId });
  const [dialog, setDialog] = useState<'listing' | 'order' | null>(null);
  const supplier = suppliers.data?.suppliers.find((s) => s.id === supplierId);
  const columns = useMemo(
    () => [
      column.accessor('partNumber', { header: 'Part', cell: (info) => <PartNumber>{info.getValue()}</PartNumber> }),
      column.accessor('partDescription', { header: 'Description' }),
      column.accessor('supplierNumber', { header: 'Their number', cell: (info) => <span className="font-mono">{info.getValue() ?? '—'}</span> }),
      column.accessor('priceMinor', { header: 'Price', meta: { numeric: true }, cell: (info) => <Num>{money(info.getValue(), info.row.original.currency)}</Num> }),
      column.accessor('packSize', { header: 'Pack', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('minOrderQty', { header: 'Minimum', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('lastPaidUnitMinor', {
        header: 'Last paid',
        meta: { numeric: true },
        cell: (info) => (info.getValue() === null ? '—' : <Num>{`${money(info.getValue(), info.row.original.shopCurrency)} on ${info.row.original.lastPaidAt?.slice(0, 10) ?? ''}`}</Num>),
      }),
      column.accessor('preferred', { header: 'Preferred', cell: (info) => (info.getValue() ? 'Yes' : '') }),
    ],
    [],
  );
  if (suppliers.isPending || listings.isPending) return <LoadingState label="Loading the supplier…" />;
  if (suppliers.isError) return <ErrorState message={errorMessage(suppliers.error)} onRetry={() => void suppliers.refetch()} />;
  if (listings.isError) return <ErrorState message={errorMessage(listings.error)} onRetry={() => void listings.refetch()} />;
  if (!supplier) return <EmptyState title="No such supplier">It may have been removed, or the link is wrong.</EmptyState>;
  return (
    <>
      <dl className="mb-4 grid gap-x-6 gap-y-1 sm:grid-cols-[max-content_1fr]">
        <dt className="font-bold">Order e-mail</dt>
        <dd>{supplier.email ?? 'none: add one before sending orders'}</dd>
        <dt className="font-bold">Currency</dt>
        <dd className="font-mono">{supplier.currency}</dd>
        <dt className="font-bold">Lead time</dt>
        <dd>
          {supplier.leadTimeDays} days{supplier.leadTimeSdDays ? ` ± ${supplier.leadTimeSdDays}` : ''}
        </dd>
        <dt className="font-bold">Minimum order</dt>
        <dd>{money(supplier.minOrderValueMinor, supplier.currency)}</dd>
      </dl>
      <div className="mb-4 flex flex-wrap gap-3">
        {canUpdate && <Button onClick={() => setDialog('listing')}>Add a listing</Button>}
        {canOrder && listings.data.listings.length > 0 && (
          <Button variant="secondary" onClick={() => setDialog('order')}>
            Write an order
          </Button>
        )}
      </div>
      {listings.data.listings.length === 0 ? (
        <EmptyState title="No listings yet">Add the parts this supplier sells, or import their price list on the suppliers page.</EmptyState>
      ) : (
        <DataTable caption={`Listings of ${supplier.name}`} columns={columns} data={listings.data.listings} filterLabel="Filter listings" getRowId={(l) => l.id} />
      )}
      {dialog === 'listing' && <ListingDialog shopId={shopId} supplier={supplier} onClose={() => setDialog(null)} />}
      {dialog === 'order' && <OrderDialog shopId={shopId} supplier={supplier} listings={listings.data.listings} onClose={() => setDialog(null)} />}
    </>
  );
}
