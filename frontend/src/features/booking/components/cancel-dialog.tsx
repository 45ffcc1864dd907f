import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';
import TextField from '@mui/material/TextField';
import type { Appointment } from '@loamline/shared-types';
import { useState } from 'react';
import { ApiRequestError } from '@/lib/api-client';
import { cancelAppointment } from '../api/cancel-appointment';
import { cancelConsequence } from '../utils/words';
import { formatSlot } from '../utils/zoned-time';

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
  const submit = async () => {
    setBusy(true);
    setError(null);
    try {
      await cancelAppointment(a.id, reason.trim() ? { reason: reason.trim() } : {});
      onClose();
    } catch (e) {
      setError(e instanceof ApiRequestError ? e.body.message : 'Loamline could not reach the server.');
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
        <TextField
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
        <Button onClick={onClose}>Keep it</Button>
        <Button variant="contained" color="error" disabled={busy} onClick={() => void submit()}>
          {busy ? 'Cancelling…' : 'Cancel appointment'}
        </Button>
      </DialogActions>
    </Dialog>
  );
}
