import AccountCircleIcon from '@mui/icons-material/AccountCircle';
import CloseIcon from '@mui/icons-material/Close';
import LogoutIcon from '@mui/icons-material/Logout';
import MenuIcon from '@mui/icons-material/Menu';
import Avatar from '@mui/material/Avatar';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Divider from '@mui/material/Divider';
import Drawer from '@mui/material/Drawer';
import IconButton from '@mui/material/IconButton';
import List from '@mui/material/List';
import ListItemButton from '@mui/material/ListItemButton';
import ListItemIcon from '@mui/material/ListItemIcon';
import ListItemText from '@mui/material/ListItemText';
import Menu from '@mui/material/Menu';
import MenuItem from '@mui/material/MenuItem';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import useMediaQuery from '@mui/material/useMediaQuery';
import { useTheme } from '@mui/material/styles';
import { useState } from 'react';
import { NavLink, Link as RouterLink, useLocation, useNavigate } from 'react-router';
import { paths, pathTo } from '@/config/paths';
import { useSession } from '../api/get-me';
import { signOut } from '../api/sign-out';
import { ROLE_LABELS, isStaff, type SessionUser } from '../types';

interface NavItem {
  label: string;
  to: string;
}

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

const initials = (name: string) =>
  name
    .split(/\s+/)
    .filter(Boolean)
    .slice(0, 2)
    .map((w) => w[0].toUpperCase())
    .join('') || '?';

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
  const doSignOut = useSignOut();
  return (
    <>
      <Button
        color="inherit"
        onClick={(e) => setAnchor(e.currentTarget)}
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
      <Menu
        anchorEl={anchor}
        open={!!anchor}
        onClose={() => setAnchor(null)}
        anchorOrigin={{ vertical: 'bottom', horizontal: 'right' }}
        transformOrigin={{ vertical: 'top', horizontal: 'right' }}
      >
        <Box sx={{ px: 2, py: 1, minWidth: 220 }}>
          <Typography sx={{ fontWeight: 500 }}>{user.name}</Typography>
          <Typography variant="body2" color="text.secondary">
            {ROLE_LABELS[user.role]} · {user.email}
          </Typography>
        </Box>
        <Divider />
        <MenuItem
          onClick={() => {
            setAnchor(null);
            void doSignOut();
          }}
        >
          <ListItemIcon>
            <LogoutIcon fontSize="small" />
          </ListItemIcon>
          Sign out
        </MenuItem>
      </Menu>
    </>
  );
}

function PhoneMenu({ user, items }: { user: SessionUser | null; items: NavItem[] }) {
  const [open, setOpen] = useState(false);
  const doSignOut = useSignOut();
  const next = useNextHere();
  const close = () => setOpen(false);
  return (
    <>
      <IconButton color="inherit" edge="end" aria-label="Open menu" onClick={() => setOpen(true)}>
        <MenuIcon />
      </IconButton>
      <Drawer anchor="right" open={open} onClose={close} slotProps={{ paper: { sx: { width: 280 } } }}>
        <Stack direction="row" sx={{ alignItems: 'center', px: 2, py: 1.5, gap: 1.5 }}>
          {user ? (
            <>
              <Avatar sx={{ bgcolor: 'primary.main' }}>{initials(user.name)}</Avatar>
              <Box sx={{ minWidth: 0, flexGrow: 1 }}>
                <Typography sx={{ fontWeight: 500 }} noWrap>
                  {user.name}
                </Typography>
                <Typography variant="body2" color="text.secondary" noWrap>
                  {ROLE_LABELS[user.role]}
                </Typography>
              </Box>
            </>
          ) : (
            <Typography sx={{ flexGrow: 1, fontWeight: 500 }}>Menu</Typography>
          )}
          <IconButton aria-label="Close menu" onClick={close}>
            <CloseIcon />
          </IconButton>
        </Stack>
        <Divider />
        <List component="nav" aria-label="Main">
          {items.map((item) => (
            <ListItemButton
              key={item.to}
              component={NavLink}
              to={item.to}
              onClick={close}
              sx={{
                minHeight: 48,
                borderLeft: 3,
                borderColor: 'transparent',
                '&.active': { bgcolor: 'action.selected', borderColor: 'secondary.main' },
              }}
            >
              <ListItemText primary={item.label} />
            </ListItemButton>
          ))}
        </List>
        <Divider />
        <List>
          {user ? (
            <ListItemButton
              onClick={() => {
                close();
                void doSignOut();
              }}
              sx={{ minHeight: 48 }}
            >
              <ListItemIcon>
                <LogoutIcon />
              </ListItemIcon>
              <ListItemText primary="Sign out" />
            </ListItemButton>
          ) : (
            <>
              <ListItemButton
                component={RouterLink}
                to={pathTo.signIn(next)}
                onClick={close}
                sx={{ minHeight: 48 }}
              >
                <ListItemIcon>
                  <AccountCircleIcon />
                </ListItemIcon>
                <ListItemText primary="Sign in" />
              </ListItemButton>
              <ListItemButton
                component={RouterLink}
                to={pathTo.register(next)}
                onClick={close}
                sx={{ minHeight: 48 }}
              >
                <ListItemText inset primary="Create an account" />
              </ListItemButton>
            </>
          )}
        </List>
      </Drawer>
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
