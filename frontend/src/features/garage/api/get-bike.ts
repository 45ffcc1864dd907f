import useSWR from 'swr';
import type { Bike } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export const bikeKey = (id: string) => `/bikes/${encodeURIComponent(id)}`;

export const getBike = (id: string) => api<Bike>(bikeKey(id));

/** `GET /api/bikes/:id`: one bike of the signed-in rider (404 when it is not theirs). */
export function useBike(id: string | null) {
  return useSWR<Bike, Error>(id ? bikeKey(id) : null, () => getBike(id!), { shouldRetryOnError: false });
}
