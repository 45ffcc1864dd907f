import { mutate } from 'swr';
import { api } from '@/lib/api-client';
import { bikeKey } from './get-bike';
import { bikesKey } from './get-bikes';

/** `DELETE /api/bikes/:id` → 204. Saved baseline sheets keep their own copy of the bike. */
export async function deleteBike(id: string): Promise<void> {
  await api<void>(bikeKey(id), { method: 'DELETE' });
  await mutate(bikeKey(id), undefined, { revalidate: false });
  await mutate(bikesKey);
}
