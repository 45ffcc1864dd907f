import ArrowBackIcon from '@mui/icons-material/ArrowBack';
import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Container from '@mui/material/Container';
import Link from '@mui/material/Link';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { Appointment, AppointmentCreated } from '@loamline/shared-types';
import { useCallback, useEffect, useRef, useState } from 'react';
import { Link as RouterLink, useLocation, useParams } from 'react-router';
import { LoadError } from '@/components/ui/load-error';
import { HeldPayment } from '@/features/payments/components/held-payment';
import { HoldReleased } from '@/features/payments/components/hold-released';
import { PaymentReceipt } from '@/features/payments/components/payment-receipt';
import { RiderReport } from '@/features/reports/components/rider-report';
import type { PaymentOutcome } from '@/features/payments/components/payment-step';
import { useNow } from '@/features/payments/hooks/use-now';
import { paths, pathTo } from '@/config/paths';
import { ApiRequestError } from '@/lib/api-client';
import { acceptProposal } from '../api/accept-proposal';
import { useAppointment } from '../api/get-appointment';
import { useShop } from '../api/get-shop';
import { rejectProposal } from '../api/reject-proposal';
import {
  cancellationPolicy,
  durationInWords,
  moneyBackInWords,
  paymentInWords,
  priceInWords,
  stateInWords,
} from '../utils/words';
import { formatSlot, formatTime, zoneLabel } from '../utils/zoned-time';
import { CancelDialog } from './cancel-dialog';
import { MoveDialog } from './move-dialog';
import { StateChip } from './state-chip';
import { SummaryList } from './summary-list';

/** What the booking answered, passed along by the flow for the confirmation. */
interface BookedState {
  booked?: AppointmentCreated;
}

function Confirmation({ a }: { a: Appointment }) {
  // only while the request waits for the shop: held, the payment step right below says what to do
  // (and takes the focus); once confirmed, cancelled or declined, "booked" would be stale — the
  // browser keeps the booking's state across reloads
  if (a.status !== 'requested') return null;
  return (
    <Alert severity="success">
      <AlertTitle>Booked: your request is with {a.shop.name}</AlertTitle>
      The shop confirms it or suggests another time; you will see it here.
    </Alert>
  );
}

/** After Pay: paid (the shop confirms next) or still processing at the bank; focus lands here. */
function PaidNotice({ outcome, a }: { outcome: PaymentOutcome; a: Appointment }) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => box.current?.focus(), []);
  const recorded = a.status !== 'held';
  return outcome.paid ? (
    <Alert severity="success" ref={box} tabIndex={-1} role="status">
      <AlertTitle>Paid — the shop will confirm your time</AlertTitle>
      {recorded
        ? `${a.shop.name} now confirms it or suggests another time; you will see it here. The receipt is below.`
        : 'Loamline is recording the payment; the receipt shows here in a moment. Please don’t pay again.'}
    </Alert>
  ) : (
    <Alert severity="info" ref={box} tabIndex={-1} role="status">
      <AlertTitle>The payment is being processed</AlertTitle>
      The bank hasn’t finished yet. This page updates once it has; please don’t pay again.
    </Alert>
  );
}

/** How long the page asks for the appointment again after paying, while it is still held. */
const POLL_MS = 2000;
const POLL_FOR_MS = 20_000;
/** How often the page asks again while a refund is on its way. */
const REFUND_POLL_MS = 4000;
/** Once the hold has passed with the page open: ask again now, then every few seconds for a while. */
const LAPSE_POLL_MS = 3000;
const LAPSE_POLL_FOR_MS = 2 * 60_000;

/** Held, and the hold's end has passed (the server marks it expired on its own schedule). */
const holdPassed = (a: Appointment | undefined, now: number) =>
  a?.status === 'held' && !!a.holdExpiresAt && Date.parse(a.holdExpiresAt) <= now;

/** `/appointments/:id`: one appointment, its state in words, and what the rider may do now. */
export function AppointmentPage() {
  const { id } = useParams<{ id: string }>();
  const { state } = useLocation() as { state: BookedState | null };
  const [outcome, setOutcome] = useState<{ at: number; outcome: PaymentOutcome } | null>(null);
  const [polling, setPolling] = useState(false);
  const {
    data: a,
    error,
    mutate,
  } = useAppointment(id, {
    // paid but still held here: the webhook lands any moment; a refund on its way: the worker
    // makes it within seconds, and the receipt should say so without a reload
    refreshInterval: (latest) =>
      polling && latest?.status === 'held'
        ? POLL_MS
        : holdPassed(latest, Date.now()) &&
            Date.now() - Date.parse(latest!.holdExpiresAt!) < LAPSE_POLL_FOR_MS
          ? LAPSE_POLL_MS
          : latest?.payment?.refunds.some((r) => r.status === 'pending')
            ? REFUND_POLL_MS
            : 0,
  });
  // a payment on its way keeps the payment step on screen even as the hold ends
  const [paying, setPaying] = useState(false);
  const now = useNow(1000, a?.status === 'held');
  /** the hold ran out with the page open: the page says so everywhere until the server agrees */
  const lapsed = holdPassed(a, now) && !outcome && !paying;
  useEffect(() => {
    if (!lapsed) return;
    void mutate();
    const again = window.setTimeout(() => void mutate(), LAPSE_POLL_MS);
    return () => window.clearTimeout(again);
  }, [lapsed, mutate]);
  const shop = useShop(a?.shop.slug);
  const [dialog, setDialog] = useState<'cancel' | 'move' | null>(null);
  const refresh = useCallback(() => void mutate(), [mutate]);
  useEffect(() => {
    if (!outcome) return;
    const stop = window.setTimeout(
      () => setPolling(false),
      Math.max(0, outcome.at + POLL_FOR_MS - Date.now()),
    );
    return () => window.clearTimeout(stop);
  }, [outcome]);
  const [actionError, setActionError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  if (error) {
    return (
      <Container maxWidth="md" sx={{ py: { xs: 3, md: 5 } }}>
        {error instanceof ApiRequestError && error.status === 404 ? (
          <Alert severity="info">No such appointment in your account.</Alert>
        ) : (
          <LoadError what="The appointment" error={error} onRetry={() => void mutate()} />
        )}
      </Container>
    );
  }
  if (!a) {
    return (
      <Container maxWidth="md" sx={{ py: { xs: 3, md: 5 } }}>
        <Skeleton variant="text" height={56} width="60%" />
        <Skeleton variant="rounded" height={260} sx={{ mt: 2 }} />
      </Container>
    );
  }

  const zone = a.shop.timeZone;
  const moneyBack = moneyBackInWords(a);
  // what the page shows: a lapsed hold is shown as the lapsed appointment it is about to be
  const status = lapsed ? 'expired' : a.status;
  const canCancel = a.canCancel && !lapsed;
  const canMove = a.canMove && !lapsed;
  const answer = async (fn: (id: string) => Promise<Appointment>) => {
    setBusy(true);
    setActionError(null);
    try {
      await fn(a.id);
    } catch (e) {
      setActionError(e instanceof ApiRequestError ? e.body.message : 'Loamline could not reach the server.');
      await mutate();
    } finally {
      setBusy(false);
    }
  };

  return (
    <Container maxWidth="md" sx={{ py: { xs: 3, md: 5 } }}>
      <title>{`${a.service.name} · Loamline`}</title>
      <Stack spacing={3}>
        <Button
          component={RouterLink}
          to={paths.appointments}
          startIcon={<ArrowBackIcon />}
          sx={{ alignSelf: 'flex-start' }}
        >
          My appointments
        </Button>
        {/* paid here: the paid notice says it all, once */}
        {state?.booked?.id === a.id && !outcome && <Confirmation a={a} />}
        {outcome && <PaidNotice outcome={outcome.outcome} a={a} />}
        <Stack spacing={1}>
          <Stack
            direction="row"
            useFlexGap
            spacing={1.5}
            sx={{ alignItems: 'center', flexWrap: 'wrap', rowGap: 1 }}
          >
            <Typography variant="h1" sx={{ fontSize: { xs: '1.8rem', md: '2.1rem' } }}>
              {a.service.name}
            </Typography>
            <StateChip state={status} />
          </Stack>
          <Typography sx={{ fontSize: '1.1rem' }}>{formatSlot(a.start, a.end, zone)}</Typography>
          <Typography color="text.secondary">{stateInWords({ ...a, status })}</Typography>
          {moneyBack && <Typography sx={{ fontWeight: 500 }}>{moneyBack}</Typography>}
        </Stack>

        {a.status === 'held' && !outcome && !lapsed && (
          <HeldPayment
            appointment={a}
            fromBooking={state?.booked?.id === a.id ? state.booked.payment : undefined}
            focusOnMount={state?.booked?.id === a.id}
            onExpired={refresh}
            onWorking={setPaying}
            now={now}
            onDone={(o) => {
              setOutcome({ at: Date.now(), outcome: o });
              setPolling(true);
            }}
          />
        )}
        {status === 'expired' && <HoldReleased a={a} live={lapsed} />}

        {a.proposedStart && (
          <Box component="section" aria-label="The shop proposes another time">
            <Alert severity="info" role="status">
              <AlertTitle>{a.shop.name} proposes another time</AlertTitle>
              {formatSlot(a.proposedStart, null, zone)} instead of {formatTime(a.start, zone)}. Accept it and
              the appointment moves there, confirmed; turn it down and your request stays at its own time.
              <Stack direction="row" useFlexGap spacing={1.5} sx={{ mt: 1.5, flexWrap: 'wrap', rowGap: 1 }}>
                <Button variant="contained" disabled={busy} onClick={() => void answer(acceptProposal)}>
                  Accept the new time
                </Button>
                <Button variant="outlined" disabled={busy} onClick={() => void answer(rejectProposal)}>
                  Turn it down
                </Button>
              </Stack>
            </Alert>
          </Box>
        )}
        {actionError && <Alert severity="error">{actionError}</Alert>}

        <Card>
          <CardContent>
            <SummaryList
              rows={[
                [
                  'Shop',
                  <Link key="shop" component={RouterLink} to={pathTo.shop(a.shop.slug)}>
                    {a.shop.name}, {a.shop.town}
                  </Link>,
                ],
                ['Time zone', `${zoneLabel(zone, a.start)} · ${zone}`],
                ['Service', `${a.service.name} (${durationInWords(a.service.durationMinutes)})`],
                [
                  'Bike',
                  a.bike
                    ? `${a.bike.name}${a.bike.description ? ` — ${a.bike.description}` : ''}`
                    : 'None named',
                ],
                [
                  'Baseline sheet',
                  a.baselineSheetId ? (
                    <Link key="sheet" component={RouterLink} to={pathTo.sheet(a.baselineSheetId)}>
                      Shared with the shop
                    </Link>
                  ) : (
                    'None shared'
                  ),
                ],
                ['Notes', a.notes || 'None'],
                ['Price', priceInWords(a.service, a.shop.currency)],
                ['Paying', paymentInWords(a.service, a.shop.currency)],
                ...(shop.data && canCancel
                  ? ([['Cancelling', cancellationPolicy(shop.data.cancellationWindowHours, a.service)]] as [
                      string,
                      string,
                    ][])
                  : []),
                ...(a.cancelReason ? ([['Reason given', a.cancelReason]] as [string, string][]) : []),
              ]}
            />
          </CardContent>
        </Card>

        {a.status === 'completed' && <RiderReport a={a} />}

        {a.payment && (
          <Card>
            <CardContent>
              <PaymentReceipt
                payment={a.payment}
                priceMinor={a.service.priceMinor}
                zone={zone}
                viewer="rider"
                appointmentStatus={status}
              />
            </CardContent>
          </Card>
        )}

        {(canMove || canCancel) && (
          <Stack direction={{ xs: 'column', sm: 'row' }} spacing={1.5}>
            {canMove && shop.data && (
              <Button variant="outlined" size="large" onClick={() => setDialog('move')}>
                Move to another time
              </Button>
            )}
            {canCancel && (
              <Button variant="outlined" color="error" size="large" onClick={() => setDialog('cancel')}>
                Cancel appointment
              </Button>
            )}
          </Stack>
        )}
      </Stack>
      {dialog === 'cancel' && (
        <CancelDialog
          a={a}
          windowHours={shop.data?.cancellationWindowHours}
          open
          onClose={() => setDialog(null)}
        />
      )}
      {dialog === 'move' && shop.data && (
        <MoveDialog a={a} shop={shop.data} open onClose={() => setDialog(null)} />
      )}
    </Container>
  );
}
