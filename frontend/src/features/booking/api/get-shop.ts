import useSWR from 'swr';
import type { ShopDetail } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export const shopKey = (slug: string) => `/shops/${encodeURIComponent(slug)}`;

export const getShop = (slug: string) => api<ShopDetail>(shopKey(slug));

/** `GET /api/shops/:slug`: the shop, its active services and booking rules. */
export function useShop(slug: string | undefined) {
  return useSWR<ShopDetail, Error>(slug ? shopKey(slug) : null, () => getShop(slug!));
}
