import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { countsQueryOptions } from '../../../../../features/counts/api/get-counts';
import { CountsList } from '../../../../../features/counts/components/counts-list';
import { CountsPage } from './counts-page';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    if (params.shopId) void queryClient.prefetchQuery(countsQueryOptions(params.shopId));
    return null;
  };

/** Every stock count of the shop, and starting a new one. */
export default function CountsRoute() {
  const { shopId = '' } = useParams();
  return (
    <CountsPage shopId={shopId} title="Stock counts" description="Count what is on the shelves, bin by bin; the differences become stock movements once the owner posts them.">
      <CountsList shopId={shopId} />
    </CountsPage>
  );
}
