import { mutate } from 'swr';
import type { Bike, UpdateBikeRequest } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { bikeKey } from './get-bike';
import { bikesKey } from './get-bikes';

/** `PATCH /api/bikes/:id` → 200 the changed bike. */
export async function updateBike(id: string, body: UpdateBikeRequest): Promise<Bike> {
  const bike = await api<Bike>(bikeKey(id), { method: 'PATCH', body: { ...body } });
  await mutate(bikeKey(id), bike, { revalidate: false });
  await mutate(bikesKey);
  return bike;
}
