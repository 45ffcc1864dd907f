import useSWR from 'swr';
import type { Bike } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export const bikesKey = '/bikes';

export const getBikes = () => api<Bike[]>(bikesKey);

/** `GET /api/bikes`: the signed-in rider's garage. Pass `false` to skip (signed out). */
export function useBikes(enabled = true) {
  return useSWR<Bike[], Error>(enabled ? bikesKey : null, getBikes);
}
