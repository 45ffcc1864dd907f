import ChevronRightIcon from '@mui/icons-material/ChevronRight';
import DescriptionOutlinedIcon from '@mui/icons-material/DescriptionOutlined';
import Alert from '@mui/material/Alert';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardActionArea from '@mui/material/CardActionArea';
import CardContent from '@mui/material/CardContent';
import Container from '@mui/material/Container';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { Appointment } from '@loamline/shared-types';
import { Link as RouterLink } from 'react-router';
import { LoadError } from '@/components/ui/load-error';
import { paths, pathTo } from '@/config/paths';
import { useSession } from '@/features/auth/api/get-me';
import { isStaff } from '@/features/auth/types';
import { useAppointments } from '../api/get-appointments';
import { splitAppointments } from '../utils/words';
import { formatSlot } from '../utils/zoned-time';
import { StateChip } from './state-chip';

function AppointmentRow({ a }: { a: Appointment }) {
  const report = a.status === 'completed';
  return (
    <li>
      <Card>
        <CardActionArea
          component={RouterLink}
          to={report ? pathTo.appointmentReport(a.id) : pathTo.appointment(a.id)}
        >
          <CardContent sx={{ display: 'flex', gap: 2, alignItems: 'center' }}>
            <Stack spacing={0.5} sx={{ flexGrow: 1, minWidth: 0 }}>
              <Stack
                direction="row"
                useFlexGap
                spacing={1}
                sx={{ alignItems: 'center', flexWrap: 'wrap', rowGap: 0.5 }}
              >
                <Typography variant="h3" component="h3" sx={{ fontSize: '1.1rem' }}>
                  {a.service.name}
                </Typography>
                <StateChip state={a.status} />
              </Stack>
              <Typography>{formatSlot(a.start, a.end, a.shop.timeZone)}</Typography>
              <Typography variant="body2" color="text.secondary">
                {a.shop.name}, {a.shop.town}
                {a.proposedStart && ' · The shop proposes another time'}
              </Typography>
            </Stack>
            {report && (
              <Stack direction="row" spacing={0.5} sx={{ alignItems: 'center', color: 'primary.main' }}>
                <DescriptionOutlinedIcon aria-hidden fontSize="small" />
                <Typography sx={{ fontWeight: 500 }}>Report</Typography>
              </Stack>
            )}
            <ChevronRightIcon aria-hidden color="primary" />
          </CardContent>
        </CardActionArea>
      </Card>
    </li>
  );
}

function Section({ title, list, empty }: { title: string; list: Appointment[]; empty: string }) {
  const id = `appointments-${title.toLowerCase()}`;
  return (
    <Stack component="section" aria-labelledby={id} spacing={1.5}>
      <Typography id={id} variant="h2" sx={{ fontSize: '1.4rem' }}>
        {title}
      </Typography>
      {list.length === 0 ? (
        <Typography color="text.secondary">{empty}</Typography>
      ) : (
        <Stack component="ul" spacing={1.5} sx={{ listStyle: 'none', p: 0, m: 0 }}>
          {list.map((a) => (
            <AppointmentRow key={a.id} a={a} />
          ))}
        </Stack>
      )}
    </Stack>
  );
}

/** `/appointments`: the rider's bookings, upcoming (soonest first) and past. */
export function AppointmentsPage() {
  const { user } = useSession();
  const staff = isStaff(user);
  return (
    <Container maxWidth="md" sx={{ py: { xs: 3, md: 5 } }}>
      <Stack
        direction="row"
        sx={{ justifyContent: 'space-between', alignItems: 'flex-end', mb: 3, gap: 2, flexWrap: 'wrap' }}
      >
        <Typography variant="h1" sx={{ fontSize: { xs: '1.9rem', md: '2.25rem' } }}>
          My appointments
        </Typography>
        {!staff && (
          <Button variant="contained" component={RouterLink} to={paths.shops}>
            Book bench time
          </Button>
        )}
      </Stack>
      {staff ? (
        <Alert severity="info">
          My appointments is for riders. Shop staff see their shop’s bookings in Workshop.
        </Alert>
      ) : (
        <AppointmentLists />
      )}
    </Container>
  );
}

function AppointmentLists() {
  const { data, error, mutate } = useAppointments();
  if (error) return <LoadError what="Your appointments" error={error} onRetry={() => void mutate()} />;
  if (!data)
    return (
      <Stack spacing={2}>
        <Skeleton variant="rounded" height={110} />
        <Skeleton variant="rounded" height={110} />
      </Stack>
    );
  const { upcoming, past } = splitAppointments(data);
  return (
    <Stack spacing={4}>
      <Section title="Upcoming" list={upcoming} empty="Nothing booked. Pick a shop to book bench time." />
      <Section title="Past" list={past} empty="No past appointments yet." />
    </Stack>
  );
}
