import { useQueryClient } from '@tanstack/react-query';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { paths } from '../../../config/paths';
import { ResetPasswordForm } from '../../../features/auth/components/reset-password-form';
import { meQueryKey } from '../../../lib/auth';
import { useDocumentTitle } from '../../../lib/use-document-title';

export default function ResetPasswordRoute() {
  useDocumentTitle('Set a new password');
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const queryClient = useQueryClient();

  return (
    <AuthLayout title="Set a new password">
      <ResetPasswordForm
        token={params.get('token')}
        onDone={() => {
          // A reset ends every session of that person, so whatever we knew about "me" is stale.
          queryClient.removeQueries({ queryKey: meQueryKey });
          navigate(paths.auth.signIn.getHref(), { replace: true, state: { notice: 'password-set' } });
        }}
      />
    </AuthLayout>
  );
}
