import TuneIcon from '@mui/icons-material/Tune';
import EventAvailableIcon from '@mui/icons-material/EventAvailable';
import BuildIcon from '@mui/icons-material/Build';
import HistoryIcon from '@mui/icons-material/History';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Container from '@mui/material/Container';
import Grid from '@mui/material/Grid';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { Link as RouterLink } from 'react-router';
import { paths } from '@/config/paths';
import { ochre, pine } from '@/theme/primitives';

function Point({ icon, title, children }: { icon: ReactNode; title: string; children: ReactNode }) {
  return (
    <Stack direction="row" spacing={2} sx={{ alignItems: 'flex-start' }}>
      <Box sx={{ color: 'primary.main', mt: 0.25 }}>{icon}</Box>
      <Box>
        <Typography variant="subtitle1" component="h3" sx={{ fontWeight: 500 }}>
          {title}
        </Typography>
        <Typography variant="body2" color="text.secondary">
          {children}
        </Typography>
      </Box>
    </Stack>
  );
}

export function HomePage() {
  return (
    <>
      <Box className="on-pine" sx={{ bgcolor: pine[500], color: '#fff', py: { xs: 5, md: 9 } }}>
        <Container maxWidth="lg">
          <Typography variant="overline" sx={{ color: ochre[100], letterSpacing: 2 }}>
            Suspension setup, start to finish
          </Typography>
          <Typography variant="h1" sx={{ maxWidth: 720, mt: 1 }}>
            A starting sag and air pressure for your fork and shock — explained.
          </Typography>
          <Typography sx={{ mt: 2, maxWidth: 640, opacity: 0.9, fontSize: '1.1rem' }}>
            Tell Loamline your weight, how you ride and your travel. It works out the sag to aim for, the
            pressure to pump, how volume spacers or an end-stroke chamber change the spring, and how to check
            it. Then book a suspension shop for a professional setup.
          </Typography>
          <Stack direction={{ xs: 'column', sm: 'row' }} spacing={2} sx={{ mt: 4 }}>
            <Button
              component={RouterLink}
              to={paths.baseline}
              size="large"
              variant="contained"
              color="secondary"
            >
              Get my baseline
            </Button>
          </Stack>
        </Container>
      </Box>
      <Container maxWidth="lg" sx={{ py: { xs: 4, md: 7 } }}>
        <Grid container spacing={3}>
          <Grid size={{ xs: 12, md: 6 }}>
            <Card sx={{ height: '100%' }}>
              <CardContent>
                <Typography variant="h3" component="h2" gutterBottom>
                  For riders
                </Typography>
                <Stack spacing={2.5} sx={{ mt: 2 }}>
                  <Point icon={<TuneIcon />} title="A baseline you can trust">
                    Target sag in % and mm, a starting pressure with its range or a coil rate, and the spring
                    curve it gives — no account needed.
                  </Point>
                  <Point icon={<EventAvailableIcon />} title="Book a professional setup">
                    Pick a shop, a service and a free time, attach your bike and baseline sheet, pay the
                    deposit.
                  </Point>
                  <Point icon={<HistoryIcon />} title="Keep what was set">
                    Your appointments, the shop&apos;s service report and the final settings, ready for next
                    time.
                  </Point>
                </Stack>
              </CardContent>
            </Card>
          </Grid>
          <Grid size={{ xs: 12, md: 6 }}>
            <Card sx={{ height: '100%' }}>
              <CardContent>
                <Typography variant="h3" component="h2" gutterBottom>
                  For suspension shops
                </Typography>
                <Stack spacing={2.5} sx={{ mt: 2 }}>
                  <Point icon={<EventAvailableIcon />} title="Requests and schedule">
                    Confirm or decline bookings, propose another time, and see the day and week per bench.
                  </Point>
                  <Point icon={<BuildIcon />} title="Service reports">
                    Record work done, final pressures, spacers, clicks and measured sag; upload photos and a
                    bench curve to plot against the model.
                  </Point>
                  <Point icon={<TuneIcon />} title="Run the shop">
                    Services, prices and deposits, hours and closures, benches, booking rules, team and
                    payments.
                  </Point>
                </Stack>
              </CardContent>
            </Card>
          </Grid>
        </Grid>
      </Container>
    </>
  );
}
