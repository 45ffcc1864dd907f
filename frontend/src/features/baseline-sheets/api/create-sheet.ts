import { mutate } from 'swr';
import type { BaselineSheet, CreateBaselineSheetRequest } from '@loamline/shared-types';
import { api } from '@/lib/api-client';
import { sheetKey } from './get-sheet';
import { sheetsKey } from './get-sheets';

/** `POST /api/baseline-sheets` → 201: the server computes and stores the result with the input. */
export async function createSheet(body: CreateBaselineSheetRequest): Promise<BaselineSheet> {
  const sheet = await api<BaselineSheet>(sheetsKey, { method: 'POST', body: { ...body } });
  await mutate(sheetKey(sheet.id), sheet, { revalidate: false });
  await mutate(sheetsKey);
  return sheet;
}
