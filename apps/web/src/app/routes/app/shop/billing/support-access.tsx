import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { supportAccessQueryOptions } from '../../../../../features/billing/api/support-access';
import { SupportAccessScreen } from '../../../../../features/billing/components/support-access-screen';
import { abilityFor, canOn, useCan } from '../../../../../lib/ability';
import { meQueryOptions, useMe } from '../../../../../lib/auth';
import { useDocumentTitle } from '../../../../../lib/use-document-title';
import { OwnerOnly } from '../admin/owner-only';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const me = await queryClient.ensureQueryData(meQueryOptions());
    if (me && params.shopId && canOn(abilityFor(me, params.shopId), 'read', 'SupportAccess', { shopId: params.shopId })) {
      void queryClient.prefetchQuery(supportAccessQueryOptions(params.shopId));
    }
    return null;
  };

/** Support access (owners): let Tappet support see the shop for a while, and see what they did. */
export default function SupportAccessRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const membership = me?.memberships.find((m) => m.shopId === shopId);
  const canRead = useCan('read', 'SupportAccess', { shopId });
  useDocumentTitle(membership ? `${membership.shopName} · Support access` : 'Support access');
  if (!membership || !me) return null;
  if (!canRead) return <OwnerOnly shopId={shopId} shopName={membership.shopName} title="Support access" />;
  return (
    <>
      <PageHeader eyebrow={membership.shopName} title="Support access" description="Tappet’s support staff see nothing of your shop unless you grant access here, for a limited time." />
      <SupportAccessScreen shopId={shopId} />
    </>
  );
}
