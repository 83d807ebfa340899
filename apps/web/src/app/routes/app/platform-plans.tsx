import type { QueryClient } from '@tanstack/react-query';
import { PageHeader } from '../../../components/layouts/page-header';
import { NotFoundContent } from '../../../components/errors/not-found';
import { platformPlansQueryOptions } from '../../../features/platform/api/platform-api';
import { PlansScreen } from '../../../features/platform/components/plans-screen';
import { meQueryOptions, useMe } from '../../../lib/auth';
import { useDocumentTitle } from '../../../lib/use-document-title';

export const clientLoader = (queryClient: QueryClient) => async () => {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  if (me?.user.isPlatformAdmin) void queryClient.prefetchQuery(platformPlansQueryOptions());
  return null;
};

/** Plans (platform admins). Anyone else gets "not found". */
export default function PlatformPlansRoute() {
  const me = useMe();
  useDocumentTitle('Plans');
  if (!me) return null;
  if (!me.user.isPlatformAdmin) return <NotFoundContent />;
  return (
    <>
      <PageHeader eyebrow="Platform" title="Plans" description="Names, monthly prices and limits of the plans shops subscribe to." />
      <PlansScreen />
    </>
  );
}
