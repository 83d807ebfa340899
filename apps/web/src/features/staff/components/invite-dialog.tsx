import { createInvitationRequestSchema, roleLabels, type ShopRole } from '@tappet/contracts';
import { Button, Dialog, FormMessage, Select, TextField, useToast } from '@tappet/ui';
import { useRef, useState, type FormEvent } from 'react';
import { formValues, useFormErrors } from '../../../lib/forms';
import { useCreateInvitation } from '../api/invitations';
import { parseMajorAmount, roleHints, roleOptions } from './words';

/** "Invite someone": e-mail, role and (for a buyer) a spending limit; the API e-mails the link. */
export function InviteDialog({ shopId, open, onClose, currency }: { shopId: string; open: boolean; onClose: () => void; currency: string }) {
  const formRef = useRef<HTMLFormElement>(null);
  const errors = useFormErrors(formRef);
  const invite = useCreateInvitation(shopId);
  const toast = useToast();
  const [role, setRole] = useState<ShopRole>('mechanic');
  const [limitError, setLimitError] = useState<string | undefined>();

  function close() {
    errors.clear();
    setLimitError(undefined);
    invite.reset();
    onClose();
  }

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const values = formValues(event.currentTarget);
    let spendingLimitMinor: number | null = null;
    if (values.role === 'buyer' && values.limit?.trim()) {
      spendingLimitMinor = parseMajorAmount(values.limit);
      if (spendingLimitMinor === null) {
        setLimitError('Enter an amount such as 500 or 1250.50, or leave it empty for no limit.');
        return;
      }
    }
    setLimitError(undefined);
    const parsed = createInvitationRequestSchema.safeParse({ email: values.email ?? '', role: values.role, spendingLimitMinor });
    if (!parsed.success) {
      errors.failValidation(parsed.error);
      return;
    }
    errors.clear();
    invite.mutate(parsed.data, {
      onSuccess: (invitation) => {
        toast.show(`Invitation sent to ${invitation.email} as ${roleLabels[invitation.role].toLowerCase()}.`, 'ok');
        close();
      },
      onError: (error) => errors.failApi(error, ['email', 'role', 'spendingLimitMinor']),
    });
  }

  return (
    <Dialog
      open={open}
      onClose={close}
      title="Invite someone"
      description="They get an e-mail with a link that works once, for 7 days. They choose their own name and password."
    >
      <form ref={formRef} noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        {errors.formError && <FormMessage>{errors.formError}</FormMessage>}
        <TextField label="E-mail" name="email" type="email" autoComplete="off" error={errors.fieldErrors.email} />
        <Select
          label="Role"
          name="role"
          options={roleOptions}
          value={role}
          onChange={(e) => setRole(e.target.value as ShopRole)}
          hint={roleHints[role]}
          error={errors.fieldErrors.role}
        />
        {role === 'buyer' && (
          <TextField
            label={`Spending limit (${currency})`}
            name="limit"
            inputMode="decimal"
            hint="Orders up to this total go out without your approval. Leave empty for none: every order then waits for you."
            error={limitError ?? errors.fieldErrors.spendingLimitMinor}
          />
        )}
        <div className="flex flex-wrap justify-end gap-2 border-t border-line pt-4">
          <Button type="button" variant="secondary" onClick={close}>
            Cancel
          </Button>
          <Button type="submit" loading={invite.isPending}>
            Send invitation
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
