import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { Appointment, PaymentSession } from '@loamline/shared-types';
import { CardElement, Elements, useElements, useStripe } from '@stripe/react-stripe-js';
import { useEffect, useRef, useState, type FormEvent } from 'react';
import { formatTime, zoneLabel } from '@/features/booking/utils/zoned-time';
import { ink, inkPlaceholder, status as statusColours } from '@/theme/primitives';
import { syncPayment } from '../api/sync-payment';
import { countdownWords, useNow } from '../hooks/use-now';
import { usePaymentsLibrary } from '../hooks/use-payments-library';
import { cardErrorMessage } from '../utils/card-errors';
import { formatMoney } from '../utils/money';
import { HoldReleased } from './hold-released';

/** How the payment step ended: paid (the appointment as synced, when the sync answered) or still processing. */
export type PaymentOutcome = { paid: true; synced: Appointment | null } | { paid: false; processing: true };

export interface PaymentStepProps {
  appointment: Appointment;
  session: PaymentSession;
  onDone: (outcome: PaymentOutcome) => void;
  /** the hold ended unpaid (the page refreshes the appointment) */
  onExpired?: () => void;
  /** right after booking: the step's heading takes the focus */
  focusOnMount?: boolean;
  /** a payment is on its way (the page keeps the step on screen even if the hold ends meanwhile) */
  onWorking?: (working: boolean) => void;
  /**
   * The page's clock (ms), when the page also shows what the hold's end changes (its state, its
   * actions): one clock, so that the step and the page see the hold end at the same moment. Without
   * it the step keeps its own.
   */
  now?: number;
}

export const TEST_CARDS: [number: string, what: string][] = [
  ['4242 4242 4242 4242', 'pays'],
  ['4000 0000 0000 0002', 'is declined'],
  ['4000 0000 0000 9995', 'has insufficient funds'],
  ['4000 0027 6000 3184', 'asks the bank to confirm it is you'],
];

const NETWORK_TROUBLE =
  "Loamline couldn't reach the payment service. Check your connection and try again; if your card was charged, this page shows it in a moment.";

/**
 * The payment step of a held appointment: the amount and what it is, the hold's end in the shop's
 * zone with a countdown, the card form and Pay. Lazy-loaded (`lazy-payment-step.tsx`), so the
 * payment library is only fetched once this is on the screen.
 */
export default function PaymentStep({
  appointment: a,
  session,
  onDone,
  onExpired,
  focusOnMount,
  onWorking,
  now: pageNow,
}: PaymentStepProps) {
  const zone = a.shop.timeZone;
  const until = Date.parse(session.holdExpiresAt);
  const [working, setWorking] = useState(false);
  const ownNow = useNow(1000, !working && pageNow === undefined);
  const now = pageNow ?? ownNow;
  const expired = now >= until && !working;
  const library = usePaymentsLibrary(session.publishableKey, session.scriptUrl);
  const heading = useRef<HTMLHeadingElement>(null);
  const money = (minor: number) => formatMoney(minor, session.currency);
  const deposit = session.kind === 'deposit';
  // the rest at the shop: only when the service's price is in the same currency (it is the shop's)
  const rest =
    deposit && session.currency === a.shop.currency
      ? Math.max(0, a.service.priceMinor - session.amountMinor)
      : null;
  const holdEnd = `${formatTime(session.holdExpiresAt, zone)} ${zoneLabel(zone, session.holdExpiresAt)}`;

  useEffect(() => {
    if (focusOnMount) heading.current?.focus();
  }, [focusOnMount]);
  useEffect(() => {
    if (expired) onExpired?.();
  }, [expired, onExpired]);
  useEffect(() => {
    onWorking?.(working);
  }, [working, onWorking]);

  // the hold has passed: nothing here is payable any more, so no amount to pay and no Pay
  if (expired) return <HoldReleased a={{ ...a, holdExpiresAt: session.holdExpiresAt }} live />;

  return (
    <Card
      component="section"
      aria-labelledby="pay-title"
      sx={{ borderColor: 'primary.main', borderWidth: 2 }}
    >
      <CardContent>
        <Stack spacing={2}>
          <div>
            <Typography
              id="pay-title"
              ref={heading}
              tabIndex={-1}
              variant="h2"
              sx={{ fontSize: '1.4rem', outline: 'none' }}
            >
              {deposit ? 'Pay the deposit to keep this time' : 'Pay for the service'}
            </Typography>
            <Typography
              sx={{ fontSize: '1.9rem', fontWeight: 700, mt: 0.5, fontVariantNumeric: 'tabular-nums' }}
            >
              {money(session.amountMinor)}
            </Typography>
            <Typography color="text.secondary">
              {deposit
                ? `The deposit for ${a.service.name}${rest !== null && rest > 0 ? `; the rest, ${money(rest)}, at the shop` : ''}.`
                : `The full price of ${a.service.name}; nothing more to pay at the shop.`}
            </Typography>
          </div>

          <Typography>
            Held for you until <strong>{holdEnd}</strong>{' '}
            <Box component="span" sx={{ color: 'text.secondary', whiteSpace: 'nowrap' }}>
              · {countdownWords(until, now)} left
            </Box>
          </Typography>
          {library.status === 'failed' ? (
            <Alert
              severity="error"
              action={
                <Button color="inherit" onClick={library.retry}>
                  Try again
                </Button>
              }
            >
              The card form couldn&apos;t load. Nothing was charged. Check your connection and try again.
            </Alert>
          ) : library.status === 'loading' ? (
            <Stack spacing={1} aria-busy="true" aria-label="Loading the card form">
              <Skeleton variant="rounded" height={48} />
              <Skeleton variant="rounded" height={42} />
            </Stack>
          ) : (
            <Elements stripe={library.promise}>
              <CardForm a={a} session={session} working={working} setWorking={setWorking} onDone={onDone} />
            </Elements>
          )}
          {session.publishableKey.startsWith('pk_test_') && <TestCards />}
        </Stack>
      </CardContent>
    </Card>
  );
}

function CardForm({
  a,
  session,
  working,
  setWorking,
  onDone,
}: {
  a: Appointment;
  session: PaymentSession;
  working: boolean;
  setWorking: (w: boolean) => void;
  onDone: (outcome: PaymentOutcome) => void;
}) {
  const stripe = useStripe();
  const elements = useElements();
  const [error, setError] = useState<string | null>(null);
  const errorBox = useRef<HTMLDivElement>(null);
  const inFlight = useRef(false);

  useEffect(() => {
    if (error) errorBox.current?.focus();
  }, [error]);

  const paid = async () => {
    let synced: Appointment | null = null;
    try {
      synced = await syncPayment(a.id);
    } catch {
      // the payment service's webhook records it too; the page keeps asking for a few seconds
    }
    onDone({ paid: true, synced });
  };

  const pay = async (e: FormEvent) => {
    e.preventDefault();
    const card = elements?.getElement(CardElement);
    if (!stripe || !card || inFlight.current) return;
    inFlight.current = true;
    setWorking(true);
    setError(null);
    try {
      const { error: failed, paymentIntent } = await stripe.confirmCardPayment(session.clientSecret, {
        payment_method: { card },
      });
      if (failed) {
        // paid already (another tab, or a retry after a lost answer): nothing more to take
        if (
          failed.code === 'payment_intent_unexpected_state' &&
          failed.payment_intent?.status === 'succeeded'
        )
          await paid();
        else setError(cardErrorMessage(failed));
      } else if (paymentIntent.status === 'succeeded') {
        await paid();
      } else if (paymentIntent.status === 'processing') {
        try {
          await syncPayment(a.id);
        } catch {
          // as above: the webhook and the page's refresh catch up
        }
        onDone({ paid: false, processing: true });
      } else {
        setError("The payment wasn't completed, so nothing was charged. Try again.");
      }
    } catch {
      setError(NETWORK_TROUBLE);
    } finally {
      inFlight.current = false;
      setWorking(false);
    }
  };

  return (
    <Box component="form" onSubmit={(e) => void pay(e)} noValidate>
      <Stack spacing={1.5}>
        <Typography id="card-label" component="p" variant="body2" sx={{ fontWeight: 500 }}>
          Card
        </Typography>
        <Box
          role="group"
          aria-labelledby="card-label"
          sx={{
            border: 1,
            borderColor: 'divider',
            borderRadius: 1,
            bgcolor: 'background.paper',
            px: 1.5,
            py: 1.5,
            '&:focus-within': { outline: 2, outlineColor: 'primary.dark', outlineStyle: 'solid' },
          }}
        >
          <CardElement
            options={{
              disabled: working,
              style: {
                base: { fontSize: '16px', color: ink, '::placeholder': { color: inkPlaceholder } },
                invalid: { color: statusColours.error },
              },
            }}
          />
        </Box>
        {error && (
          <Alert severity="error" role="alert" ref={errorBox} tabIndex={-1}>
            {error}
          </Alert>
        )}
        <Button type="submit" variant="contained" size="large" disabled={working || !stripe || !elements}>
          {working ? 'Paying…' : `Pay ${formatMoney(session.amountMinor, session.currency)}`}
        </Button>
        <Typography variant="body2" color="text.secondary">
          The card is charged now. {a.shop.name} then confirms your time or suggests another.
        </Typography>
      </Stack>
    </Box>
  );
}

function TestCards() {
  return (
    <Box
      component="aside"
      aria-labelledby="test-cards-title"
      sx={{
        border: 1,
        borderColor: 'divider',
        borderRadius: 1,
        bgcolor: 'background.default',
        px: 2,
        py: 1.5,
      }}
    >
      <Typography id="test-cards-title" component="h3" sx={{ fontSize: '0.95rem', fontWeight: 600 }}>
        Test cards
      </Typography>
      <Typography variant="body2" sx={{ mb: 0.5 }}>
        This is a test setup: no real money moves.
      </Typography>
      <Box component="ul" sx={{ m: 0, pl: 2.5 }}>
        {TEST_CARDS.map(([number, what]) => (
          <Typography key={number} component="li" variant="body2">
            <Box component="span" sx={{ fontFamily: 'monospace', whiteSpace: 'nowrap' }}>
              {number}
            </Box>{' '}
            {what}
          </Typography>
        ))}
      </Box>
    </Box>
  );
}
