import { acceptInvitationRequestSchema, invitationTokenSchema, roleLabels, type PublicInvitation } from '@tappet/contracts';
import { Button, FormMessage, LoadingState, PasswordField, TextField } from '@tappet/ui';
import { useQuery } from '@tanstack/react-query';
import { useRef, useState, type FormEvent } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { ApiError, errorMessage } from '../../../lib/api-client';
import { meQueryOptions, type Me } from '../../../lib/auth';
import { formValues, useFormErrors } from '../../../lib/forms';
import { useAcceptInvitation, useInvitation } from '../api/accept-invitation';
import { formatDateTime } from './words';

export interface AcceptInvitationProps {
  /** The token from the e-mailed link; null when the link has none. */
  token: string | null;
  /** Called with the new "me" once the person has joined the shop. */
  onAccepted: (me: Me) => void;
}

/** True when the link itself is the problem (unknown, used, withdrawn or expired). */
function isGone(error: unknown): boolean {
  return error instanceof ApiError && (error.status === 404 || 'token' in error.fieldErrors);
}

function BadLink() {
  return (
    <div className="flex flex-col gap-4">
      <FormMessage>This invitation link has expired, has already been used, or was withdrawn.</FormMessage>
      <p>Invitation links work once and for 7 days. Ask the shop’s owner to send you a new one, then use the newest e-mail.</p>
      <Link to={paths.auth.signIn.getHref()}>Go to sign in</Link>
    </div>
  );
}

/** The invitation's facts: which shop, which role, which address, until when. */
function Summary({ invitation }: { invitation: PublicInvitation }) {
  return (
    <dl className="grid grid-cols-[max-content_1fr] gap-x-4 gap-y-2 rounded-md border-2 border-line bg-sunk p-4">
      <dt className="font-bold">Shop</dt>
      <dd>{invitation.shopName}</dd>
      <dt className="font-bold">Your role</dt>
      <dd>{roleLabels[invitation.role]}</dd>
      <dt className="font-bold">For</dt>
      <dd className="break-all">{invitation.email}</dd>
      <dt className="font-bold">Link valid until</dt>
      <dd>
        <time dateTime={invitation.expiresAt}>{formatDateTime(invitation.expiresAt)}</time>
      </dd>
    </dl>
  );
}

/** Public page behind the e-mailed link: shows the invitation and lets the person accept it. */
export function AcceptInvitation({ token, onAccepted }: AcceptInvitationProps) {
  const validToken = token !== null && invitationTokenSchema.safeParse(token).success;
  const invitation = useInvitation(validToken ? token : null);
  const me = useQuery(meQueryOptions());
  const accept = useAcceptInvitation();
  const formRef = useRef<HTMLFormElement>(null);
  const errors = useFormErrors(formRef);
  const [gone, setGone] = useState(false);

  if (!validToken || gone) return <BadLink />;
  if (invitation.isPending || me.isPending) return <LoadingState label="Opening the invitation…" />;
  if (invitation.isError) {
    if (isGone(invitation.error)) return <BadLink />;
    return <FormMessage>{errorMessage(invitation.error)}</FormMessage>;
  }

  const inv = invitation.data;
  const signedIn = me.data ?? null;
  const here = paths.auth.acceptInvitation.getHref(token);

  function run(body: { name?: string; password?: string }) {
    accept.mutate(
      { token: token ?? '', ...body },
      {
        onSuccess: onAccepted,
        onError: (error) => {
          if (isGone(error)) setGone(true);
          else errors.failApi(error, ['name', 'password']);
        },
      },
    );
  }

  if (inv.accountExists) {
    const isInvited = signedIn?.user.email.toLowerCase() === inv.email.toLowerCase();
    return (
      <div className="flex flex-col gap-5">
        <Summary invitation={inv} />
        {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
        {isInvited ? (
          <>
            <p>You are signed in as {inv.email}. Accept to join {inv.shopName}.</p>
            <Button className="w-full" loading={accept.isPending} onClick={() => run({})}>
              Accept and join {inv.shopName}
            </Button>
          </>
        ) : (
          <>
            <p>
              {inv.email} already has a Tappet account. Sign in as {inv.email} to accept
              {signedIn ? ` (you are signed in as ${signedIn.user.email} now: sign out first)` : ''}.
            </p>
            {!signedIn && (
              <Link to={paths.auth.signIn.getHref(here)} className="font-bold">
                Sign in as {inv.email} to accept
              </Link>
            )}
          </>
        )}
      </div>
    );
  }

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const values = formValues(event.currentTarget);
    const parsed = acceptInvitationRequestSchema.safeParse({ token, name: values.name ?? '', password: values.password ?? '' });
    if (!parsed.success) {
      errors.failValidation(parsed.error);
      return;
    }
    errors.clear();
    run({ name: parsed.data.name, password: parsed.data.password });
  }

  return (
    <div className="flex flex-col gap-5">
      <Summary invitation={inv} />
      {signedIn && (
        <p className="text-ink-muted">
          You are signed in as {signedIn.user.email}. Accepting creates a new account for {inv.email} and signs you in as that account.
        </p>
      )}
      <form ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-5">
        {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
        <TextField label="Your name" name="name" autoComplete="name" hint="As the rest of the shop will see it." error={errors.fieldErrors.name} />
        <PasswordField
          label="Choose a password"
          name="password"
          autoComplete="new-password"
          hint="At least 8 characters. A few unrelated words make a strong one."
          error={errors.fieldErrors.password}
        />
        <Button type="submit" loading={accept.isPending} className="w-full">
          Accept and join {inv.shopName}
        </Button>
      </form>
    </div>
  );
}
