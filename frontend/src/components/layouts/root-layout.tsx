import Box from '@mui/material/Box';
import Container from '@mui/material/Container';
import Typography from '@mui/material/Typography';
import { Suspense, lazy } from 'react';
import { Outlet, ScrollRestoration, useNavigation } from 'react-router';
import { AppNavigation } from '@/features/auth/components/app-navigation';
import { SignedOutNotice } from '@/features/auth/components/signed-out-notice';
import { AppHeader } from './app-header';
import { UnreachableNotice } from '@/components/ui/unreachable-notice';

// the navigation bar under the app bar is only drawn while a page loads: fetched on first use
const LinearProgress = lazy(() => import('@mui/material/LinearProgress'));

export function RootLayout() {
  const loading = useNavigation().state === 'loading';
  return (
    <Box sx={{ minHeight: '100dvh', display: 'flex', flexDirection: 'column' }}>
      <AppHeader
        below={
          // a lazy route module on its way: the page stays, a thin bar under the app bar says so
          loading && (
            <Suspense fallback={null}>
              <LinearProgress
                color="secondary"
                aria-label="Loading the page"
                sx={{ position: 'absolute', left: 0, right: 0, bottom: 0, height: 3 }}
              />
            </Suspense>
          )
        }
      >
        <AppNavigation />
      </AppHeader>
      <Box component="main" sx={{ flexGrow: 1 }}>
        <Outlet />
      </Box>
      <Box component="footer" className="no-print" sx={{ py: 3, borderTop: 1, borderColor: 'divider' }}>
        <Container maxWidth="lg">
          <Typography variant="body2" color="text.secondary">
            Loamline gives starting points, not final settings. Your fork or shock maker&apos;s manual and a
            qualified technician come first.
          </Typography>
        </Container>
      </Box>
      <SignedOutNotice />
      <UnreachableNotice />
      <ScrollRestoration />
    </Box>
  );
}
