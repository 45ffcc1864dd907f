import useSWR from 'swr';
import type { BaselineSheet } from '@loamline/shared-types';
import { api } from '@/lib/api-client';

export const sheetKey = (id: string) => `/baseline-sheets/${encodeURIComponent(id)}`;

export const getSheet = (id: string) => api<BaselineSheet>(sheetKey(id));

/** `GET /api/baseline-sheets/:id`: the input and the result as computed when it was saved. */
export function useSheet(id: string | undefined) {
  return useSWR<BaselineSheet, Error>(id ? sheetKey(id) : null, () => getSheet(id!), {
    shouldRetryOnError: false,
  });
}
