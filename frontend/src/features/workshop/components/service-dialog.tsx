import { zodResolver } from '@hookform/resolvers/zod';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import InputAdornment from '@mui/material/InputAdornment';
import Stack from '@mui/material/Stack';
import type { ShopService } from '@loamline/shared-types';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { FormSwitchField } from '@/components/form/form-switch-field';
import { FormTextField } from '@/components/form/form-text-field';
import { sentence } from '@/features/auth/utils/server-errors';
import { ApiRequestError } from '@/lib/api-client';
import { createService, updateService } from '../api/services';
import {
  SERVICE_FIELD,
  emptyServiceForm,
  formToService,
  serviceFormSchema,
  serviceToForm,
  type ServiceFormValues,
} from '../utils/service-form';

/** Add or change a service (owner). Money in the shop currency's major units; sent in minor units. */
export function ServiceDialog({
  service,
  currency,
  onClose,
}: {
  /** null: a new service */
  service: ShopService | null;
  currency: string;
  onClose: () => void;
}) {
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<ServiceFormValues>({
    resolver: zodResolver(serviceFormSchema(currency)),
    defaultValues: service ? serviceToForm(service, currency) : emptyServiceForm,
    mode: 'onTouched',
  });
  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    const body = formToService(values, currency);
    try {
      if (service) await updateService(service.id, body);
      else await createService(body);
      onClose();
    } catch (e) {
      if (e instanceof ApiRequestError && e.status === 400 && e.body.fields) {
        let unplaced = false;
        for (const [f, m] of Object.entries(e.body.fields)) {
          const name = SERVICE_FIELD[f];
          if (name) setError(name, { message: sentence(m) });
          else unplaced = true;
        }
        if (unplaced) setFormError(e.body.message);
      } else {
        setFormError(e instanceof ApiRequestError ? e.body.message : 'Loamline could not reach the server.');
      }
    }
  });
  const money = { input: { startAdornment: <InputAdornment position="start">{currency}</InputAdornment> } };
  const minutes = { input: { endAdornment: <InputAdornment position="end">min</InputAdornment> } };
  return (
    <Dialog open onClose={onClose} aria-labelledby="service-title" maxWidth="sm" fullWidth>
      <Box component="form" noValidate onSubmit={(e) => void onSubmit(e)}>
        <DialogTitle id="service-title">{service ? `Change “${service.name}”` : 'Add a service'}</DialogTitle>
        <DialogContent>
          <Stack spacing={2} sx={{ pt: 1 }}>
            <FormTextField control={control} name="name" label="Name" size="small" required autoFocus />
            <FormTextField
              control={control}
              name="description"
              label="Description"
              size="small"
              multiline
              minRows={2}
              helperText="What the rider gets, in a sentence or two."
            />
            <Stack direction={{ xs: 'column', sm: 'row' }} spacing={2}>
              <FormTextField
                control={control}
                name="durationMinutes"
                label="Duration"
                size="small"
                inputMode="numeric"
                slotProps={minutes}
                fullWidth
              />
              <FormTextField
                control={control}
                name="bufferAfterMinutes"
                label="Buffer after"
                size="small"
                inputMode="numeric"
                slotProps={minutes}
                helperText="Bench time kept after, for notes and cleaning."
                fullWidth
              />
            </Stack>
            <Stack direction={{ xs: 'column', sm: 'row' }} spacing={2}>
              <FormTextField
                control={control}
                name="price"
                label="Price"
                size="small"
                inputMode="decimal"
                slotProps={money}
                helperText="0 for a free service."
                fullWidth
              />
              <FormTextField
                control={control}
                name="deposit"
                label="Deposit at booking"
                size="small"
                inputMode="decimal"
                slotProps={money}
                helperText="0 … the price; the price means paid in full."
                fullWidth
              />
            </Stack>
            <FormSwitchField control={control} name="active" label="Riders can book it" />
          </Stack>
          {formError && (
            <Alert severity="error" sx={{ mt: 2 }}>
              {formError}
            </Alert>
          )}
        </DialogContent>
        <DialogActions sx={{ px: 3, pb: 2 }}>
          <Button onClick={onClose}>Back</Button>
          <Button type="submit" variant="contained" disabled={formState.isSubmitting}>
            {formState.isSubmitting ? 'Saving…' : service ? 'Save changes' : 'Add service'}
          </Button>
        </DialogActions>
      </Box>
    </Dialog>
  );
}
