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
  await revalidatePayments(row.appointmentId);
  return row;
}

/**
 * Every cached range of the owner's list and the appointment's staff page, asked again (after a
 * refund, or after one was refused because the payment changed meanwhile). Answers the payment's
 * row as the list has it now, if a list holds it.
 */
export async function revalidatePayments(
  appointmentId: string,
  paymentId?: string,
): Promise<WorkshopPaymentRow | undefined> {
  const answers: unknown[] = await mutate(
    (key) =>
      typeof key === 'string' &&
      (key === workshopPaymentsPath ||
        key.startsWith(`${workshopPaymentsPath}?`) ||
        key === staffAppointmentKey(appointmentId)),
  );
  if (!paymentId) return undefined;
  for (const answer of answers) {
    const rows = (answer as Partial<WorkshopPayments> | undefined)?.rows;
    const row = rows?.find((r) => r.id === paymentId);
    if (row) return row;
  }
  return undefined;
}
