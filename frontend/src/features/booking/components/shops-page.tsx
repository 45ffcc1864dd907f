import ChevronRightIcon from '@mui/icons-material/ChevronRight';
import Card from '@mui/material/Card';
import CardActionArea from '@mui/material/CardActionArea';
import CardContent from '@mui/material/CardContent';
import Container from '@mui/material/Container';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { Link as RouterLink } from 'react-router';
import { LoadError } from '@/components/ui/load-error';
import { pathTo } from '@/config/paths';
import { useShops } from '../api/get-shops';
import { zoneLabel } from '../utils/zoned-time';

/** `/shops`: every shop that takes bookings; a card per shop leads to its page. */
export function ShopsPage() {
  const { data: shops, error, mutate } = useShops();
  return (
    <Container maxWidth="md" sx={{ py: { xs: 3, md: 5 } }}>
      <Typography variant="h1" sx={{ fontSize: { xs: '1.9rem', md: '2.25rem' } }}>
        Shops
      </Typography>
      <Typography color="text.secondary" sx={{ mt: 1, mb: 3 }}>
        Book bench time for a suspension setup or service. Each shop shows its times on its own clock.
      </Typography>
      {error && <LoadError what="The shops" error={error} onRetry={() => void mutate()} />}
      {!shops && !error && (
        <Stack spacing={2}>
          <Skeleton variant="rounded" height={96} />
          <Skeleton variant="rounded" height={96} />
        </Stack>
      )}
      {shops && shops.length === 0 && <Typography>No shops take bookings yet. Check back soon.</Typography>}
      {shops && shops.length > 0 && (
        <Stack component="ul" spacing={2} sx={{ listStyle: 'none', p: 0, m: 0 }}>
          {shops.map((shop) => (
            <li key={shop.id}>
              <Card>
                <CardActionArea component={RouterLink} to={pathTo.shop(shop.slug)}>
                  <CardContent sx={{ display: 'flex', alignItems: 'center', gap: 2 }}>
                    <Stack sx={{ flexGrow: 1, minWidth: 0 }} spacing={0.5}>
                      <Typography variant="h3" component="h2" sx={{ fontSize: '1.2rem' }}>
                        {shop.name}
                      </Typography>
                      <Typography color="text.secondary">{shop.town}</Typography>
                      <Typography variant="body2" color="text.secondary">
                        Times in {zoneLabel(shop.timeZone)} · prices in {shop.currency}
                      </Typography>
                    </Stack>
                    <ChevronRightIcon aria-hidden color="primary" />
                  </CardContent>
                </CardActionArea>
              </Card>
            </li>
          ))}
        </Stack>
      )}
    </Container>
  );
}
