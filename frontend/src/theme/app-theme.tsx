import CssBaseline from '@mui/material/CssBaseline';
import { ThemeProvider, createTheme } from '@mui/material/styles';
import type { ReactNode } from 'react';
import { inputCustomizations } from './customizations/inputs';
import { surfaceCustomizations } from './customizations/surfaces';
import { fontFamily, ink, inkMuted, ochre, paper, pine, radius, status, white } from './primitives';

export const theme = createTheme({
  palette: {
    mode: 'light',
    // contrast text is chosen at WCAG 2.x AA for normal text, not MUI's default 3:1
    contrastThreshold: 4.5,
    primary: { main: pine[500], light: pine[300], dark: pine[700], contrastText: white },
    secondary: { main: ochre[500], light: ochre[300], dark: ochre[700], contrastText: ink },
    error: { main: status.error, contrastText: white },
    warning: { main: status.warning, contrastText: white },
    info: { main: status.info, contrastText: white },
    success: { main: status.success, contrastText: white },
    background: { default: paper, paper: white },
    text: { primary: ink, secondary: inkMuted },
  },
  shape: { borderRadius: radius },
  typography: {
    fontFamily,
    h1: { fontSize: '2.25rem', fontWeight: 700, lineHeight: 1.15 },
    h2: { fontSize: '1.75rem', fontWeight: 700 },
    h3: { fontSize: '1.35rem', fontWeight: 500 },
  },
  components: { ...surfaceCustomizations, ...inputCustomizations },
});

export function AppTheme({ children }: { children: ReactNode }) {
  return (
    <ThemeProvider theme={theme}>
      <CssBaseline />
      {children}
    </ThemeProvider>
  );
}
