import { signInRequestSchema } from '@tappet/contracts';
import { Button, FormMessage, PasswordField, TextField } from '@tappet/ui';
import { useRef, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import type { Me } from '../../../lib/auth';
import { ApiError } from '../../../lib/api-client';
import { formValues, useFormErrors } from '../../../lib/forms';
import { useSignIn } from '../api/sign-in';

export interface SignInFormProps {
  onSignedIn: (me: Me) => void;
  /** A message to show above the form, e.g. after a password reset. */
  notice?: string | null;
}

/** E-mail and password, with errors per field and the API's message for everything else. */
export function SignInForm({ onSignedIn, notice }: SignInFormProps) {
  const formRef = useRef<HTMLFormElement>(null);
  const errors = useFormErrors(formRef);
  const signIn = useSignIn();

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const parsed = signInRequestSchema.safeParse(formValues(event.currentTarget));
    if (!parsed.success) {
      errors.failValidation(parsed.error);
      return;
    }
    errors.clear();
    signIn.mutate(parsed.data, {
      onSuccess: onSignedIn,
      onError: (error) => {
        if (error instanceof ApiError && error.status === 401) {
          // The API's wording on purpose: it does not say which of the two was wrong.
          errors.failApi(error, []);
          formRef.current?.querySelector<HTMLInputElement>('input[name="password"]')?.select();
          return;
        }
        errors.failApi(error, ['email', 'password']);
      },
    });
  }

  return (
    <form ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-5">
      {notice && !errors.formError && <FormMessage tone="ok">{notice}</FormMessage>}
      {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
      <TextField
        label="E-mail"
        name="email"
        type="email"
        autoComplete="username"
        inputMode="email"
        autoCapitalize="none"
        spellCheck={false}
        error={errors.fieldErrors.email}
      />
      <PasswordField label="Password" name="password" autoComplete="current-password" error={errors.fieldErrors.password} />
      <Button type="submit" loading={signIn.isPending} className="w-full">
        Sign in
      </Button>
      <p>
        <Link to={paths.auth.forgotPassword.getHref()}>Forgot your password?</Link>
      </p>
    </form>
  );
}
