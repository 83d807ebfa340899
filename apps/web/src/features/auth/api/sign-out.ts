import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { meQueryKey } from '../../../lib/auth';

/** POST /api/auth/sign-out: ends the session. */
export async function signOut(): Promise<void> {
  await api.post('/auth/sign-out');
}

/** Signs out and forgets every cached answer, even when the request fails (e.g. already expired). */
export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSettled: () => {
      queryClient.clear();
      queryClient.setQueryData(meQueryKey, null);
    },
  });
}
