import { passwordResetConfirmSchema } from '@tappet/contracts';
import { Button, FormMessage, PasswordField } from '@tappet/ui';
import { useRef, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { ApiError } from '../../../lib/api-client';
import { formValues, useFormErrors } from '../../../lib/forms';
import { useConfirmPasswordReset } from '../api/confirm-password-reset';

export interface ResetPasswordFormProps {
  /** The token from the e-mailed link; null when the link has none. */
  token: string | null;
  onDone: () => void;
}

const newPasswordSchema = passwordResetConfirmSchema.pick({ password: true });

/** True when the token itself is the problem (unknown, used, expired or malformed). */
function isBadLink(error: unknown): boolean {
  if (!(error instanceof ApiError)) return false;
  if ('token' in error.fieldErrors) return true;
  return error.code !== 'validation_failed' && error.code !== 'rate_limited' && error.status >= 400 && error.status < 500;
}

function BadLink() {
  return (
    <div className="flex flex-col gap-4">
      <FormMessage>This reset link has expired or has already been used.</FormMessage>
      <p>Reset links work once and only for a limited time. Ask for a new one and use the newest e-mail.</p>
      <div className="flex flex-wrap gap-4">
        <Link to={paths.auth.forgotPassword.getHref()}>Ask for a new link</Link>
        <Link to={paths.auth.signIn.getHref()}>Back to sign in</Link>
      </div>
    </div>
  );
}

/** Sets a new password from the e-mailed link, then hands over to sign-in. */
export function ResetPasswordForm({ token, onDone }: ResetPasswordFormProps) {
  const formRef = useRef<HTMLFormElement>(null);
  const errors = useFormErrors(formRef);
  const confirm = useConfirmPasswordReset();
  const [badLink, setBadLink] = useState(() => token === null || !passwordResetConfirmSchema.shape.token.safeParse(token).success);

  if (badLink) return <BadLink />;

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const { password = '' } = formValues(event.currentTarget);
    // The same rules as the API (the token was checked when the page opened).
    const parsed = newPasswordSchema.safeParse({ password });
    if (!parsed.success) {
      errors.failValidation(parsed.error);
      return;
    }
    errors.clear();
    confirm.mutate(
      { token: token ?? '', password: parsed.data.password },
      {
        onSuccess: onDone,
        onError: (error) => {
          if (isBadLink(error)) setBadLink(true);
          else errors.failApi(error, ['password']);
        },
      },
    );
  }

  return (
    <form ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-5">
      {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
      <PasswordField
        label="New password"
        name="password"
        autoComplete="new-password"
        hint="At least 8 characters. A few unrelated words make a strong one."
        error={errors.fieldErrors.password}
      />
      <Button type="submit" loading={confirm.isPending} className="w-full">
        Set new password
      </Button>
    </form>
  );
}
