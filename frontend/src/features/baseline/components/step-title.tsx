import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';

/** The question a step asks, and a line on why. */
export function StepTitle({ title, lead }: { title: string; lead?: string }) {
  return (
    <Box>
      <Typography variant="h2" component="h2" sx={{ fontSize: { xs: '1.45rem', sm: '1.75rem' } }}>
        {title}
      </Typography>
      {lead && (
        <Typography color="text.secondary" sx={{ mt: 1 }}>
          {lead}
        </Typography>
      )}
    </Box>
  );
}
