/**
 * The stack's floor for `npm run bench` (scripts/bench/floor.ts): the least a page of Loamline's stack
 * can do — React 19's client, MUI with the app's own theme (CssBaseline included), an app bar, a
 * heading, a paragraph, one labelled field and a button, rendered as the app's main.tsx renders — with
 * no router, no data, no forms library. Lighthouse scores it in the same run as the app's
 * pages, so the app's scores can be read against what the stack itself costs on this machine.
 * Not part of the app's build (frontend/vite.config.ts builds src/ only).
 */
import AppBar from '@mui/material/AppBar';
import Button from '@mui/material/Button';
import Container from '@mui/material/Container';
import FormControl from '@mui/material/FormControl';
import InputLabel from '@mui/material/InputLabel';
import OutlinedInput from '@mui/material/OutlinedInput';
import Toolbar from '@mui/material/Toolbar';
import Typography from '@mui/material/Typography';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { AppTheme } from '@/theme/app-theme';

function Floor() {
  return (
    <AppTheme>
      <AppBar position="static" elevation={0}>
        <Toolbar>
          <Typography variant="h6" component="span" sx={{ fontWeight: 700 }}>
            Loamline
          </Typography>
        </Toolbar>
      </AppBar>
      <Container component="main" maxWidth="sm" sx={{ py: 3 }}>
        <Typography variant="h1" sx={{ mb: 2 }}>
          How much do you weigh, ready to ride?
        </Typography>
        <Typography sx={{ mb: 3 }}>
          Weigh yourself in what you ride in: shoes, helmet, pack with water and tools. That is the load your
          suspension carries.
        </Typography>
        <FormControl fullWidth sx={{ mb: 3 }}>
          <InputLabel htmlFor="floor-weight">Weight with riding gear</InputLabel>
          <OutlinedInput id="floor-weight" label="Weight with riding gear" inputMode="decimal" />
        </FormControl>
        <Button variant="contained">Next</Button>
      </Container>
    </AppTheme>
  );
}

createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <Floor />
  </StrictMode>,
);
