import type { BaselineInput, BaselineResult } from '@loamline/shared-types';
import useSWR from 'swr';
import { api } from '@/lib/api-client';

/** `POST /api/baselines/compute` (public): a rider, riding and bike in, the baseline out. */
export const COMPUTE_BASELINE_PATH = '/baselines/compute';

export type ComputeBaselineKey = readonly [typeof COMPUTE_BASELINE_PATH, BaselineInput];

export const computeBaselineKey = (input: BaselineInput | null): ComputeBaselineKey | null =>
  input ? [COMPUTE_BASELINE_PATH, input] : null;

export function computeBaseline(input: BaselineInput): Promise<BaselineResult> {
  return api<BaselineResult>(COMPUTE_BASELINE_PATH, { method: 'POST', body: { ...input } });
}

/**
 * The baseline for `input`, computed by the server (no spring model in the browser). A null input
 * asks for nothing. SWR hashes the body into the key, so the same input is not computed twice, and
 * the last result stays shown while a changed input is computed.
 */
export function useComputeBaseline(input: BaselineInput | null) {
  return useSWR<BaselineResult, Error, ComputeBaselineKey | null>(
    computeBaselineKey(input),
    ([, body]: ComputeBaselineKey) => computeBaseline(body),
    {
      keepPreviousData: true,
      revalidateOnFocus: false,
      revalidateOnReconnect: false,
      shouldRetryOnError: false,
    },
  );
}
