import type { SagCheckInput, SagCheckResult } from '@loamline/shared-types';
import useSWRMutation from 'swr/mutation';
import { api } from '@/lib/api-client';

/** `POST /api/baselines/sag-check` (public): the sag measured at a pressure in, the correction out. */
export const SAG_CHECK_PATH = '/baselines/sag-check';

export function sagCheck(input: SagCheckInput): Promise<SagCheckResult> {
  return api<SagCheckResult>(SAG_CHECK_PATH, { method: 'POST', body: { ...input } });
}

/** Runs a sag check when the rider asks (`trigger(input)`); the answer and any error stay on the hook. */
export function useSagCheck() {
  return useSWRMutation<SagCheckResult, Error, typeof SAG_CHECK_PATH, SagCheckInput>(
    SAG_CHECK_PATH,
    (_path: string, { arg }: { arg: SagCheckInput }) => sagCheck(arg),
  );
}
