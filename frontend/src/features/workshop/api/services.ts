import useSWR, { mutate } from 'swr';
import type { ShopService } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export const servicesKey = '/workshop/services';

/** What the service form sends; without `checklist` the stored one is kept. */
export type ServiceBody = Omit<ShopService, 'id' | 'checklist'> & Partial<Pick<ShopService, 'checklist'>>;

/** `GET /api/workshop/services` (staff): every service of the shop, active or not. */
export function useServices() {
  return useSWR<ShopService[], Error>(servicesKey, (k: string) => api<ShopService[]>(k));
}

/** `POST /api/workshop/services` (owner) → 201 */
export async function createService(body: ServiceBody): Promise<ShopService> {
  const s = await api<ShopService>(servicesKey, { method: 'POST', body: { ...body } });
  await mutate(servicesKey);
  return s;
}

/** `PATCH /api/workshop/services/:id` (owner) */
export async function updateService(id: string, body: Partial<ServiceBody>): Promise<ShopService> {
  const s = await api<ShopService>(`${servicesKey}/${encodeURIComponent(id)}`, { method: 'PATCH', body });
  await mutate(servicesKey);
  return s;
}

/** `DELETE /api/workshop/services/:id` (owner) → 204; a service with bookings is retired instead. */
export async function deleteService(id: string): Promise<void> {
  await api<void>(`${servicesKey}/${encodeURIComponent(id)}`, { method: 'DELETE' });
  await mutate(servicesKey);
}
