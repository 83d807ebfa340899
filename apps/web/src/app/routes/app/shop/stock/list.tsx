import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { binsQueryOptions } from '../../../../../features/stock/api/get-bins';
import { StockLines } from '../../../../../features/stock/components/stock-lines';
import { StockPage } from './stock-page';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    if (params.shopId) void queryClient.prefetchQuery(binsQueryOptions(params.shopId));
    return null;
  };

/** Stock per part and bin, with the actions a person's role allows. */
export default function StockListRoute() {
  const { shopId = '' } = useParams();
  return (
    <StockPage shopId={shopId} title="Stock" description="What is on the shelves, where, and how much of it is free.">
      <StockLines shopId={shopId} />
    </StockPage>
  );
}
