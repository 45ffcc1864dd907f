import MenuIcon from '@mui/icons-material/Menu';
import Avatar from '@mui/material/Avatar';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import Stack from '@mui/material/Stack';
import useMediaQuery from '@mui/material/useMediaQuery';
import { useTheme } from '@mui/material/styles';
import { useEffect, useRef, useState } from 'react';
import { NavLink, Link as RouterLink } from 'react-router';
import { pathTo } from '@/config/paths';
import { useSession } from '../api/get-me';
import type { SessionUser } from '../types';
import type * as NavPanels from './nav-panels';
import { initials, navItems, useNextHere, type NavItem } from './nav-shared';

/*
 * The pop-ups (nav-panels.tsx says why they are a chunk of their own) are fetched on the first sign of
 * intent — the pointer entering the button (a touch fires it too, before the press), keyboard focus —
 * or at the latest on the click. Not when the page is idle: evaluating Menu, Drawer and Modal costs a
 * long task on a phone while the rider may be typing, for a menu most visits never open (issue 12,
 * total blocking time). Not `React.lazy` either: that suspends at least once even for a module already
 * here, so the drawer would open a tick after the click, and in between the page under it is still
 * exposed (the Modal has not yet hidden it with aria-hidden) — a quick second click then lands on the
 * page, not in the drawer. With the module in hand, the click opens the drawer in the same commit.
 */
type Panels = typeof NavPanels;
let panels: Panels | null = null;
let loading: Promise<Panels> | null = null;
function loadPanels(): Promise<Panels> {
  loading ??= import('./nav-panels').then((m) => (panels = m));
  return loading;
}

/**
 * A click that came before the pop-up's module: the button says it is busy (aria-busy) until the module is
 * here, and the pop-up then opens only if the user still wants it: not after Escape on the button, nor
 * once the focus has left it (a tap or a Tab elsewhere). Not disabled meanwhile: that would take the
 * focus away from the button.
 */
function usePendingOpen(ensure: () => Promise<Panels>) {
  const [pending, setPending] = useState(false);
  const wanted = useRef(false);
  const open = (show: () => void) => {
    wanted.current = true;
    setPending(true);
    void ensure().then(() => {
      setPending(false);
      if (wanted.current) show();
      wanted.current = false;
    });
  };
  const cancel = () => {
    wanted.current = false;
  };
  return { pending, open, cancel };
}

/** The pop-up module: here once any button showed intent (`preload`), else loaded by the click. */
function usePanels(): [Panels | null, () => Promise<Panels>, () => void] {
  const [mod, setMod] = useState<Panels | null>(panels);
  const live = useRef(true);
  useEffect(() => {
    live.current = true;
    return () => {
      live.current = false;
    };
  }, []);
  const preload = () => {
    if (!mod) void loadPanels().then((m) => live.current && setMod(m));
  };
  const ensure = async () => {
    const m = await loadPanels();
    setMod(m);
    return m;
  };
  return [mod, ensure, preload];
}

function AccountMenu({ user }: { user: SessionUser }) {
  const [anchor, setAnchor] = useState<HTMLElement | null>(null);
  const [mod, ensure, preload] = usePanels();
  const later = usePendingOpen(ensure);
  return (
    <>
      <Button
        color="inherit"
        onClick={(e) => {
          const target = e.currentTarget;
          if (mod) setAnchor(target);
          else later.open(() => setAnchor(target));
        }}
        onKeyDown={(e) => e.key === 'Escape' && later.cancel()}
        onBlur={later.cancel}
        aria-busy={later.pending || undefined}
        onPointerEnter={preload}
        onFocus={preload}
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
      {mod && <mod.AccountMenuPopup user={user} anchor={anchor} onClose={() => setAnchor(null)} />}
    </>
  );
}

function PhoneMenu({ user, items }: { user: SessionUser | null; items: NavItem[] }) {
  const [open, setOpen] = useState(false);
  // Mounted once its module is here and never unmounted by closing: a drawer link closes the drawer
  // and navigates in the same click; the drawer plays its exit transition while the router moves on.
  const [mod, ensure, preload] = usePanels();
  const later = usePendingOpen(ensure);
  return (
    <>
      <IconButton
        color="inherit"
        edge="end"
        aria-label="Open menu"
        aria-busy={later.pending || undefined}
        onClick={() => {
          if (mod) setOpen(true);
          else later.open(() => setOpen(true));
        }}
        onKeyDown={(e) => e.key === 'Escape' && later.cancel()}
        onBlur={later.cancel}
        onPointerEnter={preload}
        onFocus={preload}
      >
        <MenuIcon />
      </IconButton>
      {mod && <mod.PhoneDrawer user={user} items={items} open={open} onClose={() => setOpen(false)} />}
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
