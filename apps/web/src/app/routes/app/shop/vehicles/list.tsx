import type { QueryClient } from '@tanstack/react-query';
import { Button } from '@tappet/ui';
import { useState } from 'react';
import { useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { paths } from '../../../../../config/paths';
import { useVehicles, vehiclesQueryOptions } from '../../../../../features/vehicles/api/get-vehicles';
import { VehicleFormDialog } from '../../../../../features/vehicles/components/vehicle-form-dialog';
import { VehicleList } from '../../../../../features/vehicles/components/vehicle-list';
import { useCanSetVehicleMoney } from '../../../../../features/vehicles/hooks/use-can-set-money';
import { parseVehicleListParams, useVehicleListParams } from '../../../../../features/vehicles/hooks/use-vehicle-list-params';
import { useCan } from '../../../../../lib/ability';
import { useMe } from '../../../../../lib/auth';
import { useSettings } from '../../../../../lib/shop-settings';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

export const clientLoader =
  (queryClient: QueryClient) =>
  ({ params, request }: LoaderFunctionArgs) => {
    if (params.shopId) void queryClient.prefetchQuery(vehiclesQueryOptions(params.shopId, parseVehicleListParams(new URL(request.url).searchParams)));
    return null;
  };

/** The shop's vehicles: customers' machines, shop stock and consignments, filtered and paged. */
export default function VehicleListRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const navigate = useNavigate();
  const membership = me?.memberships.find((m) => m.shopId === shopId);
  const canCreate = useCan('create', 'Vehicle', { shopId });
  const canSetMoney = useCanSetVehicleMoney(shopId);
  const canCreateCustomer = useCan('create', 'Customer', { shopId });
  const settings = useSettings(shopId);
  const { params, update, filtered, clear } = useVehicleListParams();
  const marques = useVehicles(shopId, params).data?.marques ?? [];
  const [adding, setAdding] = useState(false);
  useDocumentTitle(membership ? `${membership.shopName} · Vehicles` : 'Vehicles');
  if (!membership) return null;

  const addButton = canCreate && <Button onClick={() => setAdding(true)}>Record a vehicle</Button>;
  return (
    <>
      <PageHeader eyebrow={membership.shopName} title="Vehicles" description="Every vehicle in or through the shop, where it stands, and what it has been through." actions={addButton} />
      <VehicleList shopId={shopId} params={params} filtered={filtered} onChange={update} onClear={clear} emptyAction={addButton || undefined} />
      {adding && (
        <VehicleFormDialog
          shopId={shopId}
          open
          onClose={() => setAdding(false)}
          currency={settings.data?.currency ?? 'GBP'}
          distanceUnit={settings.data?.distanceUnit ?? 'mi'}
          canSetMoney={canSetMoney}
          canCreateCustomer={canCreateCustomer}
          marques={marques}
          onSaved={(v) => navigate(paths.shop.vehicle.getHref(shopId, v.id))}
        />
      )}
    </>
  );
}
