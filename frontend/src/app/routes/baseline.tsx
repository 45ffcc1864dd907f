import { Suspense, lazy, useState } from 'react';
import { useSearchParams } from 'react-router';
import { BaselineWizard } from '@/features/baseline/components/baseline-wizard';
import { BaselineWizardProvider } from '@/features/baseline/hooks/use-baseline-wizard';
import { ResumeSheetSave } from '@/features/baseline-sheets/components/resume-sheet-save';

// Parts drawn after the first step, or only for some riders, load when they are drawn: the
// save-sheet action with the result, the garage picker on the Bike step, a garage bike from ?bike=.
const SaveSheetAction = lazy(() =>
  import('@/features/baseline-sheets/components/save-sheet').then((m) => ({ default: m.SaveSheetAction })),
);
const GaragePicker = lazy(() =>
  import('@/features/garage/components/garage-picker').then((m) => ({ default: m.GaragePicker })),
);
const BikeFromQuery = lazy(() =>
  import('@/features/garage/components/garage-picker').then((m) => ({ default: m.BikeFromQuery })),
);

/** `?bike=<id>` (from My garage): mounted once the parameter is seen, and kept to show its notice. */
function GarageBikeFromQuery() {
  const [params] = useSearchParams();
  const [wanted, setWanted] = useState(false);
  if (params.has('bike') && !wanted) setWanted(true);
  return wanted ? (
    <Suspense fallback={null}>
      <BikeFromQuery />
    </Suspense>
  ) : null;
}

export function Component() {
  return (
    <BaselineWizardProvider>
      {/* accounts: back from sign-in with a baseline to save; a garage bike from ?bike= */}
      <ResumeSheetSave />
      <GarageBikeFromQuery />
      <BaselineWizard
        sheetActions={(sheet) => (
          <Suspense fallback={null}>
            <SaveSheetAction {...sheet} />
          </Suspense>
        )}
        bikePicker={
          <Suspense fallback={null}>
            <GaragePicker />
          </Suspense>
        }
      />
    </BaselineWizardProvider>
  );
}
