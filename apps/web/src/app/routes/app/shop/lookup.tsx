import { lazy, Suspense } from 'react';
import { useParams } from 'react-router-dom';
import { LookupScreen } from '../../../../features/lookup/components/lookup-screen';
import { useMe } from '../../../../lib/auth';
import { useDocumentTitle } from '../../../../lib/use-document-title';

// Loaded with the first results, not with the page: the empty lookup shows sooner (decision 026).
const ResultSellPrice = lazy(() => import('../../../../features/sales/components/result-sell-price').then((m) => ({ default: m.ResultSellPrice })));

/** /shops/:shopId/lookup: the bench lookup, the search field first; each result with its sell price. */
export default function LookupRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const membership = me?.memberships.find((m) => m.shopId === shopId);
  useDocumentTitle(membership ? `${membership.shopName} · Lookup` : 'Lookup');
  if (!me || !membership) return null;
  return (
    <div className="mx-auto flex w-full max-w-4xl flex-col gap-2">
      <h1 className="sr-only">Lookup</h1>
      {/* Keyed by shop and person: switching either starts a fresh field and list. */}
      <LookupScreen
        key={`${me.user.id}:${shopId}`}
        shopId={shopId}
        userId={me.user.id}
        resultExtra={(partId, shownIds) => (
          <Suspense fallback={null}>
            <ResultSellPrice shopId={shopId} partId={partId} partIds={shownIds} />
          </Suspense>
        )}
      />
    </div>
  );
}
