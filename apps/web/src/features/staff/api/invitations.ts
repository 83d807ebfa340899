import { invitationSummarySchema, type CreateInvitationRequest, type InvitationSummary } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { staffKeys } from './keys';

const base = (shopId: string) => `/shops/${encodeURIComponent(shopId)}/staff/invitations`;

/** POST /api/shops/:shopId/staff/invitations: e-mails an invitation link. */
export function createInvitation(shopId: string, input: CreateInvitationRequest): Promise<InvitationSummary> {
  return api.post(base(shopId), input, { schema: invitationSummarySchema });
}

/** POST …/invitations/:id/resend: a new link; the old one stops working. */
export function resendInvitation(shopId: string, invitationId: string): Promise<InvitationSummary> {
  return api.post(`${base(shopId)}/${encodeURIComponent(invitationId)}/resend`, {}, { schema: invitationSummarySchema });
}

/** DELETE …/invitations/:id: withdraws an invitation; its link stops working. */
export function withdrawInvitation(shopId: string, invitationId: string): Promise<unknown> {
  return api.delete(`${base(shopId)}/${encodeURIComponent(invitationId)}`);
}

export function useCreateInvitation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateInvitationRequest) => createInvitation(shopId, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: staffKeys.list(shopId) }),
  });
}

export function useResendInvitation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => resendInvitation(shopId, invitationId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: staffKeys.list(shopId) }),
  });
}

export function useWithdrawInvitation(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: string) => withdrawInvitation(shopId, invitationId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: staffKeys.list(shopId) }),
  });
}
