/**
 * The stack's floor for a page with a form (scripts/bench/floor.ts): the screen of main.tsx plus the
 * least that each of the fixed stack's other libraries brings to such a page — React Router's lightest
 * (declarative) router with one route, SWR asking for the session, react-hook-form holding the field
 * with a built-in rule (no schema library). The bench weighs its JavaScript against the route budget:
 * no route of the app that shows a form can weigh less than this page.
 */
import AppBar from '@mui/material/AppBar';
import Button from '@mui/material/Button';
import Container from '@mui/material/Container';
import FormControl from '@mui/material/FormControl';
import FormHelperText from '@mui/material/FormHelperText';
import InputLabel from '@mui/material/InputLabel';
import OutlinedInput from '@mui/material/OutlinedInput';
import Toolbar from '@mui/material/Toolbar';
import Typography from '@mui/material/Typography';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { Controller, useForm } from 'react-hook-form';
import { BrowserRouter, Route, Routes } from 'react-router';
import useSWR from 'swr';
import { AppTheme } from '@/theme/app-theme';

const fetcher = (url: string): Promise<unknown> => fetch(url).then((r) => (r.ok ? r.json() : null));

function Weight() {
  const { data: session } = useSWR('/api/auth/me', fetcher);
  const { control, handleSubmit } = useForm({ defaultValues: { weight: '' } });
  return (
    <Container component="main" maxWidth="sm" sx={{ py: 3 }}>
      <Typography variant="h1" sx={{ mb: 2 }}>
        How much do you weigh, ready to ride?
      </Typography>
      <Typography sx={{ mb: 3 }}>
        Weigh yourself in what you ride in: shoes, helmet, pack with water and tools.
        {session ? ' Signed in.' : ''}
      </Typography>
      <form noValidate onSubmit={(e) => void handleSubmit(() => undefined)(e)}>
        <Controller
          name="weight"
          control={control}
          rules={{ required: 'Enter your weight.', pattern: { value: /^\d+(\.\d)?$/, message: 'A number.' } }}
          render={({ field, fieldState }) => (
            // MUI's parts rather than TextField, which brings Select (and with it Menu, Popover, Modal)
            <FormControl fullWidth error={Boolean(fieldState.error)} sx={{ mb: 2 }}>
              <InputLabel htmlFor="floor-weight">Weight with riding gear</InputLabel>
              <OutlinedInput
                {...field}
                id="floor-weight"
                label="Weight with riding gear"
                inputMode="decimal"
              />
              <FormHelperText>{fieldState.error?.message ?? ' '}</FormHelperText>
            </FormControl>
          )}
        />
        <Button type="submit" variant="contained">
          Next
        </Button>
      </form>
    </Container>
  );
}

function FormFloor() {
  return (
    <AppTheme>
      <AppBar position="static" elevation={0}>
        <Toolbar>
          <Typography variant="h6" component="span" sx={{ fontWeight: 700 }}>
            Loamline
          </Typography>
        </Toolbar>
      </AppBar>
      <Routes>
        <Route path="*" element={<Weight />} />
      </Routes>
    </AppTheme>
  );
}

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <BrowserRouter>
      <FormFloor />
    </BrowserRouter>
  </StrictMode>,
);
