import AppBar from '@mui/material/AppBar';
import Box from '@mui/material/Box';
import Container from '@mui/material/Container';
import Link from '@mui/material/Link';
import Toolbar from '@mui/material/Toolbar';
import Typography from '@mui/material/Typography';
import { Link as RouterLink, Outlet, ScrollRestoration } from 'react-router';
import { paths } from '@/config/paths';
import { Wordmark } from '@/components/ui/wordmark';
import { AppNavigation } from '@/features/auth/components/app-navigation';
import { SignedOutNotice } from '@/features/auth/components/signed-out-notice';
import { UnreachableNotice } from '@/components/ui/unreachable-notice';

export function RootLayout() {
  return (
    <Box sx={{ minHeight: '100dvh', display: 'flex', flexDirection: 'column' }}>
      <AppBar position="sticky" className="no-print">
        <Toolbar sx={{ gap: 2 }}>
          <Link
            component={RouterLink}
            to={paths.home}
            color="inherit"
            underline="none"
            aria-label="Loamline home"
          >
            <Wordmark />
          </Link>
          <Box sx={{ flexGrow: 1 }} />
          <AppNavigation />
        </Toolbar>
      </AppBar>
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
