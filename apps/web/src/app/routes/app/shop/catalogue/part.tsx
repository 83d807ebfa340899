import type { QueryClient } from '@tanstack/react-query';
import { ErrorState, LoadingState, PartNumber } from '@tappet/ui';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { NotFoundContent } from '../../../../../components/errors/not-found';
import { paths } from '../../../../../config/paths';
import { lineageQueryOptions, useLineage } from '../../../../../features/catalogue/api/get-lineage';
import { partQueryOptions, usePart } from '../../../../../features/catalogue/api/get-part';
import { PartView } from '../../../../../features/catalogue/components/part-view';
import { PrintLabelsButton } from '../../../../../features/labels/components/print-labels-dialog';
import { PartPurchasingPanel } from '../../../../../features/purchasing/components/part-purchasing-panel';
import { PartStockPanel } from '../../../../../features/stock/components/part-stock-panel';
import { PartPricePanel } from '../../../../../features/sales/components/part-price-panel';
import { useCan } from '../../../../../lib/ability';
import { ApiError, errorMessage } from '../../../../../lib/api-client';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    if (params.shopId && params.partId) {
      await Promise.all([
        queryClient.prefetchQuery(partQueryOptions(params.shopId, params.partId)),
        queryClient.prefetchQuery(lineageQueryOptions(params.shopId, params.partId)),
      ]);
    }
    return null;
  };

/** One part: its number as the hero, details, current number, lineage picture, links and fitment. */
export default function PartRoute() {
  const { shopId = '', partId = '' } = useParams();
  const part = usePart(shopId, partId);
  const lineage = useLineage(shopId, partId);
  const canEdit = useCan('update', 'Part', { shopId });
  const canReadStock = useCan('read', 'Stock', { shopId });
  const canReadPurchasing = useCan('read', 'Supplier', { shopId });
  // Sales (issue 12): the sell price for everyone who reads parts; cost and margin only where the API gives them.
  const canSetListPrice = useCan('update', 'Settings', { shopId });
  useDocumentTitle(part.data ? `${part.data.part.number} · Catalogue` : 'Part');

  const back = (
    <Link to={paths.shop.catalogue.getHref(shopId)} className="text-accent underline underline-offset-4">
      Catalogue
    </Link>
  );

  if (part.isPending) return <LoadingState label="Loading the part…" />;
  if (part.isError) {
    if (part.error instanceof ApiError && part.error.status === 404) return <NotFoundContent what="part" />;
    return <ErrorState message={errorMessage(part.error)} onRetry={() => void part.refetch()} />;
  }
  const { part: p } = part.data;

  return (
    <>
      <div className="mb-6 flex flex-col gap-1">
        <nav aria-label="Breadcrumb" className="text-sm font-bold tracking-wide text-ink-muted uppercase">
          {back}
        </nav>
        <div className="flex flex-wrap items-start justify-between gap-3">
          <h1 className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
            <PartNumber className="text-xl font-bold">{p.number}</PartNumber>
            <span className="text-lg font-bold">{p.description}</span>
          </h1>
          <PrintLabelsButton shopId={shopId} source={{ kind: 'parts', parts: [{ id: p.id, number: p.number }] }} label="Print label" />
        </div>
      </div>
      <PartView
        shopId={shopId}
        detail={part.data}
        canEdit={canEdit}
        lineage={{ data: lineage.data, isPending: lineage.isPending, error: lineage.error, refetch: () => void lineage.refetch() }}
      />
      {canReadStock && <PartStockPanel shopId={shopId} partId={p.id} />}
      {canReadPurchasing && <PartPurchasingPanel shopId={shopId} partId={p.id} />}
      <PartPricePanel shopId={shopId} partId={p.id} canSetListPrice={canSetListPrice} />
    </>
  );
}
