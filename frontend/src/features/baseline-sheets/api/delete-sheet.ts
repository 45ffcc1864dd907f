import { mutate } from 'swr';
import { api } from '@/lib/api-client';
import { sheetKey } from './get-sheet';
import { sheetsKey } from './get-sheets';

/** `DELETE /api/baseline-sheets/:id` → 204. */
export async function deleteSheet(id: string): Promise<void> {
  await api<void>(sheetKey(id), { method: 'DELETE' });
  await mutate(sheetsKey);
  await mutate(sheetKey(id), undefined, { revalidate: false });
}
