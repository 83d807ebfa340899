import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { PageHeader } from '../../../../../components/layouts/page-header';
import { apiKeysQueryOptions } from '../../../../../features/api-keys/api/get-api-keys';
import { ApiKeysScreen } from '../../../../../features/api-keys/components/api-keys-screen';
import { abilityFor, canOn, useCan } from '../../../../../lib/ability';
import { meQueryOptions, useMe } from '../../../../../lib/auth';
import { useDocumentTitle } from '../../../../../lib/use-document-title';
import { OwnerOnly } from './owner-only';

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const me = await queryClient.ensureQueryData(meQueryOptions());
    if (me && params.shopId && canOn(abilityFor(me, params.shopId), 'read', 'ApiKey', { shopId: params.shopId })) {
      void queryClient.prefetchQuery(apiKeysQueryOptions(params.shopId));
    }
    return null;
  };

/** API keys (owners): keys for integrations. */
export default function ApiKeysRoute() {
  const { shopId = '' } = useParams();
  const me = useMe();
  const membership = me?.memberships.find((m) => m.shopId === shopId);
  const canManage = useCan('read', 'ApiKey', { shopId });
  useDocumentTitle(membership ? `${membership.shopName} · API keys` : 'API keys');

  if (!membership || !me) return null;
  if (!canManage) return <OwnerOnly shopId={shopId} shopName={membership.shopName} title="API keys" />;
  return (
    <>
      <PageHeader eyebrow={membership.shopName} title="API keys" description="Keys for programs that work with the shop through Tappet’s API." />
      <ApiKeysScreen shopId={shopId} myName={me.user.name} />
    </>
  );
}
