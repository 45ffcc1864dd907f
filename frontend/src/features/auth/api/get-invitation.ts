import useSWR from 'swr';
import type { InvitationLookup } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export const invitationKey = (token: string) => `/invitations/${encodeURIComponent(token)}`;

export const getInvitation = (token: string) => api<InvitationLookup>(invitationKey(token));

/** `GET /api/invitations/:token`: which shop invites whom, for the join page. */
export function useInvitation(token: string | null) {
  return useSWR<InvitationLookup, Error>(token ? invitationKey(token) : null, () => getInvitation(token!), {
    shouldRetryOnError: false,
  });
}
