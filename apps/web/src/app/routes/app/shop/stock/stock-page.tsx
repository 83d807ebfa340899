import type { ReactNode } from 'react';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { StockNav } from '../../../../../features/stock/components/stock-nav';
import { useMe } from '../../../../../lib/auth';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

/** The frame of every stock screen: header, the stock navigation, then the screen. */
export function StockPage({ shopId, title, description, children }: { shopId: string; title: string; description?: ReactNode; children: ReactNode }) {
  const me = useMe();
  const shopName = me?.memberships.find((m) => m.shopId === shopId)?.shopName;
  useDocumentTitle(shopName ? `${shopName} · ${title}` : title);
  return (
    <>
      <PageHeader eyebrow={shopName} title={title} description={description} />
      <StockNav shopId={shopId} />
      {children}
    </>
  );
}
