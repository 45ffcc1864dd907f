import MenuIcon from '@mui/icons-material/Menu';
import Avatar from '@mui/material/Avatar';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import Stack from '@mui/material/Stack';
import useMediaQuery from '@mui/material/useMediaQuery';
import { useTheme } from '@mui/material/styles';
import { lazy, Suspense, useState } from 'react';
import { NavLink, Link as RouterLink, useLocation, useNavigate } from 'react-router';
import { paths, pathTo } from '@/config/paths';
import { useSession } from '../api/get-me';
import { signOut } from '../api/sign-out';
import { isStaff, type SessionUser } from '../types';
import { initials, type NavItem } from './nav-items';

const AccountPopup = lazy(() => import('./app-navigation-panels').then((m) => ({ default: m.AccountPopup })));
const PhoneDrawer = lazy(() => import('./app-navigation-panels').then((m) => ({ default: m.PhoneDrawer })));

function navItems(user: SessionUser | null): NavItem[] {
  const items: NavItem[] = [{ label: 'Baseline', to: paths.baseline }];
  if (user) {
    items.push({ label: 'My garage', to: paths.garage }, { label: 'Baseline sheets', to: paths.sheets });
  }
  // booking, rider side (issue 9): shops for everyone, appointments for riders
  items.push({ label: 'Shops', to: paths.shops });
  if (user && !isStaff(user)) items.push({ label: 'My appointments', to: paths.appointments });
  if (isStaff(user)) items.push({ label: 'Workshop', to: paths.workshop });
  return items;
}

function useSignOut() {
  const navigate = useNavigate();
  return async () => {
    // Leave the protected page first, so its guard does not send us to sign-in.
    await navigate(paths.home);
    await signOut();
  };
}

/** Where the user is going back to after signing in: here, unless here is an account page. */
function useNextHere(): string | undefined {
  const { pathname, search } = useLocation();
  const accountPages: string[] = [paths.signIn, paths.register, paths.forgotPassword, paths.resetPassword];
  return pathname === paths.home || accountPages.includes(pathname) ? undefined : pathname + search;
}

function AccountMenu({ user }: { user: SessionUser }) {
  const [anchor, setAnchor] = useState<HTMLElement | null>(null);
  const [opened, setOpened] = useState(false);
  const doSignOut = useSignOut();
  return (
    <>
      <Button
        color="inherit"
        onClick={(e) => {
          setOpened(true);
          setAnchor(e.currentTarget);
        }}
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
      {/* mounted from the first opening on, so it closes with its transition and gives the focus back */}
      {opened && (
        <Suspense fallback={null}>
          <AccountPopup user={user} anchor={anchor} onClose={() => setAnchor(null)} onSignOut={doSignOut} />
        </Suspense>
      )}
    </>
  );
}

function PhoneMenu({ user, items }: { user: SessionUser | null; items: NavItem[] }) {
  const [open, setOpen] = useState(false);
  // mounted from the first opening on, so the drawer also slides out when it closes
  const [opened, setOpened] = useState(false);
  const doSignOut = useSignOut();
  const next = useNextHere();
  const close = () => setOpen(false);
  return (
    <>
      <IconButton
        color="inherit"
        edge="end"
        aria-label="Open menu"
        onClick={() => {
          setOpened(true);
          setOpen(true);
        }}
      >
        <MenuIcon />
      </IconButton>
      {opened && (
        <Suspense fallback={null}>
          <PhoneDrawer
            user={user}
            items={items}
            open={open}
            next={next}
            onClose={close}
            onSignOut={doSignOut}
          />
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
