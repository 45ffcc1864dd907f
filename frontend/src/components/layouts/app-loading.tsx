import Box from '@mui/material/Box';
import CircularProgress from '@mui/material/CircularProgress';
import Typography from '@mui/material/Typography';

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
