import { zodResolver } from '@hookform/resolvers/zod';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogTitle from '@mui/material/DialogTitle';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from '@/lib/zod';
import { FormTextField } from '@/components/form/form-text-field';
import { showServerError } from '@/features/auth/utils/server-errors';

export const sheetNameSchema = z.object({
  name: z
    .string()
    .check(
      z.trim(),
      z.minLength(1, 'Give the sheet a name.'),
      z.maxLength(120, 'Keep it under 120 characters.'),
    ),
});
export type SheetNameValues = z.infer<typeof sheetNameSchema>;

/** Asks for a sheet's name: to rename one, or to name a new one before it is saved. */
export function SheetNameDialog({
  open,
  title,
  initialName,
  submitLabel,
  onSubmit,
  onClose,
}: {
  open: boolean;
  title: string;
  initialName: string;
  submitLabel: string;
  onSubmit: (name: string) => Promise<void>;
  onClose: () => void;
}) {
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<SheetNameValues>({
    resolver: zodResolver(sheetNameSchema),
    defaultValues: { name: initialName },
  });
  const submit = handleSubmit(async ({ name }) => {
    setFormError(null);
    try {
      await onSubmit(name.trim());
    } catch (error) {
      setFormError(showServerError(error, setError, ['name']));
    }
  });
  return (
    <Dialog open={open} onClose={onClose} fullWidth maxWidth="xs" aria-labelledby="sheet-name-title">
      <DialogTitle id="sheet-name-title">{title}</DialogTitle>
      <DialogContent>
        <form id="sheet-name-form" noValidate onSubmit={(e) => void submit(e)}>
          {formError && (
            <Alert severity="error" sx={{ mb: 2 }}>
              {formError}
            </Alert>
          )}
          <FormTextField control={control} name="name" label="Sheet name" autoFocus sx={{ mt: 1 }} />
        </form>
      </DialogContent>
      <DialogActions sx={{ px: 3, pb: 2 }}>
        <Button onClick={onClose}>Cancel</Button>
        <Button type="submit" form="sheet-name-form" variant="contained" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Saving…' : submitLabel}
        </Button>
      </DialogActions>
    </Dialog>
  );
}
