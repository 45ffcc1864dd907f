import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';

/**
 * The question a step asks, and a line on why. The heading takes the focus when the rider moves to
 * its step (tabIndex −1: focusable from script, not a stop for Tab); see `useStepHeadingFocus`.
 */
export function StepTitle({ title, lead }: { title: string; lead?: string }) {
  return (
    <Box>
      <Typography
        variant="h2"
        component="h2"
        tabIndex={-1}
        data-step-heading
        sx={{ fontSize: { xs: '1.45rem', sm: '1.75rem' }, '&:focus': { outline: 'none' } }}
      >
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
