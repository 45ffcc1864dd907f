import { Suspense, lazy } from 'react';
import { BaselineWizard } from '@/features/baseline/components/baseline-wizard';
import { BaselineWizardProvider } from '@/features/baseline/hooks/use-baseline-wizard';
import { ResumeSheetSave } from '@/features/baseline-sheets/components/resume-sheet-save';
import { BikeFromQuery, GaragePicker } from '@/features/garage/components/garage-picker';

// drawn on the Baseline step only, with the result: its code (the name dialog, the save) loads then
const SaveSheetAction = lazy(() =>
  import('@/features/baseline-sheets/components/save-sheet').then((m) => ({ default: m.SaveSheetAction })),
);

export function Component() {
  return (
    <BaselineWizardProvider>
      {/* accounts: back from sign-in with a baseline to save; a garage bike from ?bike= */}
      <ResumeSheetSave />
      <BikeFromQuery />
      <BaselineWizard
        sheetActions={(sheet) => (
          <Suspense fallback={null}>
            <SaveSheetAction {...sheet} />
          </Suspense>
        )}
        bikePicker={<GaragePicker />}
      />
    </BaselineWizardProvider>
  );
}
