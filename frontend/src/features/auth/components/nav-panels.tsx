import AccountCircleIcon from '@mui/icons-material/AccountCircle';
import CloseIcon from '@mui/icons-material/Close';
import LogoutIcon from '@mui/icons-material/Logout';
import Avatar from '@mui/material/Avatar';
import Box from '@mui/material/Box';
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
import { useEffect, useRef } from 'react';
import { NavLink, Link as RouterLink } from 'react-router';
import { pathTo } from '@/config/paths';
import { ROLE_LABELS, type SessionUser } from '../types';
import { initials, useNextHere, useSignOut, type NavItem } from './nav-shared';

/*
 * The app bar's pop-ups — the account menu (wide screens) and the phone drawer — are loaded through
 * `lazy()` the first time they open (app-navigation.tsx), so Menu, Popover, Drawer, Modal and the
 * transitions are not part of every page's first download. Once opened they stay mounted: closing plays
 * the exit transition, and a link's navigation is never cut short by the drawer unmounting.
 */

/** The account menu under the app bar's account button. */
export function AccountMenuPopup({
  user,
  anchor,
  onClose,
}: {
  user: SessionUser;
  anchor: HTMLElement | null;
  onClose: () => void;
}) {
  const doSignOut = useSignOut();
  return (
    <Menu
      anchorEl={anchor}
      open={!!anchor}
      onClose={onClose}
      anchorOrigin={{ vertical: 'bottom', horizontal: 'right' }}
      transformOrigin={{ vertical: 'top', horizontal: 'right' }}
      slotProps={{ list: { 'aria-label': 'Account' } }}
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
          onClose();
          void doSignOut();
        }}
      >
        <ListItemIcon>
          <LogoutIcon fontSize="small" />
        </ListItemIcon>
        Sign out
      </MenuItem>
    </Menu>
  );
}

/** A second tap sooner than this after the first is part of a double tap (common practice, no source). */
const DOUBLE_TAP_MS = 400;

/** The phone's navigation: a drawer from the right with the sections and the account. */
export function PhoneDrawer({
  user,
  items,
  open,
  onClose: close,
}: {
  user: SessionUser | null;
  items: NavItem[];
  open: boolean;
  onClose: () => void;
}) {
  const doSignOut = useSignOut();
  const next = useNextHere();
  // The close button sits where the menu button was: the second tap of a quick double tap on the menu
  // button would land on it and shut the drawer it just opened. Taps on it in the first moment are let go.
  const openedAt = useRef(0);
  useEffect(() => {
    if (open) openedAt.current = performance.now();
  }, [open]);
  const closeByButton = () => {
    if (performance.now() - openedAt.current >= DOUBLE_TAP_MS) close();
  };
  return (
    <Drawer
      anchor="right"
      open={open}
      onClose={close}
      slotProps={{ paper: { sx: { width: 280 }, role: 'dialog', 'aria-label': 'Menu' } }}
    >
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
        <IconButton aria-label="Close menu" onClick={closeByButton}>
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
  );
}
