import { AuthLayout } from '../../../components/layouts/auth-layout';
import { ForgotPasswordForm } from '../../../features/auth/components/forgot-password-form';
import { useDocumentTitle } from '../../../lib/use-document-title';

export default function ForgotPasswordRoute() {
  useDocumentTitle('Reset your password');
  return (
    <AuthLayout title="Reset your password">
      <ForgotPasswordForm />
    </AuthLayout>
  );
}
