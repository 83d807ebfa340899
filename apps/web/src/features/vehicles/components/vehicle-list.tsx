import { vehicleStatusLabels, vehicleKinds, vehicleStatuses, type VehicleListResponse } from '@tappet/contracts';
import { Button, createColumnHelper, DataTable, EmptyState, ErrorState, LoadingState, PageNav, Num, Select, TextField } from '@tappet/ui';
import { useMemo, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { useVehicles, type VehicleListParams } from '../api/get-vehicles';
import { VehicleStatusBadge } from './status-badge';
import { formatOdometer, kindWords, vehicleTitle } from './words';

type Row = VehicleListResponse['items'][number];
const column = createColumnHelper<Row>();

export interface VehicleListProps {
  shopId: string;
  params: VehicleListParams;
  filtered: boolean;
  onChange: (change: Partial<VehicleListParams>) => void;
  onClear: () => void;
  /** Offered when the shop has no vehicles yet, to those who may add one. */
  emptyAction?: ReactNode;
}

/** The shop's vehicles as a table, filtered by kind, status, marque or a word, paged by the API. */
export function VehicleList({ shopId, params, filtered, onChange, onClear, emptyAction }: VehicleListProps) {
  const vehicles = useVehicles(shopId, params);
  const columns = useMemo(
    () => [
      column.display({
        id: 'vehicle',
        header: 'Vehicle',
        // The kind sits under the title rather than in a column of its own: on a tablet the
        // numbers and the owner need the width more.
        cell: (info) => (
          <span className="flex flex-col">
            <Link to={paths.shop.vehicle.getHref(shopId, info.row.original.id)} className="font-bold text-accent underline-offset-4 hover:underline">
              {vehicleTitle(info.row.original)}
            </Link>
            <span className="text-sm text-ink-muted">{kindWords[info.row.original.kind]}</span>
          </span>
        ),
      }),
      column.display({
        id: 'numbers',
        header: 'Frame / engine',
        cell: (info) => {
          const v = info.row.original;
          if (!v.frameNumber && !v.engineNumber && !v.vin) return <span className="text-ink-muted">—</span>;
          return (
            <span className="flex flex-col font-mono text-sm whitespace-nowrap">
              {v.frameNumber && <span>{v.frameNumber}</span>}
              {v.engineNumber && <span className="text-ink-muted">{v.engineNumber}</span>}
              {!v.frameNumber && v.vin && <span>{v.vin}</span>}
            </span>
          );
        },
      }),
      column.display({ id: 'customer', header: 'Owner / consignor', cell: (info) => info.row.original.customer?.name ?? <span className="text-ink-muted">—</span> }),
      column.accessor('status', { header: 'Status', enableSorting: false, cell: (info) => <VehicleStatusBadge status={info.getValue()} /> }),
      column.display({
        id: 'odometer',
        header: 'Odometer',
        cell: (info) => {
          const r = info.row.original.latestOdometer;
          return r ? <Num>{formatOdometer(r.value, r.unit)}</Num> : <span className="text-ink-muted">—</span>;
        },
      }),
    ],
    [shopId],
  );

  const data = vehicles.data;
  const page = data?.page ?? params.page ?? 1;
  const pageSize = data?.pageSize ?? 25;
  const total = data?.total ?? 0;

  let body: ReactNode;
  if (vehicles.isPending) body = <LoadingState label="Loading vehicles…" />;
  else if (vehicles.isError) body = <ErrorState message={errorMessage(vehicles.error)} onRetry={() => void vehicles.refetch()} />;
  else if (vehicles.data.items.length === 0 && !filtered && page === 1) {
    body = (
      <EmptyState title="No vehicles yet" action={emptyAction}>
        Record each vehicle as it comes in: a customer’s machine, one the shop has bought, or one left on consignment.
        {!emptyAction && ' Ask the owner or a mechanic to add the first one.'}
      </EmptyState>
    );
  } else if (vehicles.data.items.length === 0) {
    body = (
      <EmptyState
        title="No vehicles match these filters"
        action={
          <Button variant="secondary" onClick={onClear}>
            Clear filters
          </Button>
        }
      >
        Try another status or marque, or part of a frame number.
      </EmptyState>
    );
  } else {
    body = (
      <div className="flex flex-col gap-3" aria-busy={vehicles.isPlaceholderData || undefined}>
        <DataTable caption="Vehicles in the shop" columns={columns} data={vehicles.data.items} getRowId={(row) => row.id} pageSize={pageSize} className="[&>div:last-child]:hidden" />
        <PageNav label="Pages of vehicles" noun="Vehicles" page={page} pageSize={pageSize} total={total} onPage={(p) => onChange({ page: p })} />
      </div>
    );
  }

  return (
    <div className="flex flex-col gap-4">
      <form role="search" aria-label="Filter vehicles" className="grid grid-cols-1 items-end gap-3 sm:grid-cols-2 xl:grid-cols-[2fr_1fr_1fr_1fr_auto]" onSubmit={(e) => e.preventDefault()}>
        <TextField
          label="Search"
          type="search"
          placeholder="Model, frame or engine number"
          defaultValue={params.q ?? ''}
          onChange={(e) => onChange({ q: e.currentTarget.value || undefined, page: 1 })}
          autoComplete="off"
        />
        <Select
          label="Kind"
          value={params.kind ?? ''}
          onChange={(e) => onChange({ kind: (e.currentTarget.value || undefined) as VehicleListParams['kind'], page: 1 })}
          options={[{ value: '', label: 'Every kind' }, ...vehicleKinds.map((k) => ({ value: k, label: kindWords[k] }))]}
        />
        <Select
          label="Status"
          value={params.status ?? ''}
          onChange={(e) => onChange({ status: (e.currentTarget.value || undefined) as VehicleListParams['status'], page: 1 })}
          options={[{ value: '', label: 'Every status' }, ...vehicleStatuses.map((s) => ({ value: s, label: vehicleStatusLabels[s] }))]}
        />
        <Select
          label="Marque"
          value={params.marque ?? ''}
          onChange={(e) => onChange({ marque: e.currentTarget.value || undefined, page: 1 })}
          options={[{ value: '', label: 'Every marque' }, ...(data?.marques ?? (params.marque ? [params.marque] : [])).map((m) => ({ value: m, label: m }))]}
        />
        {filtered && (
          <Button variant="secondary" onClick={onClear} type="button">
            Clear filters
          </Button>
        )}
      </form>
      {body}
    </div>
  );
}
