import { useEffect, useRef } from 'react';
import { useSearchParams } from 'react-router';
import { useBaselineWizard } from '@/features/baseline/hooks/use-baseline-wizard';

/** `/baseline?resume=sheet`: back from sign-in with a baseline to save. */
export const RESUME_PARAM = 'resume';
export const RESUME_VALUE = 'sheet';

/**
 * Put inside `<BaselineWizardProvider>`. Back from sign-in at `/baseline?resume=sheet`: the wizard
 * has read back its kept draft (input and step, utils/draft.ts), normally on the Baseline step; if
 * it stopped at the Bike step (an older draft), Next checks it and works the baseline out.
 */
export function ResumeSheetSave() {
  const [params] = useSearchParams();
  const { stepId, next } = useBaselineWizard();
  const done = useRef(false);
  const resuming = params.get(RESUME_PARAM) === RESUME_VALUE;

  useEffect(() => {
    if (!resuming || done.current) return;
    done.current = true;
    if (stepId === 'bike') void next();
  }, [resuming, stepId, next]);

  return null;
}
