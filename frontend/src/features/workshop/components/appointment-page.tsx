import ArrowBackIcon from '@mui/icons-material/ArrowBack';
import ExpandMoreIcon from '@mui/icons-material/ExpandMore';
import Accordion from '@mui/material/Accordion';
import AccordionDetails from '@mui/material/AccordionDetails';
import AccordionSummary from '@mui/material/AccordionSummary';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Grid from '@mui/material/Grid';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { AppointmentHistoryEntry, WorkshopAppointment } from '@loamline/shared-types';
import type { ReactNode } from 'react';
import { Link as RouterLink, useParams } from 'react-router';
import { paths, pathTo } from '@/config/paths';
import { useSheet } from '@/features/baseline-sheets/api/get-sheet';
import { SheetSummary } from '@/features/baseline-sheets/components/sheet-summary';
import { UnitsControl } from '@/features/baseline/components/units-control';
import { useUnitPrefs } from '@/features/baseline/hooks/use-unit-prefs';
import { PaymentReceipt } from '@/features/payments/components/payment-receipt';
import { WorkshopReport } from '@/features/reports/components/workshop-report';
import { ApiRequestError } from '@/lib/api-client';
import { staffActions, type StaffAction } from '../utils/states';
import { formatMoney } from '@/features/booking/utils/money';
import { priceInWords } from '@/features/booking/utils/words';
import { formatDateTime, formatDay, formatTime } from '@/features/booking/utils/zoned-time';
import { localDate, zoneLabel } from '../utils/time';
import { useWorkshopAppointment } from '../api/get-appointment';
import { ACTION_LABELS, useAppointmentActions } from './action-dialogs';
import { StateChip } from './state-chip';
import { WorkshopShell } from './workshop-shell';

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <Stack direction="row" spacing={2} sx={{ py: 0.4 }}>
      <Typography variant="body2" color="text.secondary" sx={{ width: 130, flexShrink: 0 }}>
        {label}
      </Typography>
      <Typography variant="body2" component="div" sx={{ minWidth: 0, overflowWrap: 'anywhere' }}>
        {children}
      </Typography>
    </Stack>
  );
}

function Section({ title, id, children }: { title: string; id: string; children: ReactNode }) {
  return (
    <Card component="section" aria-labelledby={id} sx={{ height: '100%' }}>
      <CardContent>
        <Typography id={id} variant="h3" component="h2" sx={{ fontSize: '1.05rem', mb: 1 }}>
          {title}
        </Typography>
        {children}
      </CardContent>
    </Card>
  );
}

const EVENT_WORDS: Record<string, string> = {
  created: 'Booked',
  paid: 'Paid — waiting for the shop',
  expire: 'Expired unpaid',
  confirm: 'Confirmed',
  decline: 'Declined',
  propose: 'Another time proposed',
  'accept-proposal': 'Rider accepted the proposed time',
  'reject-proposal': 'Rider kept the original time',
  move: 'Rider moved it',
  cancel: 'Cancelled',
  complete: 'Completed',
  'no-show': 'Marked no-show',
  reminder: 'Reminder sent',
};

function historyLine(h: AppointmentHistoryEntry, riderName: string, zone: string): string {
  const words = EVENT_WORDS[h.event] ?? h.event;
  const by = h.by === 'system' ? 'Loamline' : h.by === 'rider' ? riderName : (h.byName ?? 'shop staff');
  const extra = [
    h.start ? `to ${formatDateTime(h.start, zone)}` : null,
    h.reason ? `“${h.reason}”` : null,
  ].filter(Boolean);
  return `${words}${extra.length ? ` ${extra.join(' — ')}` : ''} · ${by}`;
}

function AttachedSheet({ id }: { id: string }) {
  const { data: sheet, error } = useSheet(id);
  const [prefs, setPrefs] = useUnitPrefs();
  if (error)
    return (
      <Alert severity={error instanceof ApiRequestError && error.status === 404 ? 'info' : 'error'}>
        {error instanceof ApiRequestError && error.status === 404
          ? 'The rider has deleted this sheet.'
          : `The sheet did not load: ${error.message}`}
      </Alert>
    );
  if (!sheet) return <Skeleton variant="rounded" height={56} />;
  return (
    <Accordion disableGutters variant="outlined" sx={{ borderRadius: 2.5 }}>
      <AccordionSummary expandIcon={<ExpandMoreIcon />} aria-controls="sheet-body" id="sheet-head">
        <Typography sx={{ fontWeight: 500 }}>Baseline sheet: {sheet.name}</Typography>
      </AccordionSummary>
      <AccordionDetails id="sheet-body">
        <Stack direction="row" sx={{ justifyContent: 'flex-end', mb: 1 }}>
          <UnitsControl units={prefs} onChange={setPrefs} />
        </Stack>
        <SheetSummary sheet={sheet} prefs={prefs} />
      </AccordionDetails>
    </Accordion>
  );
}

function Actions({ a }: { a: WorkshopAppointment }) {
  const actions = useAppointmentActions();
  const allowed = staffActions(a);
  const variant = (k: StaffAction) => (k === 'confirm' || k === 'complete' ? 'contained' : 'outlined');
  const color = (k: StaffAction) =>
    k === 'decline' || k === 'cancel' || k === 'no-show' ? 'error' : 'primary';
  return (
    <>
      {actions.error && (
        <Alert severity="warning" onClose={actions.clearError} sx={{ mb: 2 }}>
          {actions.error}
        </Alert>
      )}
      {allowed.length > 0 ? (
        <Stack direction="row" sx={{ flexWrap: 'wrap', gap: 1 }} aria-label="Actions" role="group">
          {allowed.map((k) => (
            <Button
              key={k}
              variant={variant(k)}
              color={color(k)}
              disabled={actions.busy === `${a.id}:${k}`}
              onClick={() => void actions.run(a, k)}
            >
              {ACTION_LABELS[k]}
            </Button>
          ))}
        </Stack>
      ) : (
        <Typography variant="body2" color="text.secondary">
          Nothing to do: this appointment has ended.
        </Typography>
      )}
      {a.status === 'confirmed' && !allowed.includes('complete') && (
        <Typography variant="body2" color="text.secondary" sx={{ mt: 1 }}>
          Completed and no-show can be marked once the appointment has started.
        </Typography>
      )}
      {actions.dialogs}
    </>
  );
}

/** `/workshop/appointments/:id`: who is coming, with what, their sheet, what happened, what to do. */
export function AppointmentPage() {
  const { id } = useParams();
  const { data: a, error } = useWorkshopAppointment(id);
  const back = (
    <Button component={RouterLink} to={paths.workshopRequests} startIcon={<ArrowBackIcon />} sx={{ mb: 1 }}>
      All requests
    </Button>
  );
  if (error) {
    const missing = error instanceof ApiRequestError && error.status === 404;
    return (
      <WorkshopShell>
        {back}
        <Alert severity={missing ? 'info' : 'error'}>
          {missing
            ? 'There is no such appointment at this shop.'
            : `The appointment did not load: ${error.message}`}
        </Alert>
      </WorkshopShell>
    );
  }
  if (!a)
    return (
      <WorkshopShell>
        {back}
        <Skeleton variant="text" width="50%" height={40} />
        <Skeleton variant="rounded" height={240} sx={{ mt: 2 }} />
      </WorkshopShell>
    );
  const zone = a.shop.timeZone;
  return (
    <WorkshopShell>
      <Stack direction="row" sx={{ justifyContent: 'space-between', flexWrap: 'wrap', gap: 1 }}>
        {back}
        <Button component={RouterLink} to={pathTo.workshopSchedule(localDate(a.start), 'day')}>
          See the day in the schedule
        </Button>
      </Stack>
      <Stack direction="row" spacing={1.5} sx={{ alignItems: 'center', flexWrap: 'wrap', mb: 0.5 }}>
        <Typography variant="h3" component="h2">
          {a.service.name} · {a.rider.name}
        </Typography>
        <StateChip state={a.status} />
      </Stack>
      <Typography color="text.secondary" sx={{ mb: 2 }}>
        {formatDay(a.start, zone)}, {formatTime(a.start, zone)}–{formatTime(a.end, zone)} · bench {a.bench} ·
        times in {zoneLabel(zone, new Date(a.start))}
      </Typography>
      {a.proposedStart && (
        <Alert severity="info" sx={{ mb: 2 }}>
          Proposed instead: {formatDateTime(a.proposedStart, zone)}. Waiting for the rider to accept it or
          keep this time.
        </Alert>
      )}
      {a.declineReason && (
        <Alert severity="error" sx={{ mb: 2 }}>
          Declined: {a.declineReason}
        </Alert>
      )}
      {a.cancelReason && (
        <Alert severity="warning" sx={{ mb: 2 }}>
          Cancelled: {a.cancelReason}
        </Alert>
      )}
      <Box sx={{ mb: 3 }}>
        <Actions a={a} />
      </Box>
      <Grid container spacing={2}>
        <Grid size={{ xs: 12, md: 6 }}>
          <Section title="Rider" id="rider-title">
            <Fact label="Name">{a.rider.name}</Fact>
            <Fact label="E-mail">{a.rider.email}</Fact>
            <Fact label="Weight with gear">
              {a.rider.massKg !== null
                ? `${Math.round(a.rider.massKg * 10) / 10} kg (from the sheet)`
                : 'No sheet attached'}
            </Fact>
            <Fact label="Notes">{a.notes || '—'}</Fact>
          </Section>
        </Grid>
        <Grid size={{ xs: 12, md: 6 }}>
          <Section title="Bike and service" id="bike-title">
            <Fact label="Bike">{a.bike ? a.bike.name : 'Not given'}</Fact>
            {a.bike && <Fact label="Suspension">{a.bike.description}</Fact>}
            <Fact label="Service">
              {a.service.name} ({a.service.durationMinutes} min)
            </Fact>
            <Fact label="Price">
              {priceInWords(a.service, a.shop.currency)}
              {a.service.depositMinor > 0 &&
                a.service.depositMinor < a.service.priceMinor &&
                ` · deposit ${formatMoney(a.service.depositMinor, a.shop.currency)} online when booking`}
              {a.service.depositMinor > 0 &&
                a.service.depositMinor === a.service.priceMinor &&
                ' · paid online when booking'}
            </Fact>
            <Fact label="Booked">{formatDateTime(a.createdAt, zone)}</Fact>
          </Section>
        </Grid>
        {a.payment && (
          <Grid size={12}>
            <Card sx={{ height: '100%' }}>
              <CardContent>
                <PaymentReceipt
                  payment={a.payment}
                  priceMinor={a.service.priceMinor}
                  zone={zone}
                  viewer="staff"
                  title="Payment"
                  appointmentStatus={a.status}
                />
              </CardContent>
            </Card>
          </Grid>
        )}
        <Grid size={12}>
          <Section title="Baseline sheet" id="sheet-title">
            {a.baselineSheetId ? (
              <AttachedSheet id={a.baselineSheetId} />
            ) : (
              <Typography variant="body2" color="text.secondary">
                The rider did not attach a baseline sheet.
              </Typography>
            )}
          </Section>
        </Grid>
        {(a.status === 'confirmed' || a.status === 'completed') && (
          <Grid size={12}>
            <WorkshopReport a={a} />
          </Grid>
        )}
        <Grid size={12}>
          <Section title="History" id="history-title">
            {a.history && a.history.length > 0 ? (
              <Box component="ol" sx={{ m: 0, pl: 0, listStyle: 'none' }}>
                {a.history.map((h, i) => (
                  <Box
                    component="li"
                    key={`${h.at}-${i}`}
                    sx={{ display: 'flex', gap: 2, py: 0.5, borderTop: i ? 1 : 0, borderColor: 'divider' }}
                  >
                    <Typography variant="body2" color="text.secondary" sx={{ width: 150, flexShrink: 0 }}>
                      {formatDateTime(h.at, zone)}
                    </Typography>
                    <Typography variant="body2">{historyLine(h, a.rider.name, zone)}</Typography>
                  </Box>
                ))}
              </Box>
            ) : (
              <Typography variant="body2" color="text.secondary">
                Booked {formatDateTime(a.createdAt, zone)}.
              </Typography>
            )}
          </Section>
        </Grid>
      </Grid>
    </WorkshopShell>
  );
}
