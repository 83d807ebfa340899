import { PageHeader } from '../../../components/layouts/page-header';
import { NotFoundContent } from '../../../components/errors/not-found';
import { PlatformWelcome } from '../../../features/home/components/platform-welcome';
import { useMe } from '../../../lib/auth';
import { useDocumentTitle } from '../../../lib/use-document-title';

/** Home of platform administrators. Anyone else gets "not found", as from the API. */
export default function PlatformRoute() {
  const me = useMe();
  useDocumentTitle('Platform');
  if (!me) return null;
  if (!me.user.isPlatformAdmin) return <NotFoundContent />;
  return (
    <>
      <PageHeader eyebrow="Home" title="Platform" />
      <PlatformWelcome firstName={me.user.name.split(/\s+/)[0] || me.user.name} hasShops={me.memberships.length > 0} />
    </>
  );
}
