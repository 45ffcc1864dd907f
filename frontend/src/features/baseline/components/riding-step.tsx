import type { RidingFeel, RidingStyle } from '@loamline/shared-types';
import Stack from '@mui/material/Stack';
import type { BaselineFormValues } from '../form';
import { useBaselineWizard } from '../hooks/use-baseline-wizard';
import { FEEL_CHOICES, STYLE_CHOICES } from '../utils/riding-choices';
import { ChoiceField } from './form-fields';
import { StepTitle } from './step-title';

export function RidingStep() {
  const { form } = useBaselineWizard();
  return (
    <Stack spacing={3}>
      <StepTitle
        title="How do you ride?"
        lead="Your riding sets how far the bike should sink under you (the sag)."
      />
      <ChoiceField<BaselineFormValues, RidingStyle>
        control={form.control}
        name="riding.style"
        label="Riding style"
        choices={STYLE_CHOICES}
      />
      <ChoiceField<BaselineFormValues, RidingFeel>
        control={form.control}
        name="riding.feel"
        label="How should it feel?"
        choices={FEEL_CHOICES}
      />
    </Stack>
  );
}
