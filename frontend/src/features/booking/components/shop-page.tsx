import ArrowBackIcon from '@mui/icons-material/ArrowBack';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Container from '@mui/material/Container';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { Link as RouterLink, useParams } from 'react-router';
import { LoadError } from '@/components/ui/load-error';
import { paths } from '@/config/paths';
import { ApiRequestError } from '@/lib/api-client';
import { useShop } from '../api/get-shop';
import { useBookingChoice } from '../hooks/use-booking-choice';
import { bookingWindowInWords, shopCancellationPolicy } from '../utils/words';
import { BookingFlow } from './booking-flow';
import { ServiceCard } from './service-card';
import { ShopHeader } from './shop-header';

/** `/shops/:slug`: the shop, its services and rules; with `?service=` the booking flow. */
export function ShopPage() {
  const { slug } = useParams<{ slug: string }>();
  const { data: shop, error, mutate } = useShop(slug);
  const { choice, update } = useBookingChoice();
  const [chosenHere, setChosenHere] = useState(false);

  if (error) {
    return (
      <Container maxWidth="md" sx={{ py: { xs: 3, md: 5 } }}>
        {error instanceof ApiRequestError && error.status === 404 ? (
          <Stack spacing={2}>
            <Typography variant="h1" sx={{ fontSize: '1.9rem' }}>
              No such shop
            </Typography>
            <Typography>This address does not lead to a shop. It may have moved.</Typography>
            <Button
              component={RouterLink}
              to={paths.shops}
              variant="contained"
              sx={{ alignSelf: 'flex-start' }}
            >
              See all shops
            </Button>
          </Stack>
        ) : (
          <LoadError what="The shop" error={error} onRetry={() => void mutate()} />
        )}
      </Container>
    );
  }
  if (!shop) {
    // at least a screen tall: the shop, its services and the booking flow are, so the footer below
    // stays out of view instead of jumping down when they arrive (CLS)
    return (
      <Container maxWidth="md" sx={{ py: { xs: 3, md: 5 }, minHeight: '100dvh' }}>
        <Skeleton variant="text" height={56} width="60%" />
        <Skeleton variant="rounded" height={220} sx={{ mt: 2 }} />
      </Container>
    );
  }

  const service = choice.serviceId ? shop.services.find((s) => s.id === choice.serviceId) : undefined;
  return (
    <Container maxWidth="md" sx={{ py: { xs: 3, md: 5 } }}>
      <title>{`${shop.name} · Loamline`}</title>
      <Stack spacing={3}>
        {!service && (
          <Button
            component={RouterLink}
            to={paths.shops}
            startIcon={<ArrowBackIcon />}
            sx={{ alignSelf: 'flex-start' }}
          >
            All shops
          </Button>
        )}
        <ShopHeader shop={shop} />
        {choice.serviceId && !service && (
          <Alert severity="warning">That service is no longer offered here. Pick one below.</Alert>
        )}
        {service ? (
          <BookingFlow shop={shop} service={service} focusOnEntry={chosenHere} />
        ) : (
          <>
            <Alert severity="info" icon={false} component="section" aria-label="Cancellation policy">
              <Typography sx={{ fontWeight: 500 }}>Cancelling</Typography>
              {shopCancellationPolicy(shop.cancellationWindowHours)}{' '}
              {bookingWindowInWords(shop.minNoticeMinutes, shop.maxDaysAhead)}
            </Alert>
            <Stack component="section" aria-labelledby="services-heading" spacing={2}>
              <Typography id="services-heading" variant="h2" sx={{ fontSize: '1.5rem' }}>
                Services
              </Typography>
              {shop.services.length === 0 && <Typography>This shop has no services to book yet.</Typography>}
              {shop.services.map((s) => (
                <ServiceCard
                  key={s.id}
                  service={s}
                  currency={shop.currency}
                  onBook={() => {
                    setChosenHere(true);
                    update({ serviceId: s.id, day: null, start: null, step: 'time' });
                  }}
                />
              ))}
            </Stack>
          </>
        )}
      </Stack>
    </Container>
  );
}
