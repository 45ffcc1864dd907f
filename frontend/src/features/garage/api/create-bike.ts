import { mutate } from 'swr';
import type { Bike, BikeRequest } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { bikesKey } from './get-bikes';

/** `POST /api/bikes` → 201 the stored bike; the garage list refreshes. */
export async function createBike(body: BikeRequest): Promise<Bike> {
  const bike = await api<Bike>(bikesKey, { method: 'POST', body: { ...body } });
  await mutate(bikesKey);
  return bike;
}
