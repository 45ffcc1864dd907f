import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import type { Appointment } from '@loamline/shared-types';
import { Link as RouterLink } from 'react-router';
import { rebookPath } from '@/features/booking/utils/rebook';
import { formatTime, zoneLabel } from '@/features/booking/utils/zoned-time';

/**
 * The hold ended unpaid: the time went back to other riders, nothing was charged, and the booking
 * flow is one click away with the same choices. `live`: it just happened with the page open (announced).
 */
export function HoldReleased({ a, live = false }: { a: Appointment; live?: boolean }) {
  const zone = a.shop.timeZone;
  const end = a.holdExpiresAt;
  return (
    <Alert severity="warning" role={live ? 'alert' : undefined}>
      <AlertTitle>The time was released</AlertTitle>
      {end
        ? `The hold ended at ${formatTime(end, zone)} ${zoneLabel(zone, end)} before a payment arrived`
        : 'The hold ended before a payment arrived'}
      , so the time went back to other riders. Nothing was charged.
      <Box sx={{ mt: 1.5 }}>
        <Button variant="contained" component={RouterLink} to={rebookPath(a)}>
          Pick another time
        </Button>
      </Box>
    </Alert>
  );
}
