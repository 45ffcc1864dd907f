import useSWR from 'swr';
import type { AvailableStart } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export interface AvailabilityQuery {
  slug: string;
  serviceId: string;
  /** local dates YYYY-MM-DD in the shop's zone, inclusive, at most 62 days */
  from: string;
  to: string;
}

export const availabilityKey = ({ slug, serviceId, from, to }: AvailabilityQuery) =>
  `/shops/${encodeURIComponent(slug)}/availability?${new URLSearchParams({ serviceId, from, to }).toString()}`;

export const getAvailability = (q: AvailabilityQuery) => api<AvailableStart[]>(availabilityKey(q));

/** `GET /api/shops/:slug/availability`: free starts between two local dates, with the shop zone's offsets. */
export function useAvailability(q: AvailabilityQuery | null) {
  return useSWR<AvailableStart[], Error>(q ? availabilityKey(q) : null, () => getAvailability(q!), {
    keepPreviousData: false,
  });
}

/** After a booking, cancel or move: every cached availability of the shop is stale. */
export const isAvailabilityKey = (slug: string) => (key: unknown) =>
  typeof key === 'string' && key.startsWith(`/shops/${encodeURIComponent(slug)}/availability?`);
