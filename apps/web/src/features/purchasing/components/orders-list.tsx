import { purchaseOrderListLimit, purchaseOrderStatuses, type PurchaseOrderStatus } from '@tappet/contracts';
import { createColumnHelper, DataTable, EmptyState, ErrorState, LoadingState, Num, Select, StatusPill } from '@tappet/ui';
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { useOrders, type OrderSummary } from '../api/get-orders';
import { useSuppliers } from '../api/get-suppliers';
import { money, orderStatusWords } from './words';

const column = createColumnHelper<OrderSummary>();

/** Purchase orders, newest first, narrowed by state and supplier. */
export function OrdersList({ shopId }: { shopId: string }) {
  const [status, setStatus] = useState<PurchaseOrderStatus | null>(null);
  const [supplierId, setSupplierId] = useState<string | null>(null);
  const orders = useOrders(shopId, { status, supplierId });
  const suppliers = useSuppliers(shopId);
  const columns = useMemo(
    () => [
      column.accessor('reference', {
        header: 'Order',
        meta: { cellClassName: 'whitespace-nowrap' },
        cell: (info) => (
          <Link to={paths.shop.purchasingOrder.getHref(shopId, info.row.original.id)} className="font-mono text-accent">
            {info.getValue()}
          </Link>
        ),
      }),
      column.accessor('supplierName', { header: 'Supplier' }),
      column.accessor('status', { header: 'State', cell: (info) => <StatusPill status={orderStatusWords[info.getValue()].status} label={orderStatusWords[info.getValue()].label} /> }),
      column.accessor('lineCount', { header: 'Lines', meta: { numeric: true }, cell: (info) => <Num>{info.getValue()}</Num> }),
      column.accessor('totalMinor', { header: 'Total', meta: { numeric: true }, cell: (info) => <Num>{money(info.getValue(), info.row.original.currency)}</Num> }),
      column.accessor('createdAt', { header: 'Written', meta: { cellClassName: 'whitespace-nowrap' }, cell: (info) => info.getValue().slice(0, 10) }),
    ],
    [shopId],
  );
  return (
    <>
      <div className="mb-4 flex flex-wrap gap-4">
        <div className="w-full max-w-xs">
          <Select
            label="State"
            value={status ?? ''}
            onChange={(e) => setStatus((e.target.value || null) as PurchaseOrderStatus | null)}
            options={[{ value: '', label: 'Every state' }, ...purchaseOrderStatuses.map((s) => ({ value: s, label: orderStatusWords[s].label }))]}
          />
        </div>
        <div className="w-full max-w-xs">
          <Select
            label="Supplier"
            value={supplierId ?? ''}
            onChange={(e) => setSupplierId(e.target.value || null)}
            disabled={!suppliers.data}
            options={[{ value: '', label: suppliers.isError ? 'Every supplier (the list could not load)' : 'Every supplier' }, ...(suppliers.data?.suppliers ?? []).map((s) => ({ value: s.id, label: s.name }))]}
          />
        </div>
      </div>
      {orders.isPending ? (
        <LoadingState label="Loading orders…" />
      ) : orders.isError ? (
        <ErrorState message={errorMessage(orders.error)} onRetry={() => void orders.refetch()} />
      ) : orders.data.orders.length === 0 ? (
        <EmptyState title="No orders here">Draft orders from the reorder list, or pick another state or supplier.</EmptyState>
      ) : (
        <>
          {orders.data.truncated && (
            <p role="status" className="mb-4 rounded-md border-2 border-advise bg-advise-soft p-3">
              Showing the newest {purchaseOrderListLimit} orders. Pick a state or a supplier to see older ones.
            </p>
          )}
          <DataTable caption="Purchase orders" columns={columns} data={orders.data.orders} filterLabel="Filter orders" getRowId={(o) => o.id} />
        </>
      )}
    </>
  );
}
