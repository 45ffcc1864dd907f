import Box from '@mui/material/Box';
import CircularProgress from '@mui/material/CircularProgress';
import Typography from '@mui/material/Typography';
import { AppHeader } from './app-header';

/** "Loading…" under the app bar: the same picture as index.html's first paint, once React runs. */
export function PageLoading({ label = 'Loading Loamline…' }: { label?: string }) {
  return (
    <Box
      role="status"
      aria-live="polite"
      aria-busy="true"
      sx={{
        flex: 1,
        display: 'flex',
        flexDirection: 'column',
        alignItems: 'center',
        justifyContent: 'center',
        gap: 2,
        py: 6,
        px: 2,
      }}
    >
      <CircularProgress size={36} aria-hidden />
      <Typography color="text.secondary">{label}</Typography>
    </Box>
  );
}

/**
 * The router's hydrate fallback: while the first page's lazy route module loads, the frame (app bar
 * with the wordmark) and a loading state, not a blank page.
 */
export function AppLoading() {
  return (
    <Box sx={{ minHeight: '100dvh', display: 'flex', flexDirection: 'column' }}>
      <AppHeader />
      <Box component="main" sx={{ flexGrow: 1, display: 'flex', flexDirection: 'column' }}>
        <PageLoading />
      </Box>
    </Box>
  );
}
