import { useParams } from 'react-router-dom';
import { MovementHistory } from '../../../../../features/stock/components/movement-history';
import { StockPage } from './stock-page';

/** The movement ledger with filters. */
export default function StockMovementsRoute() {
  const { shopId = '' } = useParams();
  return (
    <StockPage shopId={shopId} title="Stock movements" description="Every receipt, issue, return, adjustment, move and count, as recorded.">
      <MovementHistory shopId={shopId} />
    </StockPage>
  );
}
