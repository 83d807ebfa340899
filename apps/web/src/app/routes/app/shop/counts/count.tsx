import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { paths } from '../../../../../config/paths';
import { countQueryOptions, useCount } from '../../../../../features/counts/api/get-count';
import { CountScreen } from '../../../../../features/counts/components/count-screen';
import { CountsPage } from './counts-page';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    if (params.shopId && params.countId) void queryClient.prefetchQuery(countQueryOptions(params.shopId, params.countId));
    return null;
  };

/** Counting one count, bin by bin. */
export default function CountRoute() {
  const { shopId = '', countId = '' } = useParams();
  const count = useCount(shopId, countId);
  return (
    <CountsPage
      shopId={shopId}
      title={count.data ? `Count ${count.data.number}` : 'Count'}
      description={
        <Link to={paths.shop.counts.getHref(shopId)} className="text-accent underline-offset-4 hover:underline">
          All counts
        </Link>
      }
    >
      <CountScreen shopId={shopId} countId={countId} />
    </CountsPage>
  );
}
