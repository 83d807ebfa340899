import type { QueryClient } from '@tanstack/react-query';
import { Button, ErrorState, LoadingState } from '@tappet/ui';
import { useState } from 'react';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { NotFoundContent } from '../../../../../components/errors/not-found';
import { paths } from '../../../../../config/paths';
import { timelineQueryOptions, useVehicle, vehicleQueryOptions } from '../../../../../features/vehicles/api/get-vehicle';
import { VehicleStatusBadge } from '../../../../../features/vehicles/components/status-badge';
import { VehicleFormDialog } from '../../../../../features/vehicles/components/vehicle-form-dialog';
import { VehicleView } from '../../../../../features/vehicles/components/vehicle-view';
import { kindWords, vehicleTitle } from '../../../../../features/vehicles/components/words';
import { useCanSeeVehicleMargin } from '../../../../../features/vehicles/hooks/use-can-see-margin';
import { useCanSetVehicleMoney } from '../../../../../features/vehicles/hooks/use-can-set-money';
import { useCan } from '../../../../../lib/ability';
import { ApiError, errorMessage } from '../../../../../lib/api-client';
import { useFormatMoney, useSettings } from '../../../../../lib/shop-settings';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    if (params.shopId && params.vehicleId) {
      await Promise.all([queryClient.prefetchQuery(vehicleQueryOptions(params.shopId, params.vehicleId)), queryClient.prefetchQuery(timelineQueryOptions(params.shopId, params.vehicleId))]);
    }
    return null;
  };

/** One vehicle: its identification as the hero, status moves, photos, documents, readings, timeline and parts that fit. */
export default function VehicleRoute() {
  const { shopId = '', vehicleId = '' } = useParams();
  const vehicle = useVehicle(shopId, vehicleId);
  const canEdit = useCan('update', 'Vehicle', { shopId });
  const canSetMoney = useCanSetVehicleMoney(shopId);
  const canSeeMargin = useCanSeeVehicleMargin(shopId);
  const canCreateCustomer = useCan('create', 'Customer', { shopId });
  const settings = useSettings(shopId);
  const formatMoney = useFormatMoney(shopId);
  const [editing, setEditing] = useState(false);
  useDocumentTitle(vehicle.data ? `${vehicleTitle(vehicle.data)} · Vehicles` : 'Vehicle');

  if (vehicle.isPending) return <LoadingState label="Loading the vehicle…" />;
  if (vehicle.isError) {
    if (vehicle.error instanceof ApiError && vehicle.error.status === 404) return <NotFoundContent what="vehicle" />;
    return <ErrorState message={errorMessage(vehicle.error)} onRetry={() => void vehicle.refetch()} />;
  }
  const v = vehicle.data;

  return (
    <>
      <div className="mb-6 flex flex-col gap-1">
        <nav aria-label="Breadcrumb" className="text-sm font-bold tracking-wide text-ink-muted uppercase">
          <Link to={paths.shop.vehicles.getHref(shopId)} className="text-accent underline underline-offset-4">
            Vehicles
          </Link>
        </nav>
        <div className="flex flex-wrap items-start justify-between gap-3">
          <div>
            <h1 className="text-xl font-bold">{vehicleTitle(v)}</h1>
            <p className="mt-1 flex flex-wrap items-center gap-2 text-ink-muted">
              {kindWords[v.kind]}
              {v.frameNumber && <span className="font-mono text-ink">{v.frameNumber}</span>}
              <VehicleStatusBadge status={v.status} />
            </p>
          </div>
          {canEdit && (
            <Button variant="secondary" onClick={() => setEditing(true)}>
              Edit vehicle
            </Button>
          )}
        </div>
      </div>
      <VehicleView shopId={shopId} vehicle={v} canEdit={canEdit} shopUnit={settings.data?.distanceUnit ?? 'mi'} formatMoney={formatMoney} partHref={(partId) => paths.shop.part.getHref(shopId, partId)} canSeeMargin={canSeeMargin} />
      {editing && (
        <VehicleFormDialog
          shopId={shopId}
          open
          onClose={() => setEditing(false)}
          vehicle={v}
          currency={settings.data?.currency ?? v.currency}
          distanceUnit={settings.data?.distanceUnit ?? 'mi'}
          canSetMoney={canSetMoney}
          canCreateCustomer={canCreateCustomer}
        />
      )}
    </>
  );
}
