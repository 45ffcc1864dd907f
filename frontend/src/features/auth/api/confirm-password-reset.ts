import type { PasswordResetConfirmRequest } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

/** `POST /api/auth/password-reset/confirm`: sets the new password with the link's single-use token. */
export function confirmPasswordReset(body: PasswordResetConfirmRequest): Promise<void> {
  return api<void>('/auth/password-reset/confirm', { method: 'POST', body: { ...body } });
}
