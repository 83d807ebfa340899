import { roleLabels, type InvitationSummary, type StaffMember } from '@tappet/contracts';
import { Badge, Button, ConfirmDialog, createColumnHelper, DataTable, EmptyState, ErrorState, LoadingState, MenuButton, StatusPill, useToast } from '@tappet/ui';
import { useMemo, useState } from 'react';
import { errorMessage } from '../../../lib/api-client';
import { useStaff } from '../api/get-staff';
import { useResendInvitation, useWithdrawInvitation } from '../api/invitations';
import { InviteDialog } from './invite-dialog';
import { MemberActionDialog, type MemberAction } from './member-dialogs';
import { formatDateTime, formatMoney } from './words';

const memberColumn = createColumnHelper<StaffMember>();

/** Resends one invitation; its own mutation, so the table's columns stay stable (cells are not remounted). */
function ResendButton({ shopId, invitation }: { shopId: string; invitation: InvitationSummary }) {
  const resend = useResendInvitation(shopId);
  const toast = useToast();
  return (
    <Button
      variant="secondary"
      size="sm"
      aria-label={`Resend the invitation to ${invitation.email}`}
      loading={resend.isPending}
      onClick={() =>
        resend.mutate(invitation.id, {
          onSuccess: () => toast.show(`A new link went to ${invitation.email}. The old link no longer works.`, 'ok'),
          onError: (error) => toast.show(errorMessage(error), 'fail'),
        })
      }
    >
      Resend
    </Button>
  );
}
const invitationColumn = createColumnHelper<InvitationSummary>();

export interface StaffScreenProps {
  shopId: string;
  /** The shop's currency (ISO 4217), for spending limits. */
  currency: string;
  /** The signed-in person, so their own row says "you". */
  myUserId: string;
}

/** The owner's staff screen: members with their roles and limits, open invitations, and the invite dialog. */
export function StaffScreen({ shopId, currency, myUserId }: StaffScreenProps) {
  const staff = useStaff(shopId);
  const [inviting, setInviting] = useState(false);
  const [action, setAction] = useState<MemberAction | null>(null);
  const [withdrawing, setWithdrawing] = useState<InvitationSummary | null>(null);
  const withdraw = useWithdrawInvitation(shopId);
  const toast = useToast();

  const memberColumns = useMemo(
    () => [
      memberColumn.accessor('name', {
        header: 'Name and e-mail',
        cell: (info) => (
          <>
            <span className="font-bold">
              {info.getValue()}
              {info.row.original.userId === myUserId && <span className="font-normal text-ink-muted"> (you)</span>}
            </span>
            {/* The address under the name: the row's role, limit and actions then fit on a tablet. */}
            <span className="block text-sm break-all text-ink-muted">{info.row.original.email}</span>
          </>
        ),
      }),
      memberColumn.accessor((m) => roleLabels[m.role], { id: 'role', header: 'Role', cell: (info) => <Badge tone={info.row.original.role === 'owner' ? 'accent' : 'neutral'} className="whitespace-nowrap">{info.getValue()}</Badge> }),
      memberColumn.accessor('spendingLimitMinor', {
        header: 'Spending limit',
        meta: { numeric: true },
        sortUndefined: 'last',
        cell: (info) => {
          const m = info.row.original;
          if (m.role !== 'buyer') return <span className="font-sans text-ink-muted">—</span>;
          return m.spendingLimitMinor === null ? <span className="font-sans">None: every order waits</span> : formatMoney(m.spendingLimitMinor, currency);
        },
      }),
      memberColumn.accessor((m) => (m.isActive ? 'Active' : 'Deactivated'), {
        id: 'status',
        header: 'Status',
        cell: (info) => (info.row.original.isActive ? <StatusPill status="ok" label="Active" /> : <StatusPill status="na" label="Deactivated" />),
      }),
      memberColumn.display({
        id: 'actions',
        header: () => (
          <span className="relative">
            <span className="sr-only">Actions</span>
          </span>
        ),
        cell: (info) => {
          const m = info.row.original;
          const items = m.isActive
            ? [
                { key: 'role', label: 'Change role', onSelect: () => setAction({ kind: 'role', member: m }) },
                ...(m.role === 'buyer' ? [{ key: 'limit', label: 'Set spending limit', onSelect: () => setAction({ kind: 'limit', member: m }) }] : []),
                { key: 'deactivate', label: 'Deactivate', onSelect: () => setAction({ kind: 'deactivate', member: m }) },
              ]
            : [{ key: 'reactivate', label: 'Reactivate', onSelect: () => setAction({ kind: 'reactivate', member: m }) }];
          return <MenuButton label="Actions" accessibleLabel={`Actions for ${m.name}`} items={items} />;
        },
      }),
    ],
    [currency, myUserId],
  );

  const invitationColumns = useMemo(
    () => [
      invitationColumn.accessor('email', { header: 'E-mail', cell: (info) => <span className="font-bold break-all">{info.getValue()}</span> }),
      invitationColumn.accessor((i) => roleLabels[i.role], { id: 'role', header: 'Role', cell: (info) => <Badge className="whitespace-nowrap">{info.getValue()}</Badge> }),
      invitationColumn.accessor('invitedByName', { header: 'Invited by', cell: (info) => info.getValue() ?? '—' }),
      invitationColumn.accessor('expiresAt', {
        header: 'Link',
        cell: (info) =>
          info.row.original.expired ? (
            <StatusPill status="fail" label="Expired: resend it" />
          ) : (
            <span>
              Valid until <time dateTime={info.getValue()}>{formatDateTime(info.getValue())}</time>
            </span>
          ),
      }),
      invitationColumn.display({
        id: 'actions',
        header: () => (
          <span className="relative">
            <span className="sr-only">Actions</span>
          </span>
        ),
        cell: (info) => {
          const i = info.row.original;
          return (
            <div className="flex gap-2">
              <ResendButton shopId={shopId} invitation={i} />
              <Button variant="ghost" size="sm" aria-label={`Withdraw the invitation to ${i.email}`} onClick={() => setWithdrawing(i)}>
                Withdraw
              </Button>
            </div>
          );
        },
      }),
    ],
    [shopId],
  );

  if (staff.isPending) return <LoadingState label="Loading the staff…" />;
  if (staff.isError) return <ErrorState message={errorMessage(staff.error)} onRetry={() => void staff.refetch()} />;

  const { members, invitations } = staff.data;
  const active = members.filter((m) => m.isActive).length;

  return (
    <div className="flex flex-col gap-8">
      <div className="flex flex-wrap items-center justify-between gap-4">
        <p className="text-ink-muted">
          {active} active {active === 1 ? 'person' : 'people'}
          {members.length > active ? `, ${members.length - active} deactivated` : ''}. People are never deleted: deactivating keeps their history.
        </p>
        <Button onClick={() => setInviting(true)}>Invite someone</Button>
      </div>

      <section aria-labelledby="members-title" className="flex flex-col gap-3">
        <h2 id="members-title" className="text-lg font-bold">
          People
        </h2>
        <DataTable
          caption="People in the shop"
          columns={memberColumns}
          data={members}
          getRowId={(m) => m.membershipId}
          initialSorting={[{ id: 'name', desc: false }]}
          filterLabel={members.length > 8 ? 'Filter people' : undefined}
          empty={<EmptyState title="Nobody here yet">Invite the people who work in the shop.</EmptyState>}
        />
      </section>

      <section aria-labelledby="invitations-title" className="flex flex-col gap-3">
        <h2 id="invitations-title" className="text-lg font-bold">
          Open invitations
        </h2>
        <DataTable
          caption="Open invitations"
          columns={invitationColumns}
          data={invitations}
          getRowId={(i) => i.id}
          empty={
            <EmptyState title="No open invitations" action={<Button variant="secondary" onClick={() => setInviting(true)}>Invite someone</Button>}>
              Invitations appear here until they are accepted. A link works once, for 7 days.
            </EmptyState>
          }
        />
      </section>

      <InviteDialog shopId={shopId} open={inviting} onClose={() => setInviting(false)} currency={currency} />
      <MemberActionDialog shopId={shopId} action={action} onClose={() => setAction(null)} currency={currency} />
      <ConfirmDialog
        open={withdrawing !== null}
        onCancel={() => {
          withdraw.reset();
          setWithdrawing(null);
        }}
        title="Withdraw this invitation?"
        message={
          <div className="flex flex-col gap-2">
            <p>The link sent to {withdrawing?.email} stops working at once. You can invite them again later.</p>
            {withdraw.isError && (
              <p role="alert" className="font-bold text-fail">
                {errorMessage(withdraw.error)}
              </p>
            )}
          </div>
        }
        confirmLabel="Withdraw invitation"
        destructive
        loading={withdraw.isPending}
        onConfirm={() => {
          if (!withdrawing) return;
          const email = withdrawing.email;
          withdraw.mutate(withdrawing.id, {
            onSuccess: () => {
              toast.show(`The invitation to ${email} is withdrawn.`, 'ok');
              setWithdrawing(null);
            },
          });
        }}
      />
    </div>
  );
}
