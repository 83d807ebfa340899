import { useParams } from 'react-router-dom';
import { ReorderList } from '../../../../../features/purchasing/components/reorder-list';
import { PurchasingPage } from './purchasing-page';

/** What to reorder, how many, from whom, and why. */
export default function ReorderRoute() {
  const { shopId = '' } = useParams();
  return (
    <PurchasingPage shopId={shopId} title="Reorder list" description="Current parts at or below their reorder point, with the demand of older numbers rolled in.">
      <ReorderList shopId={shopId} />
    </PurchasingPage>
  );
}
