import useSWR from 'swr';
import type { TeamResponse } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export const teamKey = '/workshop/team';

export const getTeam = () => api<TeamResponse>(teamKey);

/** `GET /api/workshop/team` (staff): the shop, its members and its open invitations. */
export function useTeam() {
  return useSWR<TeamResponse, Error>(teamKey, getTeam);
}
