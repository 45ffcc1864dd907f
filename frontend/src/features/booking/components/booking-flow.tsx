import ArrowBackIcon from '@mui/icons-material/ArrowBack';
import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import MenuItem from '@mui/material/MenuItem';
import Stack from '@mui/material/Stack';
import Step from '@mui/material/Step';
import StepLabel from '@mui/material/StepLabel';
import Stepper from '@mui/material/Stepper';
import Link from '@mui/material/Link';
import TextField from '@mui/material/TextField';
import Typography from '@mui/material/Typography';
import type { Appointment, ShopDetail, ShopService } from '@loamline/shared-types';
import { useEffect, useRef, useState } from 'react';
import { Link as RouterLink, useLocation, useNavigate } from 'react-router';
import { TextInput } from '@/components/ui/text-input';
import { paths, pathTo } from '@/config/paths';
import { useSession } from '@/features/auth/api/get-me';
import { isStaff } from '@/features/auth/types';
import { useSheets } from '@/features/baseline-sheets/api/get-sheets';
import { useBikes } from '@/features/garage/api/get-bikes';
import { ApiRequestError } from '@/lib/api-client';
import { createAppointment } from '../api/create-appointment';
import { getAppointments } from '../api/get-appointments';
import {
  BOOKING_STEPS,
  choiceSearch,
  readNotes,
  useBookingChoice,
  writeNotes,
  type BookingChoice,
  type BookingStep,
} from '../hooks/use-booking-choice';
import { bookingConflict, clashingAppointment } from '../utils/conflicts';
import { formatMoney } from '../utils/money';
import { cancellationPolicy, durationInWords, paymentInWords, priceInWords } from '../utils/words';
import { formatSlot } from '../utils/zoned-time';
import { LazyDayTimePicker as DayTimePicker } from './lazy-day-time-picker';
import { SummaryList } from './summary-list';

const STEP_TITLES: Record<BookingStep, string> = {
  time: 'Pick a day and time',
  details: 'Bike and notes',
  review: 'Check and book',
};
const STEP_LABELS: Record<BookingStep, string> = {
  time: 'Day and time',
  details: 'Bike and notes',
  review: 'Review',
};

export const STAFF_CANNOT_BOOK =
  'Shop staff accounts can’t book appointments. Sign in with a rider account to book bench time.';
export const TIME_TAKEN = 'That time was just taken. The free times are fresh again: pick another one.';

// an instant (UTC): its readers only parse it, and formatSlot shows it in the shop's zone
const endOf = (start: string, minutes: number) =>
  new Date(Date.parse(start) + minutes * 60_000).toISOString();

interface StepProps {
  shop: ShopDetail;
  service: ShopService;
  choice: BookingChoice;
  update: ReturnType<typeof useBookingChoice>['update'];
}

/** The booking flow on the shop's page: day and time → bike and notes → review → Book. */
export function BookingFlow({
  shop,
  service,
  focusOnEntry = false,
}: {
  shop: ShopDetail;
  service: ShopService;
  /** the rider just chose the service on this page: the step's heading takes the focus at once */
  focusOnEntry?: boolean;
}) {
  const { choice, update } = useBookingChoice();
  const { user, isLoading } = useSession();
  const navigate = useNavigate();
  const { pathname } = useLocation();
  const [notice, setNotice] = useState<string | null>(null);
  const step = choice.step ?? 'time';
  const heading = useRef<HTMLHeadingElement>(null);
  const firstRender = useRef(true);

  // the step's heading takes the focus when the step changes, and on the first paint only when the
  // rider came from a service's Book button (its button is gone, so the focus would drop to the page)
  useEffect(() => {
    if (firstRender.current) {
      firstRender.current = false;
      if (!focusOnEntry) return;
    }
    heading.current?.focus();
    // `focusOnEntry` only matters on the first paint; later steps always take the focus
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [step]);

  // Bike and notes and the review need an account: to sign-in, and back to this very step.
  const needsAccount = step !== 'time' && !isLoading && !user;
  const missingTime = step !== 'time' && !choice.start;
  useEffect(() => {
    if (needsAccount) void navigate(pathTo.signIn(pathname + choiceSearch(choice)), { replace: true });
    else if (missingTime) update({ step: 'time' }, { replace: true });
  }, [needsAccount, missingTime, navigate, pathname, choice, update]);

  const stepProps: StepProps = { shop, service, choice, update };
  return (
    <Stack spacing={3}>
      <Button
        startIcon={<ArrowBackIcon />}
        onClick={() => update({ serviceId: null, day: null, start: null, step: null })}
        sx={{ alignSelf: 'flex-start' }}
      >
        All services
      </Button>
      <Stepper activeStep={BOOKING_STEPS.indexOf(step)} alternativeLabel aria-label="Booking steps">
        {BOOKING_STEPS.map((s) => (
          <Step key={s}>
            <StepLabel>{STEP_LABELS[s]}</StepLabel>
          </Step>
        ))}
      </Stepper>
      <div>
        <Typography variant="overline" color="text.secondary">
          {service.name} · {durationInWords(service.durationMinutes)} · {priceInWords(service, shop.currency)}
        </Typography>
        <Typography ref={heading} tabIndex={-1} variant="h2" sx={{ fontSize: '1.5rem', outline: 'none' }}>
          {STEP_TITLES[step]}
        </Typography>
      </div>
      {notice && (
        <Alert severity="warning" onClose={() => setNotice(null)}>
          {notice}
        </Alert>
      )}
      {step === 'time' && <TimeStep {...stepProps} signedIn={!!user} />}
      {step === 'details' && user && <DetailsStep {...stepProps} staff={isStaff(user)} />}
      {step === 'review' && user && choice.start && (
        <ReviewStep
          {...stepProps}
          staff={isStaff(user)}
          onTaken={(why) => {
            setNotice(why);
            update({ start: null, step: 'time' });
          }}
        />
      )}
    </Stack>
  );
}

function TimeStep({ shop, service, choice, update, signedIn }: StepProps & { signedIn: boolean }) {
  const navigate = useNavigate();
  const { pathname } = useLocation();
  const next = () => {
    if (signedIn) update({ step: 'details' });
    else void navigate(pathTo.signIn(pathname + choiceSearch({ ...choice, step: 'details' })));
  };
  return (
    <Stack spacing={3}>
      <DayTimePicker
        shop={shop}
        service={service}
        day={choice.day}
        start={choice.start}
        onDay={(day) => update({ day, start: null })}
        onStart={(start) => update({ start })}
      />
      {choice.start && (
        <Alert severity="success" icon={false}>
          Your pick: {formatSlot(choice.start, endOf(choice.start, service.durationMinutes), shop.timeZone)}
        </Alert>
      )}
      {!signedIn && (
        <Typography variant="body2" color="text.secondary">
          Booking needs an account. You sign in or register next, then come straight back here with this time
          still picked.
        </Typography>
      )}
      <Button variant="contained" size="large" disabled={!choice.start} onClick={next}>
        {signedIn ? 'Next: bike and notes' : 'Sign in to continue'}
      </Button>
    </Stack>
  );
}

function StaffRefusal() {
  return <Alert severity="error">{STAFF_CANNOT_BOOK}</Alert>;
}

function DetailsStep({ shop, choice, update, staff }: StepProps & { staff: boolean }) {
  const bikes = useBikes(!staff);
  const sheets = useSheets();
  const [notes, setNotes] = useState(() => readNotes(shop.slug));
  if (staff) return <StaffRefusal />;
  return (
    <Stack spacing={2.5}>
      <Typography color="text.secondary">
        Optional: tell the shop which bike comes in and share a baseline sheet, so the technician knows your
        setup before you arrive.
      </Typography>
      <TextField
        select
        label="Bike"
        value={bikes.data?.some((b) => b.id === choice.bikeId) ? choice.bikeId : ''}
        onChange={(e) => update({ bikeId: e.target.value || null })}
        helperText={bikes.data && bikes.data.length === 0 ? 'No bikes in your garage yet.' : ' '}
        slotProps={{ select: { displayEmpty: true }, inputLabel: { shrink: true } }}
      >
        <MenuItem value="">No bike named</MenuItem>
        {(bikes.data ?? []).map((b) => (
          <MenuItem key={b.id} value={b.id}>
            {b.name}
          </MenuItem>
        ))}
      </TextField>
      <TextField
        select
        label="Baseline sheet"
        value={sheets.data?.some((s) => s.id === choice.sheetId) ? choice.sheetId : ''}
        onChange={(e) => update({ sheetId: e.target.value || null })}
        helperText={sheets.data && sheets.data.length === 0 ? 'No saved baseline sheets yet.' : ' '}
        slotProps={{ select: { displayEmpty: true }, inputLabel: { shrink: true } }}
      >
        <MenuItem value="">No sheet shared</MenuItem>
        {(sheets.data ?? []).map((s) => (
          <MenuItem key={s.id} value={s.id}>
            {s.name}
          </MenuItem>
        ))}
      </TextField>
      <TextInput
        label="Notes for the shop"
        multiline
        minRows={3}
        value={notes}
        onChange={(e) => {
          setNotes(e.target.value);
          writeNotes(shop.slug, e.target.value);
        }}
        helperText={`${notes.length} / 2000 · e.g. a knock at the top of the stroke, a race date`}
        slotProps={{ htmlInput: { maxLength: 2000 } }}
      />
      <Stack direction={{ xs: 'column-reverse', sm: 'row' }} spacing={1.5}>
        <Button size="large" onClick={() => update({ step: 'time' })}>
          Back
        </Button>
        <Button
          variant="contained"
          size="large"
          sx={{ flexGrow: 1 }}
          onClick={() => update({ step: 'review' })}
        >
          Next: review
        </Button>
      </Stack>
    </Stack>
  );
}

function ReviewStep({
  shop,
  service,
  choice,
  update,
  staff,
  onTaken,
}: StepProps & { staff: boolean; onTaken: (notice: string) => void }) {
  const navigate = useNavigate();
  const bikes = useBikes(!staff);
  const sheets = useSheets();
  const [error, setError] = useState<string | null>(staff ? STAFF_CANNOT_BOOK : null);
  const [busy, setBusy] = useState(false);
  /** 503: the payment service (or the database) is down, and nothing was booked */
  const [unavailable, setUnavailable] = useState<string | null>(null);
  /** 409 other than a taken time: the server's reason; for a clash with one of the rider's own, that one */
  const [clash, setClash] = useState<{ message: string; own: boolean; theirs?: Appointment } | null>(null);
  const start = choice.start!;
  const notes = readNotes(shop.slug);
  const bike = bikes.data?.find((b) => b.id === choice.bikeId);
  const sheet = sheets.data?.find((s) => s.id === choice.sheetId);
  const paid = service.depositMinor > 0;

  const book = async () => {
    setBusy(true);
    setError(null);
    setUnavailable(null);
    setClash(null);
    try {
      const created = await createAppointment({
        shopSlug: shop.slug,
        serviceId: service.id,
        start,
        ...(bike ? { bikeId: bike.id } : {}),
        ...(sheet ? { baselineSheetId: sheet.id } : {}),
        ...(notes.trim() ? { notes: notes.trim() } : {}),
      });
      writeNotes(shop.slug, '');
      await navigate(pathTo.appointment(created.id), { state: { booked: created } });
    } catch (e) {
      setBusy(false);
      if (!(e instanceof ApiRequestError)) {
        setError('Loamline could not reach the server. Check your connection and try again.');
      } else if (e.status === 409) {
        const kind = bookingConflict(e.body);
        if (kind === 'taken') onTaken(TIME_TAKEN);
        else if (kind === 'not-offered') onTaken(`${e.body.message} The free times are fresh again.`);
        else if (kind === 'other') setClash({ message: e.body.message, own: false });
        else {
          setClash({ message: e.body.message, own: true });
          // which of theirs it is, so the rider can go straight to it (a held one still needs paying)
          const theirs = await getAppointments()
            .then((list) => clashingAppointment(list, start, endOf(start, service.durationMinutes)))
            .catch(() => undefined);
          if (theirs) setClash({ message: e.body.message, own: true, theirs });
        }
      } else if (e.status === 503) {
        setUnavailable(e.body.message || "Online payment isn't available right now, so nothing was booked.");
      } else if (e.status === 403) {
        setError(STAFF_CANNOT_BOOK);
      } else if (e.status === 400 && e.body.fields) {
        setError(`${e.body.message} (${Object.keys(e.body.fields).join(', ')})`);
      } else {
        setError(e.body.message);
      }
    }
  };

  return (
    <Stack spacing={3}>
      <Card>
        <CardContent>
          <SummaryList
            rows={[
              ['Shop', `${shop.name}, ${shop.town}`],
              ['Service', `${service.name} (${durationInWords(service.durationMinutes)})`],
              ['When', formatSlot(start, endOf(start, service.durationMinutes), shop.timeZone)],
              ['Bike', bike?.name ?? 'None named'],
              ['Baseline sheet', sheet?.name ?? 'None shared'],
              ['Notes', notes.trim() || 'None'],
              ['Price', priceInWords(service, shop.currency)],
              ['Paying', paymentInWords(service, shop.currency)],
              ['Cancelling', cancellationPolicy(shop.cancellationWindowHours, service)],
            ]}
          />
        </CardContent>
      </Card>
      {paid && (
        <Alert severity="info">
          This service asks for {formatMoney(service.depositMinor, shop.currency)} when booking (
          {service.depositMinor >= service.priceMinor ? 'the full price' : 'a deposit'}). Booking holds the
          time for a short while and takes you to pay online by card; nothing is charged until you pay.
          Unpaid, the hold ends and the time goes back to other riders.
        </Alert>
      )}
      {unavailable && (
        <Alert severity="error" role="alert">
          <AlertTitle>Nothing was booked</AlertTitle>
          {unavailable} Your time is not held; try booking again in a moment.
        </Alert>
      )}
      {error && <Alert severity="error">{error}</Alert>}
      {clash && <ClashNotice clash={clash} onPickAnother={() => update({ start: null, step: 'time' })} />}
      <Stack direction={{ xs: 'column-reverse', sm: 'row' }} spacing={1.5}>
        <Button size="large" onClick={() => update({ step: 'details' })}>
          Back
        </Button>
        <Button
          variant="contained"
          size="large"
          sx={{ flexGrow: 1 }}
          disabled={busy || staff}
          onClick={() => void book()}
        >
          {busy ? 'Booking…' : paid ? 'Book and hold the time' : 'Book'}
        </Button>
      </Stack>
    </Stack>
  );
}

/** A 409 that is not a taken time: the server's reason; a clash with the rider's own appointment links to it. */
function ClashNotice({
  clash,
  onPickAnother,
}: {
  clash: { message: string; own: boolean; theirs?: Appointment };
  onPickAnother: () => void;
}) {
  const theirs = clash.theirs;
  return (
    <Alert severity="warning" role="alert">
      <AlertTitle>{clash.message}</AlertTitle>
      {clash.own && (
        <Typography variant="body2" sx={{ mb: 1 }}>
          {theirs ? (
            <>
              Your {theirs.service.name} at {theirs.shop.name},{' '}
              {formatSlot(theirs.start, theirs.end, theirs.shop.timeZone)}
              {theirs.status === 'held'
                ? ', is held and not paid yet: pay for it to keep it, or cancel it and book this time again.'
                : ': move or cancel it first, or pick another time here.'}{' '}
              <Link component={RouterLink} to={pathTo.appointment(theirs.id)}>
                {theirs.status === 'held' ? 'Pay for that appointment' : 'Open that appointment'}
              </Link>{' '}
              ·{' '}
            </>
          ) : (
            'It is in My appointments; if it is held and not paid yet, pay for it there to keep it. '
          )}
          <Link component={RouterLink} to={paths.appointments}>
            My appointments
          </Link>
        </Typography>
      )}
      <Button color="inherit" variant="outlined" size="small" onClick={onPickAnother}>
        Pick another time
      </Button>
    </Alert>
  );
}
