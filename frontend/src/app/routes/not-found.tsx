import Button from '@mui/material/Button';
import Container from '@mui/material/Container';
import Typography from '@mui/material/Typography';
import { Link as RouterLink } from 'react-router';
import { paths } from '@/config/paths';

export function Component() {
  return (
    <Container maxWidth="sm" sx={{ py: 8 }}>
      <Typography variant="overline" color="secondary.dark">
        404
      </Typography>
      <Typography variant="h2" gutterBottom>
        Off the trail
      </Typography>
      <Typography color="text.secondary" sx={{ mb: 3 }}>
        There is no page at this address. It may have moved, or the link has a typo.
      </Typography>
      <Button variant="contained" component={RouterLink} to={paths.home}>
        Back to the start
      </Button>
    </Container>
  );
}
