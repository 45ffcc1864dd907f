import Button from '@mui/material/Button';
import Container from '@mui/material/Container';
import Typography from '@mui/material/Typography';
import { Link as RouterLink, isRouteErrorResponse, useRouteError } from 'react-router';
import { paths } from '@/config/paths';

export function RouteError() {
  const error = useRouteError();
  const message = isRouteErrorResponse(error)
    ? `${error.status} ${error.statusText}`
    : error instanceof Error
      ? error.message
      : 'Something went wrong.';
  return (
    <Container maxWidth="sm" sx={{ py: 8 }}>
      <Typography variant="h2" gutterBottom>
        This page hit a rock
      </Typography>
      <Typography color="text.secondary" sx={{ mb: 3 }}>
        {message}
      </Typography>
      <Button variant="contained" component={RouterLink} to={paths.home}>
        Back to the start
      </Button>
    </Container>
  );
}
