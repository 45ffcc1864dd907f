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
import { useState } from 'react';
import { Link as RouterLink, useLocation, useParams } from 'react-router';
import { LoadError } from '@/components/ui/load-error';
import { paths, pathTo } from '@/config/paths';
import { ApiRequestError } from '@/lib/api-client';
import { acceptProposal } from '../api/accept-proposal';
import { useAppointment } from '../api/get-appointment';
import { useShop } from '../api/get-shop';
import { rejectProposal } from '../api/reject-proposal';
import {
  cancellationPolicy,
  durationInWords,
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
  if (a.status === 'held' && a.holdExpiresAt) {
    const until = `${formatTime(a.holdExpiresAt, a.shop.timeZone)} ${zoneLabel(a.shop.timeZone, a.holdExpiresAt)}`;
    return (
      <Alert severity="warning">
        <AlertTitle>The time is held until {until}</AlertTitle>
        This service asks for a payment when booking, and paying online is not available in Loamline yet. So
        nothing has been charged, and the hold will lapse at {until}; the time then goes back to other riders.
        To keep it, contact {a.shop.name} directly.
      </Alert>
    );
  }
  return (
    <Alert severity="success">
      <AlertTitle>Booked: your request is with {a.shop.name}</AlertTitle>
      The shop confirms it or suggests another time; you will see it here.
    </Alert>
  );
}

/** `/appointments/:id`: one appointment, its state in words, and what the rider may do now. */
export function AppointmentPage() {
  const { id } = useParams<{ id: string }>();
  const { state } = useLocation() as { state: BookedState | null };
  const { data: a, error, mutate } = useAppointment(id);
  const shop = useShop(a?.shop.slug);
  const [dialog, setDialog] = useState<'cancel' | 'move' | null>(null);
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
        {state?.booked?.id === a.id && <Confirmation a={a} />}
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
            <StateChip state={a.status} />
          </Stack>
          <Typography sx={{ fontSize: '1.1rem' }}>{formatSlot(a.start, a.end, zone)}</Typography>
          <Typography color="text.secondary">{stateInWords(a)}</Typography>
          {a.status === 'held' && a.holdExpiresAt && state?.booked?.id !== a.id && (
            <Typography color="text.secondary">
              Held until {formatTime(a.holdExpiresAt, zone)} {zoneLabel(zone, a.holdExpiresAt)}.
            </Typography>
          )}
        </Stack>

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
                [
                  'Paying',
                  a.status === 'held'
                    ? `${paymentInWords(a.service, a.shop.currency)} Not paid: paying online is not available yet.`
                    : paymentInWords(a.service, a.shop.currency),
                ],
                ...(shop.data && a.canCancel
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

        {(a.canMove || a.canCancel) && (
          <Stack direction={{ xs: 'column', sm: 'row' }} spacing={1.5}>
            {a.canMove && shop.data && (
              <Button variant="outlined" size="large" onClick={() => setDialog('move')}>
                Move to another time
              </Button>
            )}
            {a.canCancel && (
              <Button variant="outlined" color="error" size="large" onClick={() => setDialog('cancel')}>
                Cancel appointment
              </Button>
            )}
          </Stack>
        )}
      </Stack>
      {dialog === 'cancel' && <CancelDialog a={a} open onClose={() => setDialog(null)} />}
      {dialog === 'move' && shop.data && (
        <MoveDialog a={a} shop={shop.data} open onClose={() => setDialog(null)} />
      )}
    </Container>
  );
}
