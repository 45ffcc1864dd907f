import { mutate } from 'swr';
import { api } from '@/lib/api-client';
import type { AuthUser, RegisterRequest, RegisterResponse } from '@loamline/shared-types';
import { meKey } from './get-me';

/** `POST /api/auth/register`: creates a rider account and signs them in. */
export async function register(body: RegisterRequest): Promise<AuthUser> {
  const { user } = await api<RegisterResponse>('/auth/register', { method: 'POST', body: { ...body } });
  await mutate(meKey, user, { revalidate: false });
  return user;
}
