import type { SignInRequest } from '@tappet/contracts';
import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { meQueryKey, meSchema, type Me } from '../../../lib/auth';

/** POST /api/auth/sign-in: opens a session (cookie) and answers with the me payload. */
export function signIn(input: SignInRequest): Promise<Me> {
  return api.post('/auth/sign-in', input, { schema: meSchema });
}

/** Signs in; whatever was cached for a previous person is dropped first. */
export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (me) => {
      queryClient.clear();
      queryClient.setQueryData(meQueryKey, me);
    },
  });
}
