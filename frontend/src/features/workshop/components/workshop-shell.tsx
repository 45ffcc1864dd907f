import Box from '@mui/material/Box';
import Container from '@mui/material/Container';
import Skeleton from '@mui/material/Skeleton';
import Tab from '@mui/material/Tab';
import Tabs from '@mui/material/Tabs';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { Link as RouterLink, useLocation } from 'react-router';
import { paths } from '@/config/paths';
import { useTeam } from '../api/get-team';

const TABS = [
  { label: 'Overview', to: paths.workshop },
  { label: 'Team', to: paths.workshopTeam },
] as const;

/** The frame of Workshop pages: the shop's name, its sections as tabs, dense content below. */
export function WorkshopShell({ children }: { children: ReactNode }) {
  const { pathname } = useLocation();
  const { data } = useTeam();
  const current = TABS.find((t) => t.to === pathname)?.to ?? false;
  return (
    <>
      <Box sx={{ bgcolor: 'background.paper', borderBottom: 1, borderColor: 'divider' }}>
        <Container maxWidth="lg" sx={{ pt: 2 }}>
          <Typography variant="overline" color="secondary.dark">
            Workshop
          </Typography>
          <Typography variant="h2" component="h1" sx={{ fontSize: { xs: '1.5rem', md: '1.75rem' } }}>
            {data ? data.shop.name : <Skeleton width={260} />}
          </Typography>
          <Tabs value={current} aria-label="Workshop sections" sx={{ mt: 1 }}>
            {TABS.map((t) => (
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
      <Container maxWidth="lg" sx={{ py: 3 }}>
        {children}
      </Container>
    </>
  );
}
