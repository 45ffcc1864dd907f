import MenuIcon from '@mui/icons-material/Menu';
import Avatar from '@mui/material/Avatar';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import Stack from '@mui/material/Stack';
import useMediaQuery from '@mui/material/useMediaQuery';
import { useTheme } from '@mui/material/styles';
import { Suspense, lazy, useState } from 'react';
import { NavLink, Link as RouterLink } from 'react-router';
import { pathTo } from '@/config/paths';
import { useSession } from '../api/get-me';
import type { SessionUser } from '../types';
import { initials, navItems, useNextHere, type NavItem } from './nav-shared';

// the pop-ups load on first use (nav-panels.tsx says why)
const AccountMenuPopup = lazy(() => import('./nav-panels').then((m) => ({ default: m.AccountMenuPopup })));
const PhoneDrawer = lazy(() => import('./nav-panels').then((m) => ({ default: m.PhoneDrawer })));
const loadPanels = () => void import('./nav-panels');

function AccountMenu({ user }: { user: SessionUser }) {
  const [anchor, setAnchor] = useState<HTMLElement | null>(null);
  // mounted from the first open on, so it can close with its transition and reopen at once
  const [used, setUsed] = useState(false);
  return (
    <>
      <Button
        color="inherit"
        onClick={(e) => {
          setUsed(true);
          setAnchor(e.currentTarget);
        }}
        onPointerEnter={loadPanels}
        onFocus={loadPanels}
        aria-haspopup="menu"
        aria-expanded={anchor ? 'true' : undefined}
        aria-label={`Account: ${user.name}`}
        startIcon={
          <Avatar
            sx={{
              width: 30,
              height: 30,
              fontSize: 12,
              fontWeight: 700,
              bgcolor: 'secondary.main',
              color: 'text.primary',
            }}
          >
            {initials(user.name)}
          </Avatar>
        }
        sx={{ maxWidth: 220 }}
      >
        <Box component="span" sx={{ overflow: 'hidden', textOverflow: 'ellipsis', whiteSpace: 'nowrap' }}>
          {user.name}
        </Box>
      </Button>
      {used && (
        <Suspense fallback={null}>
          <AccountMenuPopup user={user} anchor={anchor} onClose={() => setAnchor(null)} />
        </Suspense>
      )}
    </>
  );
}

function PhoneMenu({ user, items }: { user: SessionUser | null; items: NavItem[] }) {
  const [open, setOpen] = useState(false);
  // Mounted from the first open on and never unmounted by closing: a drawer link closes the drawer
  // and navigates in the same click; the drawer plays its exit transition while the router moves on.
  const [used, setUsed] = useState(false);
  return (
    <>
      <IconButton
        color="inherit"
        edge="end"
        aria-label="Open menu"
        onClick={() => {
          setUsed(true);
          setOpen(true);
        }}
        onPointerEnter={loadPanels}
        onFocus={loadPanels}
      >
        <MenuIcon />
      </IconButton>
      {used && (
        <Suspense fallback={null}>
          <PhoneDrawer user={user} items={items} open={open} onClose={() => setOpen(false)} />
        </Suspense>
      )}
    </>
  );
}

/** The app bar's right side: the sections this user may use, and the account menu or Sign in. */
export function AppNavigation() {
  const { user, isLoading } = useSession();
  const theme = useTheme();
  const wide = useMediaQuery(theme.breakpoints.up('md'), { noSsr: true });
  const next = useNextHere();
  const items = navItems(user);

  if (!wide) return <PhoneMenu user={user} items={items} />;
  return (
    <Stack direction="row" component="nav" aria-label="Main" sx={{ alignItems: 'center', gap: 0.5 }}>
      {items.map((item) => (
        <Button
          key={item.to}
          color="inherit"
          component={NavLink}
          to={item.to}
          sx={{
            opacity: 0.9,
            '&.active': { opacity: 1, boxShadow: (t) => `inset 0 -2px 0 ${t.palette.secondary.main}` },
            borderRadius: 0,
            minHeight: 40,
          }}
        >
          {item.label}
        </Button>
      ))}
      <Box sx={{ width: 12 }} />
      {user ? (
        <AccountMenu user={user} />
      ) : (
        !isLoading && (
          <Button variant="outlined" color="inherit" component={RouterLink} to={pathTo.signIn(next)}>
            Sign in
          </Button>
        )
      )}
    </Stack>
  );
}
