import useSWR from 'swr';
import type { ServiceReport } from '@loamline/shared-types';
import { api, ApiRequestError } from '@/lib/api-client';

export const riderReportKey = (id: string) => `/appointments/${encodeURIComponent(id)}/report`;

/**
 * `GET /api/appointments/:id/report`: the final report of one of my appointments. While the shop
 * is still writing it (a draft) the server answers 404: that reads as `null`, "not written yet".
 */
export function useRiderReport(id: string | undefined, enabled = true) {
  return useSWR<ServiceReport | null, Error>(
    id && enabled ? riderReportKey(id) : null,
    async (key: string) => {
      try {
        return await api<ServiceReport>(key);
      } catch (e) {
        if (e instanceof ApiRequestError && e.status === 404) return null;
        throw e;
      }
    },
  );
}
