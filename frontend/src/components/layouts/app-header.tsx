import AppBar from '@mui/material/AppBar';
import Box from '@mui/material/Box';
import Link from '@mui/material/Link';
import Toolbar from '@mui/material/Toolbar';
import type { ReactNode } from 'react';
import { Link as RouterLink } from 'react-router';
import { paths } from '@/config/paths';
import { Wordmark } from '@/components/ui/wordmark';

/** The app bar: the wordmark home, then whatever goes on the right (the navigation), and `below`. */
export function AppHeader({ children, below }: { children?: ReactNode; below?: ReactNode }) {
  return (
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
        {children}
      </Toolbar>
      {below}
    </AppBar>
  );
}
