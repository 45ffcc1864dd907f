import { zodResolver } from '@hookform/resolvers/zod';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import CircularProgress from '@mui/material/CircularProgress';
import Stack from '@mui/material/Stack';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link as RouterLink, useNavigate, useSearchParams } from 'react-router';
import { FormPasswordField } from '@/components/form/form-password-field';
import { FormTextField } from '@/components/form/form-text-field';
import { TextInput } from '@/components/ui/text-input';
import { paths } from '@/config/paths';
import { ApiRequestError } from '@/lib/api-client';
import { acceptInvitation } from '../api/accept-invitation';
import { useInvitation } from '../api/get-invitation';
import { PASSWORD_MIN, joinSchema, type JoinValues } from '../schemas';
import { showServerError } from '../utils/server-errors';
import { AuthCard } from './auth-card';

export function JoinPage() {
  const [params] = useSearchParams();
  const token = params.get('token');
  const navigate = useNavigate();
  const invitation = useInvitation(token);
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<JoinValues>({
    resolver: zodResolver(joinSchema),
    defaultValues: { name: '', password: '' },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await acceptInvitation({ token: token!, ...values });
      await navigate(paths.workshop, { replace: true });
    } catch (error) {
      setFormError(
        showServerError(error, setError, ['name', 'password'], {
          404: 'This invitation has expired or was used already. Ask the shop owner for a new one.',
          409: 'There is already an account with this e-mail. Ask the shop owner to invite another address.',
        }),
      );
    }
  });

  if (!token || invitation.error) {
    const gone = !token || (invitation.error instanceof ApiRequestError && invitation.error.status < 500);
    return (
      <AuthCard title="Join a shop">
        <Alert severity="warning" sx={{ mb: 2 }}>
          {gone
            ? 'This invitation link is not valid any more: it has expired, was used already, or is incomplete. Ask the shop owner to send a new one.'
            : invitation.error?.message}
        </Alert>
        <Button component={RouterLink} to={paths.home}>
          Go to the start page
        </Button>
      </AuthCard>
    );
  }

  if (!invitation.data) {
    return (
      <AuthCard title="Join a shop">
        <Stack sx={{ alignItems: 'center', py: 3 }}>
          <CircularProgress aria-label="Loading the invitation" />
        </Stack>
      </AuthCard>
    );
  }

  const { shopName, email, role } = invitation.data;
  return (
    <AuthCard
      title={`Join ${shopName}`}
      intro={`You are invited as ${role === 'owner' ? 'an owner' : 'a technician'}. Choose your name and a password to reach the Workshop.`}
    >
      <Stack component="form" noValidate spacing={2.5} onSubmit={(e) => void onSubmit(e)}>
        {formError && <Alert severity="error">{formError}</Alert>}
        <TextInput label="E-mail" value={email} slotProps={{ htmlInput: { readOnly: true } }} />
        <FormTextField control={control} name="name" label="Your name" autoComplete="name" />
        <FormPasswordField
          control={control}
          name="password"
          label="Password"
          autoComplete="new-password"
          helperText={`At least ${PASSWORD_MIN} characters.`}
        />
        <Button type="submit" variant="contained" size="large" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Joining…' : `Join ${shopName}`}
        </Button>
      </Stack>
    </AuthCard>
  );
}
