import useSWR from 'swr';
import type { AvailableStart } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

/** `GET /api/shops/:slug/availability?serviceId&from&to`: free starts for a service (local dates). */
export function useAvailability(query: { slug: string; serviceId: string; from: string; to: string } | null) {
  const key = query
    ? `/shops/${encodeURIComponent(query.slug)}/availability?${new URLSearchParams({
        serviceId: query.serviceId,
        from: query.from,
        to: query.to,
      }).toString()}`
    : null;
  return useSWR<AvailableStart[], Error>(key, (k: string) => api<AvailableStart[]>(k));
}
