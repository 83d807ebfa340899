import { roleLabels, type ShopRole, type StaffMember } from '@tappet/contracts';
import { Button, ConfirmDialog, Dialog, FormMessage, Select, TextField, useToast } from '@tappet/ui';
import { useState, type FormEvent } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { useUpdateMember } from '../api/members';
import { formatMoney, parseMajorAmount, roleHints, roleOptions } from './words';

/** Which change to a member is being made (one dialog open at a time). */
export type MemberAction = { kind: 'role' | 'limit' | 'deactivate' | 'reactivate'; member: StaffMember };

/** The dialog for the member action picked in the table. */
export function MemberActionDialog({ shopId, action, onClose, currency }: { shopId: string; action: MemberAction | null; onClose: () => void; currency: string }) {
  if (!action) return null;
  // A key per member and action resets each dialog's state when another one opens.
  const key = `${action.kind}-${action.member.membershipId}`;
  switch (action.kind) {
    case 'role':
      return <RoleDialog key={key} shopId={shopId} member={action.member} onClose={onClose} />;
    case 'limit':
      return <LimitDialog key={key} shopId={shopId} member={action.member} onClose={onClose} currency={currency} />;
    default:
      return <ActiveDialog key={key} shopId={shopId} member={action.member} activate={action.kind === 'reactivate'} onClose={onClose} />;
  }
}

function RoleDialog({ shopId, member, onClose }: { shopId: string; member: StaffMember; onClose: () => void }) {
  const [role, setRole] = useState<ShopRole>(member.role);
  const update = useUpdateMember(shopId);
  const toast = useToast();

  function onSubmit(event: FormEvent) {
    event.preventDefault();
    if (role === member.role) {
      onClose();
      return;
    }
    update.mutate(
      { kind: 'role', membershipId: member.membershipId, role },
      {
        onSuccess: () => {
          toast.show(`${member.name} is now ${roleLabels[role].toLowerCase()}.`, 'ok');
          onClose();
        },
      },
    );
  }

  return (
    <Dialog open onClose={onClose} title={`Change ${member.name}’s role`} description="The new role applies from their next click; nothing they did before changes.">
      <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        {update.isError && <FormMessage>{errorMessage(update.error)}</FormMessage>}
        <Select label="Role" name="role" options={roleOptions} value={role} onChange={(e) => setRole(e.target.value as ShopRole)} hint={roleHints[role]} />
        <div className="flex flex-wrap justify-end gap-2 border-t border-line pt-4">
          <Button type="button" variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" loading={update.isPending}>
            Change role
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

function LimitDialog({ shopId, member, onClose, currency }: { shopId: string; member: StaffMember; onClose: () => void; currency: string }) {
  const update = useUpdateMember(shopId);
  const toast = useToast();
  const [fieldError, setFieldError] = useState<string | undefined>();
  const initial = member.spendingLimitMinor === null ? '' : (member.spendingLimitMinor / 100).toFixed(2);

  function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    const text = String(new FormData(event.currentTarget).get('limit') ?? '').trim();
    const minor = text === '' ? null : parseMajorAmount(text);
    if (text !== '' && minor === null) {
      setFieldError('Enter an amount such as 500 or 1250.50, or leave it empty for no limit.');
      return;
    }
    setFieldError(undefined);
    update.mutate(
      { kind: 'limit', membershipId: member.membershipId, spendingLimitMinor: minor },
      {
        onSuccess: () => {
          toast.show(minor === null ? `${member.name} has no spending limit now: every order waits for approval.` : `${member.name} may now order up to ${formatMoney(minor, currency)}.`, 'ok');
          onClose();
        },
      },
    );
  }

  return (
    <Dialog open onClose={onClose} title={`Spending limit for ${member.name}`} description="Purchase orders up to this total go out without approval; larger ones wait for an owner.">
      <form noValidate onSubmit={onSubmit} className="flex flex-col gap-4">
        {update.isError && <FormMessage>{errorMessage(update.error)}</FormMessage>}
        <TextField label={`Spending limit (${currency})`} name="limit" inputMode="decimal" defaultValue={initial} hint="Leave empty for no limit." error={fieldError} />
        <div className="flex flex-wrap justify-end gap-2 border-t border-line pt-4">
          <Button type="button" variant="secondary" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" loading={update.isPending}>
            Save limit
          </Button>
        </div>
      </form>
    </Dialog>
  );
}

function ActiveDialog({ shopId, member, activate, onClose }: { shopId: string; member: StaffMember; activate: boolean; onClose: () => void }) {
  const update = useUpdateMember(shopId);
  const toast = useToast();
  return (
    <ConfirmDialog
      open
      onCancel={onClose}
      title={activate ? `Reactivate ${member.name}?` : `Deactivate ${member.name}?`}
      message={
        <div className="flex flex-col gap-2">
          {activate ? (
            <p>{member.name} can sign in to this shop again with their own password, as {roleLabels[member.role].toLowerCase()}.</p>
          ) : (
            <p>
              {member.name} is signed out of Tappet at once, on every device, and can no longer open this shop. Nothing is deleted: their history stays
              in the records and the audit log, and you can reactivate them later.
            </p>
          )}
          {update.isError && (
            <p role="alert" className="font-bold text-fail">
              {errorMessage(update.error)}
            </p>
          )}
        </div>
      }
      confirmLabel={activate ? 'Reactivate' : 'Deactivate and sign out'}
      destructive={!activate}
      loading={update.isPending}
      onConfirm={() =>
        update.mutate(
          { kind: 'active', membershipId: member.membershipId, active: activate },
          {
            onSuccess: () => {
              toast.show(activate ? `${member.name} is active again.` : `${member.name} is deactivated and signed out.`, 'ok');
              onClose();
            },
          },
        )
      }
    />
  );
}
