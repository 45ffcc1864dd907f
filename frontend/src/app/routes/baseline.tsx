import { BaselineWizard } from '@/features/baseline/components/baseline-wizard';
import { BaselineWizardProvider } from '@/features/baseline/hooks/use-baseline-wizard';

export function Component() {
  return (
    <BaselineWizardProvider>
      <BaselineWizard />
    </BaselineWizardProvider>
  );
}
