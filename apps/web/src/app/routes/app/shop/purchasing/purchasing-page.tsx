import type { ReactNode } from 'react';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { PurchasingNav } from '../../../../../features/purchasing/components/purchasing-nav';
import { useMe } from '../../../../../lib/auth';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

/** The frame of every purchasing screen: header, the purchasing navigation, then the screen. */
export function PurchasingPage({ shopId, title, description, children }: { shopId: string; title: string; description?: ReactNode; children: ReactNode }) {
  const me = useMe();
  const shopName = me?.memberships.find((m) => m.shopId === shopId)?.shopName;
  useDocumentTitle(shopName ? `${shopName} · ${title}` : title);
  return (
    <>
      <PageHeader eyebrow={shopName} title={title} description={description} />
      <PurchasingNav shopId={shopId} />
      {children}
    </>
  );
}
