import useSWR from 'swr';
import { api, ApiRequestError } from '@/lib/api-client';
import type { SessionUser } from '../types';

export const meKey = '/auth/me';

/** The signed-in user, or null when the server answers 401 (signed out). */
export async function getMe(): Promise<SessionUser | null> {
  try {
    return await api<SessionUser>(meKey);
  } catch (error) {
    if (error instanceof ApiRequestError && error.status === 401) return null;
    throw error;
  }
}

/** The session as the whole app sees it: `user` is undefined while the first answer is on its way. */
export function useSession() {
  const { data, error, mutate } = useSWR<SessionUser | null, Error>(meKey, getMe, {
    revalidateOnFocus: true,
  });
  // No answer yet (null is an answer: signed out).
  return { user: data ?? null, isLoading: data === undefined && !error, error, mutate };
}
