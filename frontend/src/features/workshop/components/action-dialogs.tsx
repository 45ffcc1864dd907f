import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Dialog from '@mui/material/Dialog';
import DialogActions from '@mui/material/DialogActions';
import DialogContent from '@mui/material/DialogContent';
import DialogContentText from '@mui/material/DialogContentText';
import DialogTitle from '@mui/material/DialogTitle';
import IconButton from '@mui/material/IconButton';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import ToggleButton from '@mui/material/ToggleButton';
import Typography from '@mui/material/Typography';
import ChevronLeftIcon from '@mui/icons-material/ChevronLeft';
import ChevronRightIcon from '@mui/icons-material/ChevronRight';
import type { WorkshopAppointment } from '@loamline/shared-types';
import { useState, type ReactNode } from 'react';
import { TextInput } from '@/components/ui/text-input';
import { ApiRequestError } from '@/lib/api-client';
import { actOnAppointment } from '../api/appointment-actions';
import { useAvailability } from '../api/get-availability';
import type { StaffAction } from '../utils/states';
import { addDays, dayLabel, localDate, localTime, todayIn, whenLabel, zoneLabel } from '../utils/time';

/** What the server said, in words for the dialog; a 409 says to look again. */
export function actionError(e: unknown): string {
  if (!(e instanceof ApiRequestError)) return 'Loamline could not reach the server. Try again.';
  if (e.status === 409)
    return `${e.body.message.replace(/^./, (c) => c.toUpperCase())}. The appointment may have changed meanwhile; it has been loaded again.`;
  return e.body.message;
}

function ActionDialog({
  open,
  title,
  titleId,
  children,
  submitLabel,
  submitColor = 'primary',
  busy,
  error,
  canSubmit = true,
  onSubmit,
  onClose,
  maxWidth = 'sm',
}: {
  open: boolean;
  title: string;
  titleId: string;
  children: ReactNode;
  submitLabel: string;
  submitColor?: 'primary' | 'error';
  busy: boolean;
  error: string | null;
  canSubmit?: boolean;
  onSubmit: () => void;
  onClose: () => void;
  maxWidth?: 'xs' | 'sm' | 'md';
}) {
  return (
    <Dialog open={open} onClose={onClose} aria-labelledby={titleId} maxWidth={maxWidth} fullWidth>
      <Box
        component="form"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          onSubmit();
        }}
      >
        <DialogTitle id={titleId}>{title}</DialogTitle>
        <DialogContent>
          {children}
          {error && (
            <Alert severity="error" sx={{ mt: 2 }}>
              {error}
            </Alert>
          )}
        </DialogContent>
        <DialogActions sx={{ px: 3, pb: 2 }}>
          <Button onClick={onClose}>Back</Button>
          <Button type="submit" variant="contained" color={submitColor} disabled={busy || !canSubmit}>
            {busy ? 'Sending…' : submitLabel}
          </Button>
        </DialogActions>
      </Box>
    </Dialog>
  );
}

const who = (a: WorkshopAppointment) => `${a.rider.name}, ${a.service.name}, ${whenLabel(a.start)}`;

/** Decline with a reason (required; the rider reads it in their e-mail). */
function DeclineDialog({ a, onClose }: { a: WorkshopAppointment; onClose: () => void }) {
  const [reason, setReason] = useState('');
  const [touched, setTouched] = useState(false);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const missing = !reason.trim();
  const submit = async () => {
    setTouched(true);
    if (missing) return;
    setBusy(true);
    setError(null);
    try {
      await actOnAppointment(a.id, 'decline', { reason: reason.trim() });
      onClose();
    } catch (e) {
      setError(actionError(e));
    } finally {
      setBusy(false);
    }
  };
  return (
    <ActionDialog
      open
      title="Decline this appointment?"
      titleId="decline-title"
      submitLabel="Decline appointment"
      submitColor="error"
      busy={busy}
      error={error}
      onSubmit={() => void submit()}
      onClose={onClose}
    >
      <DialogContentText sx={{ mb: 2 }}>
        {who(a)}. The rider gets your reason by e-mail and the bench time is free again.
      </DialogContentText>
      <TextInput
        label="Reason for the rider"
        value={reason}
        onChange={(e) => setReason(e.target.value)}
        onBlur={() => setTouched(true)}
        required
        fullWidth
        multiline
        minRows={2}
        autoFocus
        slotProps={{ htmlInput: { maxLength: 500 } }}
        error={touched && missing}
        helperText={
          touched && missing ? 'Say why, so the rider knows what to do next.' : `${reason.length}/500`
        }
      />
    </ActionDialog>
  );
}

/** Cancel (staff side); the reason is optional. */
function CancelDialog({ a, onClose }: { a: WorkshopAppointment; onClose: () => void }) {
  const [reason, setReason] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const submit = async () => {
    setBusy(true);
    setError(null);
    try {
      await actOnAppointment(a.id, 'cancel', reason.trim() ? { reason: reason.trim() } : {});
      onClose();
    } catch (e) {
      setError(actionError(e));
    } finally {
      setBusy(false);
    }
  };
  return (
    <ActionDialog
      open
      title="Cancel this appointment?"
      titleId="cancel-title"
      submitLabel="Cancel appointment"
      submitColor="error"
      busy={busy}
      error={error}
      onSubmit={() => void submit()}
      onClose={onClose}
    >
      <DialogContentText sx={{ mb: 2 }}>{who(a)}. The bench time is free again.</DialogContentText>
      <TextInput
        label="Reason for the rider (optional)"
        value={reason}
        onChange={(e) => setReason(e.target.value)}
        fullWidth
        multiline
        minRows={2}
        slotProps={{ htmlInput: { maxLength: 500 } }}
      />
    </ActionDialog>
  );
}

/** Propose another time: the free starts for the appointment's service, a week at a time. */
function ProposeDialog({ a, onClose }: { a: WorkshopAppointment; onClose: () => void }) {
  const zone = a.shop.timeZone;
  const today = todayIn(zone);
  const [from, setFrom] = useState(() => (localDate(a.start) > today ? localDate(a.start) : today));
  const [chosen, setChosen] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const to = addDays(from, 6);
  const { data, error: loadError } = useAvailability({
    slug: a.shop.slug,
    serviceId: a.service.id,
    from,
    to,
  });
  const starts = (data ?? []).filter((s) => s.start !== a.start);
  const days = [...new Set(starts.map((s) => localDate(s.start)))];
  const submit = async () => {
    if (!chosen) return;
    setBusy(true);
    setError(null);
    try {
      await actOnAppointment(a.id, 'propose', { start: chosen });
      onClose();
    } catch (e) {
      setError(actionError(e));
    } finally {
      setBusy(false);
    }
  };
  return (
    <ActionDialog
      open
      title="Propose another time"
      titleId="propose-title"
      submitLabel={chosen ? `Propose ${whenLabel(chosen)}` : 'Propose'}
      busy={busy}
      error={error}
      canSubmit={!!chosen}
      onSubmit={() => void submit()}
      onClose={onClose}
      maxWidth="md"
    >
      <DialogContentText sx={{ mb: 2 }}>
        {who(a)}. The rider accepts the new time or keeps the old one. Free starts for “{a.service.name}”,
        times in {zoneLabel(zone)}.
      </DialogContentText>
      {/* wraps on a phone, so that the date field keeps its width */}
      <Stack direction="row" useFlexGap sx={{ alignItems: 'center', flexWrap: 'wrap', gap: 1, mb: 1.5 }}>
        <IconButton
          aria-label="Earlier week"
          onClick={() => setFrom(addDays(from, -7) < today ? today : addDays(from, -7))}
          disabled={from <= today}
        >
          <ChevronLeftIcon />
        </IconButton>
        <TextInput
          type="date"
          size="small"
          label="From"
          value={from}
          onChange={(e) => e.target.value && setFrom(e.target.value < today ? today : e.target.value)}
          slotProps={{ htmlInput: { min: today }, inputLabel: { shrink: true } }}
          sx={{ width: 210 }}
        />
        <IconButton aria-label="Later week" onClick={() => setFrom(addDays(from, 7))}>
          <ChevronRightIcon />
        </IconButton>
        <Typography variant="body2" color="text.secondary">
          {dayLabel(from)} – {dayLabel(to)}
        </Typography>
      </Stack>
      {loadError && <Alert severity="error">Free times did not load: {loadError.message}</Alert>}
      {!data && !loadError && <Skeleton variant="rounded" height={120} />}
      {data && days.length === 0 && <Alert severity="info">No free start this week. Try a later week.</Alert>}
      <Stack spacing={1.5} role="group" aria-label="Free starts">
        {days.map((d) => (
          <Box key={d}>
            <Typography variant="subtitle2" component="h3" sx={{ mb: 0.5 }}>
              {dayLabel(d)}
            </Typography>
            <Stack direction="row" sx={{ flexWrap: 'wrap', gap: 0.75 }}>
              {starts
                .filter((s) => localDate(s.start) === d)
                .map((s) => (
                  <ToggleButton
                    key={s.start}
                    value={s.start}
                    size="small"
                    selected={chosen === s.start}
                    onChange={() => setChosen(s.start)}
                    aria-label={`${dayLabel(d)} ${localTime(s.start)}`}
                    sx={{
                      py: 0.25,
                      px: 1.25,
                      minWidth: 64,
                      '&.Mui-selected, &.Mui-selected:hover': {
                        bgcolor: 'primary.main',
                        color: 'primary.contrastText',
                      },
                    }}
                  >
                    {localTime(s.start)}
                  </ToggleButton>
                ))}
            </Stack>
          </Box>
        ))}
      </Stack>
    </ActionDialog>
  );
}

/**
 * The staff actions on an appointment, for the table and the appointment page: `run` does
 * confirm, complete and no-show at once and opens a dialog for decline, cancel and propose.
 */
export function useAppointmentActions() {
  const [dialog, setDialog] = useState<{ a: WorkshopAppointment; action: StaffAction } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState<string | null>(null);
  /** Runs `action`, or opens its dialog; true once an action without a dialog went through. */
  const run = async (a: WorkshopAppointment, action: StaffAction): Promise<boolean> => {
    setError(null);
    if (action === 'decline' || action === 'cancel' || action === 'propose') {
      setDialog({ a, action });
      return false;
    }
    setBusy(`${a.id}:${action}`);
    try {
      await actOnAppointment(a.id, action);
      return true;
    } catch (e) {
      setError(actionError(e));
      return false;
    } finally {
      setBusy(null);
    }
  };
  const close = () => setDialog(null);
  const dialogs = dialog && (
    <>
      {dialog.action === 'decline' && <DeclineDialog a={dialog.a} onClose={close} />}
      {dialog.action === 'cancel' && <CancelDialog a={dialog.a} onClose={close} />}
      {dialog.action === 'propose' && <ProposeDialog a={dialog.a} onClose={close} />}
    </>
  );
  return { run, dialogs, error, clearError: () => setError(null), busy };
}

export const ACTION_LABELS: Record<StaffAction, string> = {
  confirm: 'Confirm',
  decline: 'Decline…',
  propose: 'Propose another time…',
  cancel: 'Cancel…',
  complete: 'Mark completed',
  'no-show': 'Mark no-show',
};
