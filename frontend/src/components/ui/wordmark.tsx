import Box from '@mui/material/Box';
import { ochre } from '@/theme/primitives';

/** Loamline's wordmark: a trail line over a rise, and the name. */
export function Wordmark({ size = 28 }: { size?: number }) {
  return (
    <Box sx={{ display: 'inline-flex', alignItems: 'center', gap: 1 }}>
      <svg width={size} height={size} viewBox="0 0 32 32" aria-hidden="true">
        <rect width="32" height="32" rx="8" fill="rgba(255,255,255,0.12)" />
        <path
          d="M5 23c5-1 7-9 11-9s5 6 11 5"
          fill="none"
          stroke={ochre[500]}
          strokeWidth="3"
          strokeLinecap="round"
        />
        <circle cx="16" cy="14" r="2.5" fill="#F7F5F0" />
      </svg>
      <Box component="span" sx={{ fontWeight: 700, fontSize: size * 0.72, letterSpacing: 0.2 }}>
        Loamline
      </Box>
    </Box>
  );
}
