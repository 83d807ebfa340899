import { EmptyState, ErrorState, LoadingState } from '@tappet/ui';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/api-client';
import { useFormatMoney } from '../../../lib/shop-settings';
import { VehicleStatusBadge } from '../../vehicles/components/status-badge';
import { useConsignmentList } from '../api/consignment';

/** Every consigned vehicle with its terms and settlement state. */
export function ConsignmentList({ shopId }: { shopId: string }) {
  const list = useConsignmentList(shopId);
  const money = useFormatMoney(shopId);
  if (list.isPending) return <LoadingState label="Loading consigned vehicles…" />;
  if (list.isError) return <ErrorState message={errorMessage(list.error)} onRetry={() => void list.refetch()} />;
  if (list.data.length === 0)
    return (
      <EmptyState title="No consigned vehicles">
        <p>Record a vehicle of the kind “consignment”, with its owner as the customer, to agree terms and settle its sale here.</p>
      </EmptyState>
    );
  return (
    <div className="relative overflow-x-auto">
      <table className="w-full text-left">
        <caption className="sr-only">Consigned vehicles</caption>
        <thead>
          <tr className="border-b-2 border-line text-sm text-ink-muted">
            <th scope="col" className="py-2 pr-3">Vehicle</th>
            <th scope="col" className="py-2 pr-3">Status</th>
            <th scope="col" className="py-2 pr-3">Consignor</th>
            <th scope="col" className="py-2 pr-3">Terms</th>
            <th scope="col" className="py-2 pr-3">Settlement</th>
          </tr>
        </thead>
        <tbody>
          {list.data.map((v) => (
            <tr key={v.vehicleId} className="border-b border-line">
              <td className="py-2 pr-3">
                <Link className="font-bold text-accent underline underline-offset-4" to={paths.shop.consignmentVehicle.getHref(shopId, v.vehicleId)}>
                  {v.vehicle}
                </Link>
              </td>
              <td className="py-2 pr-3">
                <VehicleStatusBadge status={v.status} />
              </td>
              <td className="py-2 pr-3">{v.consignorName ?? '—'}</td>
              <td className="py-2 pr-3">{v.hasTerms ? 'Agreed' : 'Not recorded yet'}</td>
              <td className="py-2 pr-3">
                {v.settlementReference ? (
                  <>
                    <span className="font-mono">{v.settlementReference}</span> · payout {money(v.payoutMinor ?? 0)} · {v.paid ? 'paid' : 'not paid yet'}
                  </>
                ) : (
                  'Not settled yet'
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
