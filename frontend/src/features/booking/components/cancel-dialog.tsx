import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';
import type { Appointment } from '@loamline/shared-types';
import { useState } from 'react';
import { mutate } from 'swr';
import { TextInput } from '@/components/ui/text-input';
import { ApiRequestError } from '@/lib/api-client';
import { cancelAppointment } from '../api/cancel-appointment';
import { appointmentKey, getAppointment } from '../api/get-appointment';
import { appointmentsKey } from '../api/get-appointments';
import { cancelConsequence } from '../utils/words';
import { formatSlot } from '../utils/zoned-time';

/** Why a cancel was refused (409), in plain words, from the appointment as it is now. */
function staleWords(a: Appointment): string {
  const held = a.status === 'held' && !!a.holdExpiresAt && Date.parse(a.holdExpiresAt) <= Date.now();
  if (a.status === 'expired' || held)
    return 'There is nothing to cancel: the hold had already ended, so the time went back to other riders and nothing was charged.';
  if (a.status === 'cancelled') return 'This appointment is already cancelled.';
  return 'This appointment changed meanwhile and can’t be cancelled now. The page shows where it stands.';
}

/** Cancel, with what it means for the rider's money said first. */
export function CancelDialog({
  a,
  windowHours,
  open,
  onClose,
}: {
  a: Appointment;
  /** the shop's cancellation window, named when the deposit is kept */
  windowHours?: number;
  open: boolean;
  onClose: () => void;
}) {
  const [reason, setReason] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  /** 409: the appointment changed meanwhile (e.g. the hold ended): nothing left to cancel here */
  const [stale, setStale] = useState(false);
  const submit = async () => {
    setBusy(true);
    setError(null);
    try {
      await cancelAppointment(a.id, reason.trim() ? { reason: reason.trim() } : {});
      onClose();
    } catch (e) {
      if (e instanceof ApiRequestError && e.status === 409) {
        // the server's words name states ("an appointment that is expired …"): say it plainly, and
        // show the page as it is now
        setStale(true);
        const fresh = await getAppointment(a.id).catch(() => undefined);
        if (fresh) await mutate(appointmentKey(a.id), fresh, { revalidate: false });
        void mutate(appointmentsKey);
        setError(staleWords(fresh ?? a));
      } else setError(e instanceof ApiRequestError ? e.body.message : 'Loamline could not reach the server.');
    } finally {
      setBusy(false);
    }
  };
  return (
    <Dialog open={open} onClose={onClose} fullWidth maxWidth="xs" aria-labelledby="cancel-title">
      <DialogTitle id="cancel-title">Cancel this appointment?</DialogTitle>
      <DialogContent>
        <DialogContentText sx={{ mb: 1.5 }}>
          {a.service.name} at {a.shop.name}, {formatSlot(a.start, a.end, a.shop.timeZone)}.
        </DialogContentText>
        <Alert
          severity={
            a.fullRefundIfCancelled || a.service.depositMinor === 0 || !a.payment?.paidMinor
              ? 'info'
              : 'warning'
          }
          sx={{ mb: 2 }}
        >
          {cancelConsequence(a, undefined, windowHours)} The time goes back to other riders at once.
        </Alert>
        <TextInput
          label="Reason for the shop (optional)"
          fullWidth
          multiline
          minRows={2}
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          slotProps={{ htmlInput: { maxLength: 500 } }}
        />
        {error && (
          <Alert severity="error" sx={{ mt: 2 }}>
            {error}
          </Alert>
        )}
      </DialogContent>
      <DialogActions sx={{ px: 3, pb: 2 }}>
        <Button onClick={onClose}>{stale ? 'Close' : 'Keep it'}</Button>
        {!stale && (
          <Button variant="contained" color="error" disabled={busy} onClick={() => void submit()}>
            {busy ? 'Cancelling…' : 'Cancel appointment'}
          </Button>
        )}
      </DialogActions>
    </Dialog>
  );
}
