import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { paths } from '../../../../../config/paths';
import { useCount } from '../../../../../features/counts/api/get-count';
import { variancesQueryOptions } from '../../../../../features/counts/api/get-variances';
import { VarianceReport } from '../../../../../features/counts/components/variance-report';
import { CountsPage } from './counts-page';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    if (params.shopId && params.countId) void queryClient.prefetchQuery(variancesQueryOptions(params.shopId, params.countId));
    return null;
  };

/** The differences of a count, posting and abandoning. */
export default function CountDifferencesRoute() {
  const { shopId = '', countId = '' } = useParams();
  const count = useCount(shopId, countId);
  return (
    <CountsPage
      shopId={shopId}
      title={count.data ? `Count ${count.data.number}: differences` : 'Differences'}
      description={
        <Link to={paths.shop.counts.getHref(shopId)} className="text-accent underline-offset-4 hover:underline">
          All counts
        </Link>
      }
    >
      <VarianceReport shopId={shopId} countId={countId} />
    </CountsPage>
  );
}
