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
import { paths, pathTo } from '@/config/paths';
import { signIn } from '../api/sign-in';
import { signInSchema, type SignInValues } from '../schemas';
import { WRONG_CREDENTIALS, safeNext, showServerError } from '../utils/server-errors';
import { AuthCard } from './auth-card';

export function SignInPage() {
  const [params] = useSearchParams();
  const next = params.get('next');
  const navigate = useNavigate();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError, formState } = useForm<SignInValues>({
    resolver: zodResolver(signInSchema),
    defaultValues: { email: '', password: '' },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await signIn(values);
      await navigate(safeNext(next), { replace: true });
    } catch (error) {
      setFormError(showServerError(error, setError, ['email', 'password'], { 401: WRONG_CREDENTIALS }));
    }
  });

  return (
    <AuthCard
      title="Sign in"
      intro={
        next
          ? 'Sign in to carry on where you were.'
          : 'Your bikes, baseline sheets and appointments, on any device.'
      }
      footer={
        <Typography variant="body2">
          New to Loamline?{' '}
          <Link component={RouterLink} to={pathTo.register(next ?? undefined)}>
            Create an account
          </Link>
        </Typography>
      }
    >
      <Stack component="form" noValidate spacing={2.5} onSubmit={(e) => void onSubmit(e)}>
        {formError && <Alert severity="error">{formError}</Alert>}
        <FormTextField control={control} name="email" label="E-mail" type="email" autoComplete="email" />
        <FormPasswordField
          control={control}
          name="password"
          label="Password"
          autoComplete="current-password"
        />
        <Button type="submit" variant="contained" size="large" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? 'Signing in…' : 'Sign in'}
        </Button>
        <Link component={RouterLink} to={paths.forgotPassword} variant="body2" sx={{ alignSelf: 'center' }}>
          Forgot your password?
        </Link>
      </Stack>
    </AuthCard>
  );
}
