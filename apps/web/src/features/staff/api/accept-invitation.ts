import { publicInvitationSchema, type AcceptInvitationRequest, type PublicInvitation } from '@tappet/contracts';
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { clearShopCaches } from '../../../lib/query-client';
import { meQueryKey, meSchema, type Me } from '../../../lib/auth';

/** GET /api/invitations/:token (public): the shop, address and role an invitation is for. */
export function getInvitation(token: string, signal?: AbortSignal): Promise<PublicInvitation> {
  return api.get(`/invitations/${encodeURIComponent(token)}`, { schema: publicInvitationSchema, signal });
}

export function invitationQueryOptions(token: string) {
  // Not a shop query: the person may not belong to any shop yet.
  return queryOptions({ queryKey: ['invitation', token], queryFn: ({ signal }) => getInvitation(token, signal), staleTime: 0 });
}

export function useInvitation(token: string | null) {
  return useQuery({ ...invitationQueryOptions(token ?? ''), enabled: Boolean(token) });
}

/**
 * POST /api/invitations/accept: a new account sends name and password and comes back signed in;
 * an existing account (signed in as the invited address) just joins. Either way the answer is "me".
 */
export function acceptInvitation(input: AcceptInvitationRequest): Promise<Me> {
  return api.post('/invitations/accept', input, { schema: meSchema });
}

export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: (me) => {
      clearShopCaches(queryClient, null);
      queryClient.setQueryData(meQueryKey, me);
    },
  });
}
