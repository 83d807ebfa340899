import type { QueryClient } from '@tanstack/react-query';
import { PageHeader } from '../../../components/layouts/page-header';
import { NotFoundContent } from '../../../components/errors/not-found';
import { platformShopsQueryOptions } from '../../../features/platform/api/platform-api';
import { PlatformShopsScreen } from '../../../features/platform/components/platform-shops-screen';
import { meQueryOptions, useMe } from '../../../lib/auth';
import { useDocumentTitle } from '../../../lib/use-document-title';

export const clientLoader = (queryClient: QueryClient) => async () => {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  if (me?.user.isPlatformAdmin) void queryClient.prefetchQuery(platformShopsQueryOptions({}));
  return null;
};

/** Home of platform administrators: the shops console. Anyone else gets "not found", as from the API. */
export default function PlatformRoute() {
  const me = useMe();
  useDocumentTitle('Platform');
  if (!me) return null;
  if (!me.user.isPlatformAdmin) return <NotFoundContent />;
  return (
    <>
      <PageHeader eyebrow="Shops" title="Platform" description="Every shop on Tappet: plan, subscription state and usage. Onboard new shops and suspend or reactivate by hand." />
      <PlatformShopsScreen />
    </>
  );
}
