import { useNavigate, useSearchParams } from 'react-router-dom';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { AcceptInvitation } from '../../../features/staff/components/accept-invitation';
import { homeHref } from '../../../lib/auth';
import { useDocumentTitle } from '../../../lib/use-document-title';

/** The public page behind an invitation e-mail: /accept-invitation?token=… */
export default function AcceptInvitationRoute() {
  useDocumentTitle('Accept your invitation');
  const [params] = useSearchParams();
  const navigate = useNavigate();
  return (
    <AuthLayout title="Accept your invitation">
      <AcceptInvitation token={params.get('token')} onAccepted={(me) => navigate(homeHref(me), { replace: true })} />
    </AuthLayout>
  );
}
