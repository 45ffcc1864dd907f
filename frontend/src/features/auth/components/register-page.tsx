import { zodResolver } from '@hookform/resolvers/zod';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Link from '@mui/material/Link';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link as RouterLink, useNavigate, useSearchParams } from 'react-router';
import { FormPasswordField } from '@/components/form/form-password-field';
import { FormTextField } from '@/components/form/form-text-field';
import { pathTo } from '@/config/paths';
import { register } from '../api/register';
import { PASSWORD_MIN, registerSchema, type RegisterValues } from '../schemas';
import { safeNext, showServerError } from '../utils/server-errors';
import { AuthCard } from './auth-card';

export function RegisterPage() {
  const [params] = useSearchParams();
  const next = params.get('next');
  const navigate = useNavigate();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<RegisterValues>({
    resolver: zodResolver(registerSchema),
    defaultValues: { name: '', email: '', password: '' },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await register(values);
      await navigate(safeNext(next), { replace: true });
    } catch (error) {
      setFormError(
        showServerError(error, setError, ['name', 'email', 'password'], {
          409: 'There is already an account with this e-mail. Sign in, or reset its password.',
        }),
      );
    }
  });

  return (
    <AuthCard
      title="Create an account"
      intro="Keep your bikes and baseline sheets, and book a shop when you want a professional setup."
      footer={
        <Typography variant="body2">
          Already have an account?{' '}
          <Link component={RouterLink} to={pathTo.signIn(next ?? undefined)}>
            Sign in
          </Link>
        </Typography>
      }
    >
      <Stack component="form" noValidate spacing={2.5} onSubmit={(e) => void onSubmit(e)}>
        {formError && <Alert severity="error">{formError}</Alert>}
        <FormTextField control={control} name="name" label="Name" autoComplete="name" />
        <FormTextField control={control} name="email" label="E-mail" type="email" autoComplete="email" />
        <FormPasswordField
          control={control}
          name="password"
          label="Password"
          autoComplete="new-password"
          helperText={`At least ${PASSWORD_MIN} characters; a few words are easy to remember.`}
        />
        <Button type="submit" variant="contained" size="large" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Creating your account…' : 'Create account'}
        </Button>
      </Stack>
    </AuthCard>
  );
}
