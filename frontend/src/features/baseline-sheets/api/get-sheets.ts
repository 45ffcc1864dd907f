import useSWR from 'swr';
import type { BaselineSheetListItem } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export const sheetsKey = '/baseline-sheets';

export const getSheets = () => api<BaselineSheetListItem[]>(sheetsKey);

/** `GET /api/baseline-sheets`: the signed-in rider's sheets, newest first, headline numbers only. */
export function useSheets() {
  return useSWR<BaselineSheetListItem[], Error>(sheetsKey, getSheets);
}
