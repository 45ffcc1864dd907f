import useSWR, { mutate } from 'swr';
import type { RefundRequest, WorkshopPaymentRow, WorkshopPayments } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { appointmentKey as staffAppointmentKey } from '@/features/workshop/api/get-appointment';

export const workshopPaymentsPath = '/workshop/payments';

/** The list's key; without dates the server answers the last 30 days. */
export const workshopPaymentsKey = (range: { from?: string | null; to?: string | null } = {}) => {
  const p = new URLSearchParams();
  if (range.from) p.set('from', range.from);
  if (range.to) p.set('to', range.to);
  const s = p.toString();
  return s ? `${workshopPaymentsPath}?${s}` : workshopPaymentsPath;
};

/** `GET /api/workshop/payments?from&to` (owner; technicians get 403): rows, totals by day, totals. */
export function useWorkshopPayments(range: { from?: string | null; to?: string | null }) {
  return useSWR<WorkshopPayments, Error>(
    workshopPaymentsKey(range),
    (key: string) => api<WorkshopPayments>(key),
    {
      keepPreviousData: true,
    },
  );
}

/**
 * `POST /api/workshop/payments/:id/refunds` (owner): 400 with `fields` when the amount is more than
 * is left. The same `requestId` twice refunds once. Afterwards every cached range and the
 * appointment's staff page are stale.
 */
export async function refundPayment(paymentId: string, body: RefundRequest): Promise<WorkshopPaymentRow> {
  const row = await api<WorkshopPaymentRow>(
    `${workshopPaymentsPath}/${encodeURIComponent(paymentId)}/refunds`,
    {
      method: 'POST',
      body: { ...body },
    },
  );
  await mutate(
    (key) =>
      typeof key === 'string' &&
      (key === workshopPaymentsPath ||
        key.startsWith(`${workshopPaymentsPath}?`) ||
        key === staffAppointmentKey(row.appointmentId)),
  );
  return row;
}
