import type { ReactNode } from 'react';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { SalesNav } from '../../../../../features/sales/components/sales-nav';
import { useCan } from '../../../../../lib/ability';
import { useMe } from '../../../../../lib/auth';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

/** The frame of every sales screen: header, the sales navigation, then the screen. */
export function SalesPage({ shopId, title, description, actions, children }: { shopId: string; title: string; description?: ReactNode; actions?: ReactNode; children: ReactNode }) {
  const me = useMe();
  const shopName = me?.memberships.find((m) => m.shopId === shopId)?.shopName;
  const canSell = useCan('create', 'Invoice', { shopId });
  useDocumentTitle(shopName ? `${shopName} · ${title}` : title);
  return (
    <>
      <PageHeader eyebrow={shopName} title={title} description={description} actions={actions} />
      <SalesNav shopId={shopId} canSell={canSell} />
      {children}
    </>
  );
}
