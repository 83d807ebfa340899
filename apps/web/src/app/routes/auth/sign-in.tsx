import type { QueryClient } from '@tanstack/react-query';
import { redirect, useLocation, useNavigate, useSearchParams } from 'react-router-dom';
import { AuthLayout } from '../../../components/layouts/auth-layout';
import { safeRedirect } from '../../../config/paths';
import { SignInForm } from '../../../features/auth/components/sign-in-form';
import { homeHref, meQueryOptions } from '../../../lib/auth';
import { useDocumentTitle } from '../../../lib/use-document-title';

/** Someone already signed in goes straight to their home. */
export const clientLoader = (queryClient: QueryClient) => async () => {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  return me ? redirect(homeHref(me)) : null;
};

export default function SignInRoute() {
  useDocumentTitle('Sign in');
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const location = useLocation();
  const state = location.state as { notice?: string } | null;
  const notice = state?.notice === 'password-set' ? 'Your new password is set. Sign in with it.' : null;

  return (
    <AuthLayout title="Sign in to Tappet">
      <SignInForm
        notice={notice}
        onSignedIn={(me) => navigate(safeRedirect(params.get('redirectTo'), homeHref(me)), { replace: true })}
      />
    </AuthLayout>
  );
}
