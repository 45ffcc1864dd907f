import type { PasswordResetRequest } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

/** `POST /api/auth/password-reset`: always 202, whether or not the address has an account. */
export function requestPasswordReset(body: PasswordResetRequest): Promise<void> {
  return api<void>('/auth/password-reset', { method: 'POST', body: { ...body } });
}
