import { zodResolver } from '@hookform/resolvers/zod';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Link from '@mui/material/Link';
import Stack from '@mui/material/Stack';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link as RouterLink, useSearchParams } from 'react-router';
import { FormPasswordField } from '@/components/form/form-password-field';
import { paths } from '@/config/paths';
import { ApiRequestError } from '@/lib/api-client';
import { confirmPasswordReset } from '../api/confirm-password-reset';
import { PASSWORD_MIN, resetPasswordSchema, type ResetPasswordValues } from '../schemas';
import { showServerError } from '../utils/server-errors';
import { AuthCard } from './auth-card';

const LINK_SPENT =
  'This link has expired or was used already. Ask for a new one — the newest link is the one that works.';

export function ResetPasswordPage() {
  const [params] = useSearchParams();
  const token = params.get('token');
  const [done, setDone] = useState(false);
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<ResetPasswordValues>({
    resolver: zodResolver(resetPasswordSchema),
    defaultValues: { password: '', repeat: '' },
  });

  const onSubmit = handleSubmit(async ({ password }) => {
    setFormError(null);
    try {
      await confirmPasswordReset({ token: token!, password });
      setDone(true);
    } catch (error) {
      // The token is not an input here: a 400 that names it means the link is spent.
      const spent = error instanceof ApiRequestError && error.status === 400 && !!error.body.fields?.token;
      setFormError(spent ? LINK_SPENT : showServerError(error, setError, ['password']));
    }
  });

  if (!token) {
    return (
      <AuthCard title="Choose a new password">
        <Alert severity="warning" sx={{ mb: 2 }}>
          This address is missing the code from the e-mail. Open the link from the e-mail again, or ask for a
          new one.
        </Alert>
        <Button component={RouterLink} to={paths.forgotPassword} variant="contained">
          Ask for a new link
        </Button>
      </AuthCard>
    );
  }

  if (done) {
    return (
      <AuthCard title="Password changed">
        <Alert severity="success" sx={{ mb: 3 }}>
          Your new password is set. Sign in with it now.
        </Alert>
        <Button component={RouterLink} to={paths.signIn} variant="contained" size="large" fullWidth>
          Sign in
        </Button>
      </AuthCard>
    );
  }

  return (
    <AuthCard
      title="Choose a new password"
      intro="Pick one you have not used here before."
      footer={
        <Link component={RouterLink} to={paths.forgotPassword} variant="body2">
          Ask for a new link
        </Link>
      }
    >
      <Stack component="form" noValidate spacing={2.5} onSubmit={(e) => void onSubmit(e)}>
        {formError && <Alert severity="error">{formError}</Alert>}
        <FormPasswordField
          control={control}
          name="password"
          label="New password"
          autoComplete="new-password"
          helperText={`At least ${PASSWORD_MIN} characters.`}
        />
        <FormPasswordField
          control={control}
          name="repeat"
          label="New password again"
          autoComplete="new-password"
        />
        <Button type="submit" variant="contained" size="large" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Saving…' : 'Set new password'}
        </Button>
      </Stack>
    </AuthCard>
  );
}
