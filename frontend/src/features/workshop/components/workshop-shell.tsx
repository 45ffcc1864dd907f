import Box from '@mui/material/Box';
import Container from '@mui/material/Container';
import Skeleton from '@mui/material/Skeleton';
import Tab from '@mui/material/Tab';
import Tabs from '@mui/material/Tabs';
import Typography from '@mui/material/Typography';
import useMediaQuery from '@mui/material/useMediaQuery';
import { useTheme } from '@mui/material/styles';
import type { ReactNode } from 'react';
import { Link as RouterLink, useLocation } from 'react-router';
import { paths } from '@/config/paths';
import { useSession } from '@/features/auth/api/get-me';
import { useTeam } from '../api/get-team';

const TABS = [
  { label: 'Overview', to: paths.workshop },
  { label: 'Requests', to: paths.workshopRequests },
  { label: 'Schedule', to: paths.workshopSchedule },
  { label: 'Services', to: paths.workshopServices },
  { label: 'Hours & rules', to: paths.workshopSettings },
  { label: 'Team', to: paths.workshopTeam },
] as const;

/** Owners also see the shop's money. */
const OWNER_TABS = [{ label: 'Payments', to: paths.workshopPayments }] as const;

/** The tab a page belongs to: an appointment's page sits under Requests. */
function currentTab(pathname: string, tabs: readonly { to: string }[]): string | false {
  const exact = tabs.find((t) => t.to === pathname);
  if (exact) return exact.to;
  if (pathname.startsWith('/workshop/appointments/')) return paths.workshopRequests;
  return false;
}

/** The frame of Workshop pages: the shop's name, its sections as tabs, dense content below. */
export function WorkshopShell({
  children,
  maxWidth = 'lg',
}: {
  children: ReactNode;
  /** `xl` for the wide pages (schedule, requests) */
  maxWidth?: 'lg' | 'xl';
}) {
  const { pathname } = useLocation();
  const { data } = useTeam();
  const { user } = useSession();
  const tabs = user?.role === 'owner' ? [...TABS, ...OWNER_TABS] : TABS;
  const current = currentTab(pathname, tabs);
  // Nothing moves when the shop and the account arrive (layout shift, issue 12): on a phone the scroll
  // arrows are there from the start (disabled at the ends) instead of appearing once the owner's tabs
  // overflow, and the shop's name stays on one line (the whole name in its title).
  const theme = useTheme();
  const phone = useMediaQuery(theme.breakpoints.down('md'), { noSsr: true });
  return (
    <>
      <Box sx={{ bgcolor: 'background.paper', borderBottom: 1, borderColor: 'divider' }}>
        <Container maxWidth={maxWidth} sx={{ pt: 2 }}>
          <Typography variant="overline" color="secondary.dark">
            Workshop
          </Typography>
          <Typography
            variant="h2"
            component="h1"
            noWrap={phone}
            title={phone ? data?.shop.name : undefined}
            sx={{ fontSize: { xs: '1.5rem', md: '1.75rem' } }}
          >
            {data ? data.shop.name : <Skeleton width={260} />}
          </Typography>
          <Tabs
            value={current}
            aria-label="Workshop sections"
            variant="scrollable"
            scrollButtons={phone ? true : 'auto'}
            allowScrollButtonsMobile
            sx={{ mt: 1 }}
          >
            {tabs.map((t) => (
              <Tab
                key={t.to}
                label={t.label}
                value={t.to}
                component={RouterLink}
                to={t.to}
                sx={{ textTransform: 'none', fontSize: '0.95rem', minWidth: 96 }}
              />
            ))}
          </Tabs>
        </Container>
      </Box>
      <Container maxWidth={maxWidth} sx={{ py: 3 }}>
        {children}
      </Container>
    </>
  );
}
