import type { ReactNode } from 'react';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { useMe } from '../../../../../lib/auth';
import { useDocumentTitle } from '../../../../../lib/use-document-title';

/** The frame of the count screens: header with the shop's name, then the screen. */
export function CountsPage({ shopId, title, description, actions, children }: { shopId: string; title: string; description?: ReactNode; actions?: ReactNode; children: ReactNode }) {
  const me = useMe();
  const shopName = me?.memberships.find((m) => m.shopId === shopId)?.shopName;
  useDocumentTitle(shopName ? `${shopName} · ${title}` : title);
  return (
    <>
      <PageHeader eyebrow={shopName} title={title} description={description} actions={actions} />
      {children}
    </>
  );
}
