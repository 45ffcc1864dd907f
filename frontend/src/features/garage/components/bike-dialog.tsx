import { zodResolver } from '@hookform/resolvers/zod';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import Divider from '@mui/material/Divider';
import Grid from '@mui/material/Grid';
import InputAdornment from '@mui/material/InputAdornment';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import useMediaQuery from '@mui/material/useMediaQuery';
import { useTheme } from '@mui/material/styles';
import type { Bike } from '@loamline/shared-types';
import { useState } from 'react';
import { useForm, useWatch, type Control, type FieldPath } from 'react-hook-form';
import { FormSwitchField } from '@/components/form/form-switch-field';
import { FormTextField } from '@/components/form/form-text-field';
import { FormToggleField } from '@/components/form/form-toggle-field';
import { showServerError } from '@/features/auth/utils/server-errors';
import { useUnitPrefs } from '@/features/baseline/hooks/use-unit-prefs';
import { createBike } from '../api/create-bike';
import { updateBike } from '../api/update-bike';
import {
  bikeFormSchema,
  bikeToForm,
  emptyBikeForm,
  formToBike,
  type BikeFormValues,
} from '../utils/bike-form';

const SPRING_OPTIONS = [
  { value: 'air', label: 'Air' },
  { value: 'coil', label: 'Coil' },
  { value: 'none', label: 'None' },
] as const;

const FIELD_NAMES: FieldPath<BikeFormValues>[] = [
  'name',
  'fork.spring',
  'fork.travelMm',
  'fork.stanchionMm',
  'fork.spacers',
  'fork.endStrokePressure',
  'fork.endStrokeMaxPressure',
  'fork.maxPressure',
  'shock.spring',
  'shock.strokeMm',
  'shock.wheelTravelMm',
  'shock.spacers',
  'shock.maxPressure',
];

function NumberField({
  control,
  name,
  label,
  unit,
  helperText,
}: {
  control: Control<BikeFormValues>;
  name: FieldPath<BikeFormValues>;
  label: string;
  unit?: string;
  helperText?: string;
}) {
  return (
    <FormTextField
      control={control}
      name={name}
      label={label}
      helperText={helperText}
      slotProps={{
        htmlInput: { inputMode: 'decimal' },
        input: unit ? { endAdornment: <InputAdornment position="end">{unit}</InputAdornment> } : undefined,
      }}
    />
  );
}

/** Add or edit a bike: its name, then fork and shock (either may be "none"). */
export function BikeDialog({
  open,
  bike,
  onClose,
}: {
  open: boolean;
  bike?: Bike;
  onClose: (saved?: Bike) => void;
}) {
  const theme = useTheme();
  const phone = !useMediaQuery(theme.breakpoints.up('sm'), { noSsr: true });
  const [prefs] = useUnitPrefs();
  const unit = prefs.pressure;
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<BikeFormValues>({
    resolver: zodResolver(bikeFormSchema(unit)),
    defaultValues: bike ? bikeToForm(bike, unit) : emptyBikeForm,
  });
  const forkSpring = useWatch({ control, name: 'fork.spring' });
  const forkEndStroke = useWatch({ control, name: 'fork.endStroke' });
  const shockSpring = useWatch({ control, name: 'shock.spring' });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      const body = formToBike(values, unit, bike);
      const saved = bike ? await updateBike(bike.id, body) : await createBike(body);
      onClose(saved);
    } catch (error) {
      setFormError(showServerError(error, setError, FIELD_NAMES));
    }
  });

  const partError = formState.errors.fork?.spring?.message;

  return (
    <Dialog
      open={open}
      onClose={() => onClose()}
      fullScreen={phone}
      fullWidth
      maxWidth="sm"
      aria-labelledby="bike-dialog-title"
    >
      <DialogTitle id="bike-dialog-title">{bike ? `Edit ${bike.name}` : 'Add a bike'}</DialogTitle>
      <DialogContent dividers>
        <Stack component="form" id="bike-form" noValidate spacing={2.5} onSubmit={(e) => void onSubmit(e)}>
          {formError && <Alert severity="error">{formError}</Alert>}
          <FormTextField
            control={control}
            name="name"
            label="Name"
            helperText="Anything you will recognise, e.g. “Long-travel enduro”."
          />

          <Divider />
          <Typography variant="h3" component="h2">
            Fork
          </Typography>
          <FormToggleField
            control={control}
            name="fork.spring"
            label="Fork spring"
            options={SPRING_OPTIONS}
          />
          {partError && <Alert severity="warning">{partError}</Alert>}
          {forkSpring !== 'none' && (
            <Grid container spacing={2}>
              <Grid size={{ xs: 6 }}>
                <NumberField control={control} name="fork.travelMm" label="Travel" unit="mm" />
              </Grid>
              <Grid size={{ xs: 6 }}>
                <NumberField control={control} name="fork.stanchionMm" label="Stanchions" unit="mm" />
              </Grid>
              {forkSpring === 'air' && (
                <>
                  <Grid size={{ xs: 6 }}>
                    <NumberField control={control} name="fork.spacers" label="Volume spacers" />
                  </Grid>
                  <Grid size={{ xs: 6 }}>
                    <NumberField
                      control={control}
                      name="fork.maxPressure"
                      label="Rated max"
                      unit={unit}
                      helperText="Optional: the main chamber's, from the fork"
                    />
                  </Grid>
                  <Grid size={{ xs: 12 }}>
                    <FormSwitchField
                      control={control}
                      name="fork.endStroke"
                      label="End-stroke chamber fitted"
                    />
                  </Grid>
                  {forkEndStroke && (
                    <>
                      <Grid size={{ xs: 6 }}>
                        <NumberField
                          control={control}
                          name="fork.endStrokePressure"
                          label="End-stroke pressure"
                          unit={unit}
                          helperText="Optional: leave empty for a recommended pressure"
                        />
                      </Grid>
                      <Grid size={{ xs: 6 }}>
                        <NumberField
                          control={control}
                          name="fork.endStrokeMaxPressure"
                          label="End-stroke max"
                          unit={unit}
                          helperText="Optional: its own maximum, from the fork"
                        />
                      </Grid>
                    </>
                  )}
                </>
              )}
            </Grid>
          )}

          <Divider />
          <Typography variant="h3" component="h2">
            Rear shock
          </Typography>
          <FormToggleField
            control={control}
            name="shock.spring"
            label="Shock spring"
            options={SPRING_OPTIONS}
          />
          {shockSpring !== 'none' && (
            <Grid container spacing={2}>
              <Grid size={{ xs: 6 }}>
                <NumberField control={control} name="shock.strokeMm" label="Stroke" unit="mm" />
              </Grid>
              <Grid size={{ xs: 6 }}>
                <NumberField control={control} name="shock.wheelTravelMm" label="Wheel travel" unit="mm" />
              </Grid>
              {shockSpring === 'air' && (
                <>
                  <Grid size={{ xs: 6 }}>
                    <NumberField control={control} name="shock.spacers" label="Volume spacers" />
                  </Grid>
                  <Grid size={{ xs: 6 }}>
                    <NumberField
                      control={control}
                      name="shock.maxPressure"
                      label="Rated max"
                      unit={unit}
                      helperText="Optional, from the shock"
                    />
                  </Grid>
                </>
              )}
            </Grid>
          )}
        </Stack>
      </DialogContent>
      <DialogActions sx={{ px: 3, py: 2 }}>
        <Button onClick={() => onClose()}>Cancel</Button>
        <Button type="submit" form="bike-form" variant="contained" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Saving…' : bike ? 'Save changes' : 'Add bike'}
        </Button>
      </DialogActions>
    </Dialog>
  );
}
