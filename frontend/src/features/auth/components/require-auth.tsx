import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import CircularProgress from '@mui/material/CircularProgress';
import Container from '@mui/material/Container';
import { Navigate, Outlet, useLocation } from 'react-router';
import { pathTo } from '@/config/paths';
import { useSession } from '../api/get-me';

function Waiting() {
  return (
    <Box sx={{ display: 'flex', justifyContent: 'center', py: 8 }}>
      <CircularProgress aria-label="Checking your sign-in" />
    </Box>
  );
}

/**
 * Layout route for pages that need an account: a signed-out user goes to sign-in with `?next=`
 * (the page they asked for) and comes back after.
 */
export function RequireAuth() {
  const { user, isLoading, error, mutate } = useSession();
  const location = useLocation();
  if (isLoading) return <Waiting />;
  if (error && !user) {
    return (
      <Container maxWidth="sm" sx={{ py: 6 }}>
        <Alert
          severity="error"
          action={
            <Button color="inherit" onClick={() => void mutate()}>
              Try again
            </Button>
          }
        >
          Loamline could not check your sign-in: {error.message}
        </Alert>
      </Container>
    );
  }
  if (!user) {
    return <Navigate to={pathTo.signIn(location.pathname + location.search + location.hash)} replace />;
  }
  return <Outlet />;
}
