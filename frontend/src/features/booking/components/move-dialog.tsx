import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';
import useMediaQuery from '@mui/material/useMediaQuery';
import { useTheme } from '@mui/material/styles';
import type { Appointment, ShopDetail } from '@loamline/shared-types';
import { useState } from 'react';
import { mutate } from 'swr';
import { ApiRequestError } from '@/lib/api-client';
import { isAvailabilityKey } from '../api/get-availability';
import { moveAppointment } from '../api/move-appointment';
import { bookingConflict } from '../utils/conflicts';
import { formatSlot, localDate } from '../utils/zoned-time';
import { LazyDayTimePicker as DayTimePicker } from './lazy-day-time-picker';

/** Move: pick another free time of the same service; the shop confirms it again. */
export function MoveDialog({
  a,
  shop,
  open,
  onClose,
}: {
  a: Appointment;
  shop: ShopDetail;
  open: boolean;
  onClose: () => void;
}) {
  const theme = useTheme();
  const phone = useMediaQuery(theme.breakpoints.down('sm'), { noSsr: true });
  const [day, setDay] = useState(() => localDate(a.start, a.shop.timeZone));
  const [start, setStart] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const submit = async () => {
    if (!start) return;
    setBusy(true);
    setError(null);
    try {
      await moveAppointment(a.id, start);
      onClose();
    } catch (e) {
      if (e instanceof ApiRequestError && e.status === 409 && bookingConflict(e.body) === 'taken') {
        setError('That time was just taken. The free times are fresh again: pick another one.');
        setStart(null);
        await mutate(isAvailabilityKey(a.shop.slug));
      } else if (
        e instanceof ApiRequestError &&
        e.status === 409 &&
        bookingConflict(e.body) === 'not-offered'
      ) {
        setError(`${e.body.message} The free times are fresh again.`);
        setStart(null);
        await mutate(isAvailabilityKey(a.shop.slug));
      } else setError(e instanceof ApiRequestError ? e.body.message : 'Loamline could not reach the server.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <Dialog
      open={open}
      onClose={onClose}
      fullWidth
      fullScreen={phone}
      maxWidth="sm"
      aria-labelledby="move-title"
    >
      <DialogTitle id="move-title">Move to another time</DialogTitle>
      <DialogContent>
        <DialogContentText sx={{ mb: 2 }}>
          Now: {formatSlot(a.start, a.end, a.shop.timeZone)}. A moved appointment waits for the shop to
          confirm it again.
        </DialogContentText>
        <DayTimePicker
          shop={shop}
          service={a.service}
          day={day}
          start={start}
          exceptStart={a.start}
          onDay={(d) => {
            setDay(d);
            setStart(null);
          }}
          onStart={setStart}
        />
        {error && (
          <Alert severity="warning" sx={{ mt: 2 }}>
            {error}
          </Alert>
        )}
      </DialogContent>
      <DialogActions sx={{ px: 3, pb: 2 }}>
        <Button onClick={onClose}>Keep the time</Button>
        <Button variant="contained" disabled={!start || busy} onClick={() => void submit()}>
          {busy ? 'Moving…' : 'Move here'}
        </Button>
      </DialogActions>
    </Dialog>
  );
}
