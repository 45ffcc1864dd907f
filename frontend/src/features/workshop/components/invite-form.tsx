import { zodResolver } from '@hookform/resolvers/zod';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import MenuItem from '@mui/material/MenuItem';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { STAFF_ROLES } from '@loamline/shared-types';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from '@/lib/zod';
import { FormSelectField } from '@/components/form/form-select-field';
import { FormTextField } from '@/components/form/form-text-field';
import { emailField } from '@/features/auth/schemas';
import { ROLE_LABELS } from '@/features/auth/types';
import { showServerError } from '@/features/auth/utils/server-errors';
import { createInvitation } from '../api/create-invitation';

export const inviteSchema = z.object({ email: emailField, role: z.enum(STAFF_ROLES) });
export type InviteValues = z.infer<typeof inviteSchema>;

/** Owners only: invite a technician or another owner; the server e-mails them a link to join. */
export function InviteForm() {
  const [sent, setSent] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState, reset } = useForm<InviteValues>({
    resolver: zodResolver(inviteSchema),
    defaultValues: { email: '', role: 'technician' },
  });
  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    setSent(null);
    try {
      await createInvitation(values);
      setSent(values.email);
      reset({ email: '', role: values.role });
    } catch (error) {
      setFormError(
        showServerError(error, setError, ['email', 'role'], {
          409: 'This address already has an account or an open invitation.',
        }),
      );
    }
  });
  return (
    <Card component="section" aria-labelledby="invite-title">
      <CardContent>
        <Typography id="invite-title" variant="h3" component="h2" gutterBottom>
          Invite someone
        </Typography>
        <Typography variant="body2" color="text.secondary" sx={{ mb: 2 }}>
          They get an e-mail with a link to choose a name and password and join the shop.
        </Typography>
        <Stack
          component="form"
          noValidate
          direction={{ xs: 'column', sm: 'row' }}
          spacing={1.5}
          sx={{ alignItems: { sm: 'flex-start' } }}
          onSubmit={(e) => void onSubmit(e)}
        >
          <FormTextField control={control} name="email" label="E-mail" type="email" size="small" />
          <FormSelectField
            control={control}
            name="role"
            label="Role"
            size="small"
            sx={{ flex: { sm: '0 0 200px' } }}
          >
            {STAFF_ROLES.map((r) => (
              <MenuItem key={r} value={r}>
                {ROLE_LABELS[r]}
              </MenuItem>
            ))}
          </FormSelectField>
          <Button
            type="submit"
            variant="contained"
            disabled={formState.isSubmitting}
            sx={{ minHeight: 40, whiteSpace: 'nowrap', flexShrink: 0 }}
          >
            {formState.isSubmitting ? 'Sending…' : 'Send invitation'}
          </Button>
        </Stack>
        {sent && (
          <Alert severity="success" sx={{ mt: 2 }}>
            Invitation sent to {sent}.
          </Alert>
        )}
        {formError && (
          <Alert severity="error" sx={{ mt: 2 }}>
            {formError}
          </Alert>
        )}
      </CardContent>
    </Card>
  );
}
