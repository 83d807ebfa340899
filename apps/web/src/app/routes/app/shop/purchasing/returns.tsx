import { useParams } from 'react-router-dom';
import { ReturnsList } from '../../../../../features/purchasing/components/returns-list';
import { PurchasingPage } from './purchasing-page';

/** Returns to suppliers and cores, until credited. */
export default function ReturnsRoute() {
  const { shopId = '' } = useParams();
  return (
    <PurchasingPage shopId={shopId} title="Returns and cores">
      <ReturnsList shopId={shopId} />
    </PurchasingPage>
  );
}
