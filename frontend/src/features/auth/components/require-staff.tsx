import Button from '@mui/material/Button';
import Container from '@mui/material/Container';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { Link as RouterLink, Outlet } from 'react-router';
import { paths } from '@/config/paths';
import { useSession } from '../api/get-me';
import { isStaff } from '../types';

/** What a rider sees who types a Workshop address (the server refuses its data too). */
export function StaffOnly() {
  return (
    <Container maxWidth="sm" sx={{ py: { xs: 5, sm: 8 } }}>
      <Typography variant="overline" color="secondary.dark">
        Workshop
      </Typography>
      <Typography variant="h2" component="h1" gutterBottom>
        Workshop is for shop staff
      </Typography>
      <Typography color="text.secondary" sx={{ mb: 3 }}>
        This part of Loamline is where technicians and shop owners handle appointments and run their shop.
        Your account is a rider account. If you work at a shop, ask its owner to invite you by e-mail.
      </Typography>
      <Stack direction={{ xs: 'column', sm: 'row' }} spacing={2}>
        <Button variant="contained" component={RouterLink} to={paths.garage}>
          Go to my garage
        </Button>
        <Button component={RouterLink} to={paths.baseline}>
          Get a baseline
        </Button>
      </Stack>
    </Container>
  );
}

/** Layout route inside `RequireAuth`: technicians and owners pass, riders get `StaffOnly`. */
export function RequireStaff() {
  const { user } = useSession();
  return isStaff(user) ? <Outlet /> : <StaffOnly />;
}
