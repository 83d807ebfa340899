import { useParams } from 'react-router-dom';
import { PrintBinLabelsButton } from '../../../../../features/labels/components/print-bin-labels';
import { useBins } from '../../../../../features/stock/api/get-bins';
import { BinsList } from '../../../../../features/stock/components/bins-list';
import { StockPage } from './stock-page';

/** The shop's bins and what each holds, with labels for the bins (and what they hold) to print. */
export default function StockBinsRoute() {
  const { shopId = '' } = useParams();
  const bins = useBins(shopId);
  const printable = bins.data?.bins ?? [];
  return (
    <StockPage shopId={shopId} title="Bins" description="Aisles, shelves and bins: where stock sits.">
      {printable.length > 0 && (
        <div className="flex justify-end">
          <PrintBinLabelsButton shopId={shopId} bins={printable} />
        </div>
      )}
      <BinsList shopId={shopId} />
    </StockPage>
  );
}
