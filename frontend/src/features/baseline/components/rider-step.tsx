import Stack from '@mui/material/Stack';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import type { MassUnit } from '@/lib/units';
import { useBaselineWizard } from '../hooks/use-baseline-wizard';
import { NumberField } from './form-fields';
import { StepTitle } from './step-title';

export function RiderStep() {
  const { form, units, setUnits } = useBaselineWizard();
  return (
    <Stack spacing={3}>
      <StepTitle
        title="How much do you weigh, ready to ride?"
        lead="Weigh yourself in what you ride in: shoes, helmet, pack with water and tools. That is the load your suspension carries."
      />
      <Stack direction="row" spacing={1.5} sx={{ alignItems: 'flex-start' }}>
        <NumberField
          control={form.control}
          name="rider.massKg"
          label="Weight with riding gear"
          display={{ quantity: 'mass', prefs: units }}
          autoFocus
          helperText="Body weight plus everything you ride in"
        />
        <ToggleButtonGroup
          exclusive
          color="primary"
          aria-label="Weight unit"
          value={units.mass}
          onChange={(_e, v: MassUnit | null) => v && setUnits({ system: v === 'lb' ? 'imperial' : 'metric' })}
          sx={{ height: 56, bgcolor: 'background.paper' }}
        >
          <ToggleButton value="kg">kg</ToggleButton>
          <ToggleButton value="lb">lb</ToggleButton>
        </ToggleButtonGroup>
      </Stack>
      <Typography variant="body2" color="text.secondary">
        No account needed. Loamline does not keep what you type here unless you save a baseline sheet.
      </Typography>
    </Stack>
  );
}
