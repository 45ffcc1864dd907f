import { mutate } from 'swr';
import { api } from '@/lib/api-client';
import { meKey } from './get-me';

/** `POST /api/auth/sign-out`: clears the cookie; every cached answer of the old session is dropped. */
export async function signOut(): Promise<void> {
  await api<void>('/auth/sign-out', { method: 'POST' });
  await mutate(meKey, null, { revalidate: false });
  // Bikes, sheets and Workshop answers belonged to the user who just left.
  await mutate((key) => key !== meKey, undefined, { revalidate: false });
}
