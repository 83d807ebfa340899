import { useParams } from 'react-router-dom';
import { ValueReport } from '../../../../../features/stock/components/value-report';
import { StockPage } from './stock-page';

/** What the stock is worth, and how that changed. */
export default function StockValueRoute() {
  const { shopId = '' } = useParams();
  return (
    <StockPage shopId={shopId} title="Stock value" description="At moving-average cost; engines and other numbered items at their own cost.">
      <ValueReport shopId={shopId} />
    </StockPage>
  );
}
