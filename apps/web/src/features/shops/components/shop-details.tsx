import type { ShopDetail } from '@tappet/contracts';
import { Num, PartNumber } from '@tappet/ui';
import { formatDate } from '../../../lib/dates';

/** The shop's record as the API has it. */
export function ShopDetails({ shop }: { shop: ShopDetail }) {
  return (
    <dl className="grid grid-cols-1 gap-x-6 gap-y-3 sm:grid-cols-[max-content_1fr]">
      <dt className="font-bold">Name</dt>
      <dd>{shop.name}</dd>
      <dt className="font-bold">Short name</dt>
      <dd>
        <PartNumber>{shop.slug}</PartNumber>
      </dd>
      <dt className="font-bold">On Tappet since</dt>
      <dd>
        <time dateTime={shop.createdAt}>{formatDate(shop.createdAt)}</time>
      </dd>
      <dt className="font-bold">Shop id (for the API)</dt>
      <dd>
        <Num className="break-all">{shop.id}</Num>
      </dd>
    </dl>
  );
}
