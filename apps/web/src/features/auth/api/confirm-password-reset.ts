import type { PasswordResetConfirm } from '@tappet/contracts';
import { useMutation } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

/** POST /api/auth/password-reset/confirm: sets the new password with the e-mailed token. */
export async function confirmPasswordReset(input: PasswordResetConfirm): Promise<void> {
  await api.post('/auth/password-reset/confirm', input);
}

export function useConfirmPasswordReset() {
  return useMutation({ mutationFn: confirmPasswordReset });
}
