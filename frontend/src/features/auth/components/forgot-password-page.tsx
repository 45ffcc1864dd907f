import { zodResolver } from '@hookform/resolvers/zod';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Link from '@mui/material/Link';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link as RouterLink } from 'react-router';
import { FormTextField } from '@/components/form/form-text-field';
import { paths } from '@/config/paths';
import { requestPasswordReset } from '../api/request-password-reset';
import { forgotPasswordSchema, type ForgotPasswordValues } from '../schemas';
import { showServerError } from '../utils/server-errors';
import { AuthCard } from './auth-card';

export function ForgotPasswordPage() {
  const [sentTo, setSentTo] = useState<string | null>(null);
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<ForgotPasswordValues>({
    resolver: zodResolver(forgotPasswordSchema),
    defaultValues: { email: '' },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await requestPasswordReset(values);
      setSentTo(values.email);
    } catch (error) {
      setFormError(showServerError(error, setError, ['email']));
    }
  });

  const footer = (
    <Link component={RouterLink} to={paths.signIn} variant="body2">
      Back to sign-in
    </Link>
  );

  if (sentTo) {
    return (
      <AuthCard title="Check your e-mail" footer={footer}>
        <Alert severity="success" sx={{ mb: 2 }}>
          If an account exists for <strong>{sentTo}</strong>, we sent it a link to choose a new password.
        </Alert>
        <Typography color="text.secondary">
          The link works once and for a limited time; the e-mail says until when. Nothing arrived? Look in the
          spam folder, or ask again in a minute.
        </Typography>
      </AuthCard>
    );
  }

  return (
    <AuthCard
      title="Forgot your password?"
      intro="Give us the e-mail you signed up with and we will send a link to choose a new one."
      footer={footer}
    >
      <Stack component="form" noValidate spacing={2.5} onSubmit={(e) => void onSubmit(e)}>
        {formError && <Alert severity="error">{formError}</Alert>}
        <FormTextField control={control} name="email" label="E-mail" type="email" autoComplete="email" />
        <Button type="submit" variant="contained" size="large" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Sending…' : 'Send me a link'}
        </Button>
      </Stack>
    </AuthCard>
  );
}
