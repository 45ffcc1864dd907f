import useSWR from 'swr';
import type { ShopSummary } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export const shopsKey = '/shops';

export const getShops = () => api<ShopSummary[]>(shopsKey);

/** `GET /api/shops`: every shop, by name (no account needed). */
export function useShops() {
  return useSWR<ShopSummary[], Error>(shopsKey, getShops);
}
