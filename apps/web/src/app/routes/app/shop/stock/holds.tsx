import { useParams } from 'react-router-dom';
import { HoldsList } from '../../../../../features/stock/components/holds-list';
import { StockPage } from './stock-page';

/** Stock set aside, and what it is for. */
export default function StockHoldsRoute() {
  const { shopId = '' } = useParams();
  return (
    <StockPage shopId={shopId} title="Held stock" description="Stock set aside for a job or a customer: nobody else can issue it until it is released.">
      <HoldsList shopId={shopId} />
    </StockPage>
  );
}
