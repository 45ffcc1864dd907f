import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardActions from '@mui/material/CardActions';
import CardContent from '@mui/material/CardContent';
import Chip from '@mui/material/Chip';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { ShopService } from '@loamline/shared-types';
import { durationInWords, paymentInWords, paymentKind, priceInWords } from '../utils/words';

const KIND_LABEL = {
  free: 'Free',
  'at-shop': 'Pay at the shop',
  deposit: 'Deposit',
  full: 'Paid in advance',
};

/** A service with its duration, price and how paying works, and Book. */
export function ServiceCard({
  service,
  currency,
  onBook,
}: {
  service: ShopService;
  currency: string;
  onBook: () => void;
}) {
  return (
    <Card component="article" aria-label={service.name}>
      <CardContent>
        <Stack direction="row" spacing={2} sx={{ justifyContent: 'space-between', alignItems: 'baseline' }}>
          <Typography variant="h3" component="h3" sx={{ fontSize: '1.15rem' }}>
            {service.name}
          </Typography>
          <Typography sx={{ fontWeight: 700, whiteSpace: 'nowrap' }}>
            {priceInWords(service, currency)}
          </Typography>
        </Stack>
        {service.description && (
          <Typography color="text.secondary" sx={{ mt: 1 }}>
            {service.description}
          </Typography>
        )}
        <Stack direction="row" useFlexGap spacing={1} sx={{ mt: 1.5, flexWrap: 'wrap', rowGap: 1 }}>
          <Chip size="small" label={durationInWords(service.durationMinutes)} />
          <Chip size="small" variant="outlined" label={KIND_LABEL[paymentKind(service)]} />
        </Stack>
        <Typography variant="body2" sx={{ mt: 1.5 }}>
          {paymentInWords(service, currency)}
        </Typography>
      </CardContent>
      <CardActions sx={{ px: 2, pb: 2 }}>
        <Box sx={{ flexGrow: 1, display: { xs: 'none', sm: 'block' } }} />
        <Button
          variant="contained"
          onClick={onBook}
          aria-label={`Book ${service.name}`}
          sx={{ width: { xs: '100%', sm: 'auto' }, minHeight: 44 }}
        >
          Book
        </Button>
      </CardActions>
    </Card>
  );
}
