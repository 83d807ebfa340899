import type { PasswordResetRequest } from '@tappet/contracts';
import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

/** POST /api/auth/password-reset/request: always answers 200, whether the address exists or not. */
export async function requestPasswordReset(input: PasswordResetRequest): Promise<void> {
  await api.post('/auth/password-reset/request', input);
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
