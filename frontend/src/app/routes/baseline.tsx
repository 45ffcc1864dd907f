import { BaselineWizard } from '@/features/baseline/components/baseline-wizard';
import { BaselineWizardProvider } from '@/features/baseline/hooks/use-baseline-wizard';
import { ResumeSheetSave, SaveSheetAction } from '@/features/baseline-sheets/components/save-sheet';
import { BikeFromQuery, GaragePicker } from '@/features/garage/components/garage-picker';

export function Component() {
  return (
    <BaselineWizardProvider>
      {/* accounts: back from sign-in with a baseline to save; a garage bike from ?bike= */}
      <ResumeSheetSave />
      <BikeFromQuery />
      <BaselineWizard
        sheetActions={(sheet) => <SaveSheetAction {...sheet} />}
        bikePicker={<GaragePicker />}
      />
    </BaselineWizardProvider>
  );
}
