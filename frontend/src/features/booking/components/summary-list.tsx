import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';

/** Label and value rows (a description list), for the review and an appointment's page. */
export function SummaryList({ rows }: { rows: [label: string, value: ReactNode][] }) {
  return (
    <Box
      component="dl"
      sx={{
        m: 0,
        display: 'grid',
        gridTemplateColumns: { xs: '1fr', sm: '160px 1fr' },
        gap: { xs: 0.25, sm: 1.25 },
      }}
    >
      {rows.map(([label, value]) => (
        <Box key={label} sx={{ display: 'contents' }}>
          <Typography
            component="dt"
            variant="body2"
            color="text.secondary"
            sx={{ fontWeight: 500, mt: { xs: 1.25, sm: 0 } }}
          >
            {label}
          </Typography>
          <Typography component="dd" sx={{ m: 0 }}>
            {value}
          </Typography>
        </Box>
      ))}
    </Box>
  );
}
