import { EmptyState } from '@tappet/ui';
import { Link } from 'react-router-dom';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { paths } from '../../../../../config/paths';

/** What someone who is not an owner sees on an owner's page opened by URL (the API refuses anyway). */
export function OwnerOnly({ shopId, shopName, title }: { shopId: string; shopName: string; title: string }) {
  return (
    <>
      <PageHeader eyebrow={shopName} title={title} />
      <EmptyState title="This page is for the shop’s owner" action={<Link to={paths.shop.home.getHref(shopId)}>Back to the shop’s home</Link>}>
        Ask the owner if something here needs to change.
      </EmptyState>
    </>
  );
}
