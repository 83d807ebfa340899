import { vehicleKinds, vehicleStatuses, type VehicleKind, type VehicleStatus } from '@tappet/contracts';
import { useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { vehicleListSearch, type VehicleListParams } from '../api/get-vehicles';

/** Reads the list's filters from a query string, dropping values the API would refuse. */
export function parseVehicleListParams(search: URLSearchParams): VehicleListParams {
  const kind = search.get('kind');
  const status = search.get('status');
  const page = Number(search.get('page'));
  return {
    kind: vehicleKinds.includes(kind as VehicleKind) ? (kind as VehicleKind) : undefined,
    status: vehicleStatuses.includes(status as VehicleStatus) ? (status as VehicleStatus) : undefined,
    marque: search.get('marque')?.trim().slice(0, 60) || undefined,
    q: search.get('q')?.trim().slice(0, 80) || undefined,
    page: Number.isInteger(page) && page > 1 ? page : 1,
  };
}

/** The vehicle list's filters live in the URL, so a filtered view can be bookmarked and shared. */
export function useVehicleListParams() {
  const [search, setSearch] = useSearchParams();
  const params = useMemo(() => parseVehicleListParams(search), [search]);
  function update(change: Partial<VehicleListParams>) {
    const next: VehicleListParams = { ...params, ...change };
    if (!('page' in change)) next.page = 1;
    setSearch(vehicleListSearch(next), { replace: 'q' in change });
  }
  const filtered = Boolean(params.q || params.kind || params.status || params.marque);
  return { params, update, filtered, clear: () => setSearch('') };
}
