import { Navigate } from 'react-router-dom';
import { PageHeader } from '../../../components/layouts/page-header';
import { NoShopWelcome } from '../../../features/home/components/platform-welcome';
import { homeHref, useMe } from '../../../lib/auth';
import { useDocumentTitle } from '../../../lib/use-document-title';

/** Home of someone signed in who belongs to no shop (and is no platform admin). */
export default function NoShopRoute() {
  const me = useMe();
  useDocumentTitle('Welcome');
  if (!me) return null;
  if (me.memberships.length > 0 || me.user.isPlatformAdmin) return <Navigate to={homeHref(me)} replace />;
  return (
    <>
      <PageHeader eyebrow="Home" title="Welcome to Tappet" />
      <NoShopWelcome firstName={me.user.name.split(/\s+/)[0] || me.user.name} />
    </>
  );
}
