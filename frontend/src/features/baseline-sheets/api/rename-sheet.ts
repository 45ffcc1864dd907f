import { mutate } from 'swr';
import type { BaselineSheet, RenameBaselineSheetRequest } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { sheetKey } from './get-sheet';
import { sheetsKey } from './get-sheets';

/** `PATCH /api/baseline-sheets/:id` `{ name }` → 200 the sheet. */
export async function renameSheet(id: string, body: RenameBaselineSheetRequest): Promise<BaselineSheet> {
  const sheet = await api<BaselineSheet>(sheetKey(id), { method: 'PATCH', body: { ...body } });
  await mutate(sheetKey(id), sheet, { revalidate: false });
  await mutate(sheetsKey);
  return sheet;
}
