import type { Listing, Supplier } from '@tappet/contracts';
import { Badge, Button, ConfirmDialog, createColumnHelper, DataTable, Dialog, EmptyState, ErrorState, FormDialogFooter, FormMessage, LoadingState, MenuButton, Num, PartNumber, TextField, useToast } from '@tappet/ui';
import { minorUnitExponent, parseMinorUnits } from '@tappet/domain';
import { useId, useMemo, useState, type FormEvent } from 'react';
import { useCan } from '../../../lib/ability';
import { useSettings } from '../../../lib/shop-settings';
import { errorMessage } from '../../../lib/api-client';
import { partFor } from '../api/find-part';
import { useListings } from '../api/get-listings';
import { useSuppliers } from '../api/get-suppliers';
import { createListing, deleteListing, updateListing } from '../api/write-purchasing';
import { usePurchasingMutation } from '../api/purchasing-mutation';
import { OrderLinesDialog } from './order-lines-dialog';
import { SupplierDialog } from './suppliers-list';
import { money } from './words';

const column = createColumnHelper<Listing>();

/** Adds a listing, or changes one: their number, price, pack size, minimum order, own lead time. */
function ListingDialog({ shopId, supplier, listing, onClose }: { shopId: string; supplier: Supplier; listing?: Listing; onClose: () => void }) {
  const formId = useId();
  const create = usePurchasingMutation(shopId, createListing);
  const update = usePurchasingMutation(shopId, updateListing);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const toast = useToast();
  const exp = minorUnitExponent(supplier.currency);
  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const f = new FormData(event.currentTarget);
    const text = (k: string) => String(f.get(k) ?? '').trim();
    const next: Record<string, string> = {};
    const part = listing ? { id: listing.partId, number: listing.partNumber } : await partFor(shopId, text('partNumber'));
    if (typeof part === 'string') next['partNumber'] = part;
    let priceMinor = 0;
    try {
      priceMinor = parseMinorUnits(text('price'), exp);
    } catch {
      next['price'] = `Write the price in ${supplier.currency} like 12.50.`;
    }
    const packSize = Number(text('packSize') || '1');
    if (!Number.isInteger(packSize) || packSize < 1) next['packSize'] = 'A pack holds a whole number, at least 1.';
    const minOrderQty = Number(text('minOrderQty') || '0');
    if (!Number.isInteger(minOrderQty) || minOrderQty < 0) next['minOrderQty'] = 'Use a whole number, 0 or more.';
    const leadTimeDays = text('leadTimeDays') === '' ? null : Number(text('leadTimeDays'));
    if (leadTimeDays !== null && (!Number.isInteger(leadTimeDays) || leadTimeDays < 0)) next['leadTimeDays'] = 'Use a whole number of days, or leave it blank for the supplier’s.';
    setErrors(next);
    if (Object.keys(next).length > 0 || typeof part === 'string') return;
    const body = { supplierNumber: text('supplierNumber') || null, priceMinor, packSize, minOrderQty, leadTimeDays };
    const done = {
      onSuccess: (l: Listing) => {
        toast.show(listing ? `Listing of ${l.partNumber} saved.` : `${supplier.name} now lists ${l.partNumber}.`, 'ok');
        onClose();
      },
      onError: (e: unknown) => setErrors({ form: errorMessage(e) }),
    };
    if (listing) update.mutate({ listingId: listing.id, body }, done);
    else create.mutate({ supplierId: supplier.id, body: { partId: part.id, ...body } }, done);
  }
  return (
    <Dialog
      open
      onClose={onClose}
      title={listing ? `Change the listing of ${listing.partNumber}` : `Add a listing to ${supplier.name}`}
      footer={<FormDialogFooter formId={formId} submitLabel={listing ? 'Save listing' : 'Add listing'} loading={create.isPending || update.isPending} onCancel={onClose} />}
    >
      <form id={formId} noValidate onSubmit={(e) => void onSubmit(e)} className="flex flex-col gap-4">
        {errors['form'] && <FormMessage>{errors['form']}</FormMessage>}
        {!listing && <TextField label="Our part number" name="partNumber" error={errors['partNumber']} className="font-mono" autoComplete="off" />}
        <TextField label="Their number (optional)" name="supplierNumber" defaultValue={listing?.supplierNumber ?? ''} className="font-mono" autoComplete="off" />
        <TextField label={`Price (${supplier.currency})`} name="price" inputMode="decimal" defaultValue={listing ? (listing.priceMinor / 10 ** exp).toFixed(exp) : ''} error={errors['price']} />
        <TextField label="Pack size" name="packSize" inputMode="numeric" defaultValue={String(listing?.packSize ?? 1)} error={errors['packSize']} />
        <TextField label="Minimum order quantity" name="minOrderQty" inputMode="numeric" defaultValue={String(listing?.minOrderQty ?? 0)} error={errors['minOrderQty']} />
        <TextField
          label="Lead time for this part (days, optional)"
          name="leadTimeDays"
          inputMode="numeric"
          defaultValue={listing?.leadTimeDays === null || listing?.leadTimeDays === undefined ? '' : String(listing.leadTimeDays)}
          hint={`Blank: the supplier's ${supplier.leadTimeDays} days.`}
          error={errors['leadTimeDays']}
        />
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
  const [dialog, setDialog] = useState<'listing' | 'order' | 'supplier' | null>(null);
  const [editing, setEditing] = useState<Listing | null>(null);
  const [removing, setRemoving] = useState<Listing | null>(null);
  const remove = usePurchasingMutation(shopId, deleteListing);
  const settings = useSettings(shopId);
  const toast = useToast();
  const supplier = suppliers.data?.suppliers.find((s) => s.id === supplierId);
  const columns = useMemo(
    () => [
      // The description and the preferred mark under the number, and the actions in one menu: the
      // table fits a tablet in landscape.
      column.accessor((row) => `${row.partNumber} ${row.partDescription}`, {
        id: 'part',
        header: 'Part',
        cell: (info) => (
          <>
            <PartNumber>{info.row.original.partNumber}</PartNumber>
            <span className="block">{info.row.original.partDescription}</span>
            {info.row.original.preferred && <Badge className="mt-1">Preferred supplier</Badge>}
          </>
        ),
      }),
      column.accessor('supplierNumber', { header: 'Their number', cell: (info) => <span className="font-mono">{info.getValue() ?? '—'}</span> }),
      column.accessor('priceMinor', { header: 'Price', meta: { numeric: true }, cell: (info) => <Num>{money(info.getValue(), info.row.original.currency)}</Num> }),
      column.accessor('packSize', { header: 'Pack', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('minOrderQty', { header: 'Minimum', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('lastPaidUnitMinor', {
        header: 'Last paid',
        meta: { numeric: true },
        cell: (info) => (info.getValue() === null ? '—' : <Num>{`${money(info.getValue(), info.row.original.shopCurrency)} on ${info.row.original.lastPaidAt?.slice(0, 10) ?? ''}`}</Num>),
      }),
      ...(canUpdate
        ? [
            column.display({
              id: 'actions',
              header: () => <span className="sr-only">Actions</span>,
              cell: (info) => (
                <MenuButton
                  label="Actions"
                  accessibleLabel={`Actions for the listing of ${info.row.original.partNumber}`}
                  items={[
                    { key: 'change', label: 'Change the listing', onSelect: () => setEditing(info.row.original) },
                    { key: 'remove', label: 'Remove the listing', onSelect: () => setRemoving(info.row.original) },
                  ]}
                />
              ),
            }),
          ]
        : []),
    ],
    [canUpdate],
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
        {canUpdate && (
          <Button variant="secondary" onClick={() => setDialog('supplier')}>
            Change supplier details
          </Button>
        )}
        {canOrder && (
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
      {dialog === 'order' && <OrderLinesDialog shopId={shopId} supplier={supplier} shopCurrency={settings.data?.currency ?? listings.data.listings[0]?.shopCurrency ?? supplier.currency} listings={listings.data.listings} onClose={() => setDialog(null)} />}
      {dialog === 'supplier' && <SupplierDialog shopId={shopId} supplier={supplier} onClose={() => setDialog(null)} />}
      {editing && <ListingDialog shopId={shopId} supplier={supplier} listing={editing} onClose={() => setEditing(null)} />}
      <ConfirmDialog
        open={removing !== null}
        title={`Remove the listing of ${removing?.partNumber ?? ''}?`}
        message={`${supplier.name} will no longer be suggested for this part. Orders already written keep their lines.`}
        confirmLabel="Remove listing"
        loading={remove.isPending}
        onCancel={() => setRemoving(null)}
        onConfirm={() =>
          removing &&
          remove.mutate(removing.id, {
            onSuccess: () => {
              toast.show(`Listing of ${removing.partNumber} removed.`, 'ok');
              setRemoving(null);
            },
            onError: (e) => {
              setRemoving(null);
              toast.show(errorMessage(e), 'fail');
            },
          })
        }
      />
    </>
  );
}
