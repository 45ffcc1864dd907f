import type { RidingFeel, RidingStyle } from '@loamline/shared-types';
import Stack from '@mui/material/Stack';
import type { BaselineFormValues } from '../form';
import { useBaselineWizard } from '../hooks/use-baseline-wizard';
import { ChoiceField, type Choice } from './form-fields';
import { StepTitle } from './step-title';

export const STYLE_CHOICES: readonly Choice<RidingStyle>[] = [
  { value: 'cross-country', label: 'Cross-country', hint: 'Long climbs, fast and efficient' },
  { value: 'trail', label: 'Trail', hint: 'A bit of everything, up and down' },
  { value: 'enduro', label: 'Enduro', hint: 'Steep, rough descents; climbing to get there' },
  { value: 'downhill', label: 'Downhill', hint: 'Lift or shuttle, big hits at speed' },
  { value: 'park', label: 'Park / jump', hint: 'Jumps, drops and berms' },
];

export const FEEL_CHOICES: readonly Choice<RidingFeel>[] = [
  { value: 'supple', label: 'Supple', hint: 'More sag: smooth over small bumps and roots' },
  { value: 'balanced', label: 'Balanced', hint: 'The middle of the range for your riding' },
  { value: 'firm', label: 'Firm', hint: 'Less sag: more support to push and pump' },
];

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
