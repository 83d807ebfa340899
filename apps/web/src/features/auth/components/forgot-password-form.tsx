import { passwordResetRequestSchema } from '@tappet/contracts';
import { Button, FormMessage, TextField } from '@tappet/ui';
import { useRef, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { formValues, useFormErrors } from '../../../lib/forms';
import { useRequestPasswordReset } from '../api/request-password-reset';

/**
 * Asks for a reset link. The answer is the same whether or not the address has an account, so
 * the page cannot be used to find out who uses Tappet.
 */
export function ForgotPasswordForm() {
  const formRef = useRef<HTMLFormElement>(null);
  const errors = useFormErrors(formRef);
  const request = useRequestPasswordReset();
  const [sentTo, setSentTo] = useState<string | null>(null);
  const doneRef = useRef<HTMLHeadingElement>(null);

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const parsed = passwordResetRequestSchema.safeParse(formValues(event.currentTarget));
    if (!parsed.success) {
      errors.failValidation(parsed.error);
      return;
    }
    errors.clear();
    request.mutate(parsed.data, {
      onSuccess: () => {
        setSentTo(parsed.data.email);
        // Move focus to the answer so keyboard and screen-reader users land on it.
        requestAnimationFrame(() => doneRef.current?.focus());
      },
      onError: (error) => errors.failApi(error, ['email']),
    });
  }

  if (sentTo) {
    return (
      <div className="flex flex-col gap-4">
        <h2 ref={doneRef} tabIndex={-1} className="text-lg font-bold">
          Check your inbox
        </h2>
        <p>
          If <strong className="break-all">{sentTo}</strong> belongs to a Tappet account, an e-mail with a link to set a new
          password is on its way. The link works once and expires after an hour.
        </p>
        <p className="text-ink-muted">Nothing arrived after a few minutes? Check the spam folder, or ask again.</p>
        <div className="flex flex-wrap gap-3">
          <Link to={paths.auth.signIn.getHref()}>Back to sign in</Link>
          <button type="button" className="text-accent underline underline-offset-4" onClick={() => setSentTo(null)}>
            Use another address
          </button>
        </div>
      </div>
    );
  }

  return (
    <form ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-5">
      <p>Enter the e-mail address you sign in with. We will send you a link to choose a new password.</p>
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
      <Button type="submit" loading={request.isPending} className="w-full">
        Send reset link
      </Button>
      <p>
        <Link to={paths.auth.signIn.getHref()}>Back to sign in</Link>
      </p>
    </form>
  );
}
