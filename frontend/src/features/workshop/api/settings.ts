import useSWR, { mutate } from 'swr';
import type { ShopSettings } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { teamKey } from './get-team';

export const settingsKey = '/workshop/settings';

/** `GET /api/workshop/settings` (staff): zone, currency, benches, hours, closures, rules. */
export function useShopSettings() {
  return useSWR<ShopSettings, Error>(settingsKey, (k: string) => api<ShopSettings>(k));
}

/** `PUT /api/workshop/settings` (owner): the whole settings at once; 400 names `fields`. */
export async function saveShopSettings(body: ShopSettings): Promise<ShopSettings> {
  const saved = await api<ShopSettings>(settingsKey, { method: 'PUT', body: { ...body } });
  await mutate(settingsKey, saved, { revalidate: false });
  await mutate(teamKey); // the shop's zone and currency show there too
  return saved;
}

/** `POST /api/workshop/calendar-feed` (owner) → a new secret ICS URL; the old one stops working. */
export function renewCalendarFeed(): Promise<{ url: string }> {
  return api<{ url: string }>('/workshop/calendar-feed', { method: 'POST', body: {} });
}
