import { mutate } from 'swr';
import { api } from '@/lib/api-client';
import type { AuthUser, SignInRequest, SignInResponse } from '@loamline/shared-types';
import { meKey } from './get-me';

/** `POST /api/auth/sign-in`: sets the session cookie; the session hook learns the user at once. */
export async function signIn(body: SignInRequest): Promise<AuthUser> {
  const { user } = await api<SignInResponse>('/auth/sign-in', {
    method: 'POST',
    body: { ...body },
  });
  await mutate(meKey, user, { revalidate: false });
  return user;
}
