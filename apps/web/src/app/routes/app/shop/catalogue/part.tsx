import { ErrorState, LoadingState, PartNumber } from '@tappet/ui';
import { lazy, Suspense, useRef } from 'react';
import { Link, useParams } from 'react-router-dom';
import { NotFoundContent } from '../../../../../components/errors/not-found';
import { paths } from '../../../../../config/paths';
import { useLineage } from '../../../../../features/catalogue/api/get-lineage';
import { usePart } from '../../../../../features/catalogue/api/get-part';
import { PartView } from '../../../../../features/catalogue/components/part-view';
import { PrintLabelsButton } from '../../../../../features/labels/components/print-labels-button';
import { useCan } from '../../../../../lib/ability';
import { ApiError, errorMessage } from '../../../../../lib/api-client';
import { useAfterPaint } from '../../../../../lib/use-after-paint';
import { useDocumentTitle } from '../../../../../lib/use-document-title';
import { PartGlance } from './part-glance';

// The panels below the part (stock, purchasing, price) fetch their own data and carry their own
// forms: loaded once the part has been painted rather than before it can show
// (docs/decisions/022-first-load.md, 026-first-screen-requests.md).
const PartStockPanel = lazy(() => import('../../../../../features/stock/components/part-stock-panel').then((m) => ({ default: m.PartStockPanel })));
const PartPurchasingPanel = lazy(() => import('../../../../../features/purchasing/components/part-purchasing-panel').then((m) => ({ default: m.PartPurchasingPanel })));
const PartPricePanel = lazy(() => import('../../../../../features/sales/components/part-price-panel').then((m) => ({ default: m.PartPricePanel })));

const panelsLoading = <LoadingState label="Loading stock, purchasing and price…" />;

/** One part (its data is prefetched by the router's loader, see app/router.tsx): its number as the hero, details, current number, lineage picture, links and fitment. */
export default function PartRoute() {
  const { shopId = '', partId = '' } = useParams();
  const part = usePart(shopId, partId);
  const lineage = useLineage(shopId, partId);
  const canEdit = useCan('update', 'Part', { shopId });
  const canReadStock = useCan('read', 'Stock', { shopId });
  const canReadPurchasing = useCan('read', 'Supplier', { shopId });
  // Sales (issue 12): the sell price for everyone who reads parts; cost and margin only where the API gives them.
  const canSetListPrice = useCan('update', 'Settings', { shopId });
  // The rest of the page waits until the part's heading is on screen.
  const heading = useRef<HTMLSpanElement>(null);
  const painted = useAfterPaint(heading);
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
            <span ref={heading} elementtiming="part-heading" className="text-lg font-bold">
              {p.description}
            </span>
          </h1>
          <PrintLabelsButton shopId={shopId} source={{ kind: 'parts', parts: [{ id: p.id, number: p.number }] }} label="Print label" />
        </div>
        <PartGlance shopId={shopId} partId={p.id} painted={painted} canReadStock={canReadStock} />
      </div>
      <PartView
        shopId={shopId}
        detail={part.data}
        canEdit={canEdit}
        showSections={painted}
        lineage={{ data: lineage.data, isPending: lineage.isPending, error: lineage.error, refetch: () => void lineage.refetch() }}
      />
      {painted ? (
        <Suspense fallback={panelsLoading}>
          {canReadStock && <PartStockPanel shopId={shopId} partId={p.id} />}
          {canReadPurchasing && <PartPurchasingPanel shopId={shopId} partId={p.id} />}
          <PartPricePanel shopId={shopId} partId={p.id} canSetListPrice={canSetListPrice} />
        </Suspense>
      ) : (
        panelsLoading
      )}
    </>
  );
}
