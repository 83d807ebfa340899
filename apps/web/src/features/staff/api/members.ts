import { staffMemberSchema, type ShopRole, type StaffMember } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { meQueryKey } from '../../../lib/auth';
import { staffKeys } from './keys';

const member = (shopId: string, membershipId: string) => `/shops/${encodeURIComponent(shopId)}/staff/${encodeURIComponent(membershipId)}`;

/** PATCH …/staff/:membershipId/role. The last active owner cannot be demoted (409). */
export function updateMemberRole(shopId: string, membershipId: string, role: ShopRole): Promise<StaffMember> {
  return api.patch(`${member(shopId, membershipId)}/role`, { role }, { schema: staffMemberSchema });
}

/** PATCH …/staff/:membershipId/spending-limit (buyers only), minor units or null for none. */
export function updateSpendingLimit(shopId: string, membershipId: string, spendingLimitMinor: number | null): Promise<StaffMember> {
  return api.patch(`${member(shopId, membershipId)}/spending-limit`, { spendingLimitMinor }, { schema: staffMemberSchema });
}

/** POST …/staff/:membershipId/deactivate|reactivate. Deactivating ends the person's sessions at once. */
export function setMemberActive(shopId: string, membershipId: string, active: boolean): Promise<StaffMember> {
  return api.post(`${member(shopId, membershipId)}/${active ? 'reactivate' : 'deactivate'}`, {}, { schema: staffMemberSchema });
}

type MemberChange =
  | { kind: 'role'; membershipId: string; role: ShopRole }
  | { kind: 'limit'; membershipId: string; spendingLimitMinor: number | null }
  | { kind: 'active'; membershipId: string; active: boolean };

/** One mutation for every change to a member; refreshes the list and "me" (my own role may have changed). */
export function useUpdateMember(shopId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (change: MemberChange) => {
      switch (change.kind) {
        case 'role':
          return updateMemberRole(shopId, change.membershipId, change.role);
        case 'limit':
          return updateSpendingLimit(shopId, change.membershipId, change.spendingLimitMinor);
        case 'active':
          return setMemberActive(shopId, change.membershipId, change.active);
      }
    },
    onSuccess: async () => {
      await Promise.all([queryClient.invalidateQueries({ queryKey: staffKeys.list(shopId) }), queryClient.invalidateQueries({ queryKey: meQueryKey })]);
    },
  });
}
