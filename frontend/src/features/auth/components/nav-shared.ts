import { useLocation, useNavigate } from 'react-router';
import { paths } from '@/config/paths';
import { signOut } from '../api/sign-out';
import { isStaff, type SessionUser } from '../types';

/** What the app bar's navigation and its phone drawer share (app-navigation.tsx, nav-panels.tsx). */
export interface NavItem {
  label: string;
  to: string;
}

export function navItems(user: SessionUser | null): NavItem[] {
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

export const initials = (name: string) =>
  name
    .split(/\s+/)
    .filter(Boolean)
    .slice(0, 2)
    .map((w) => w[0].toUpperCase())
    .join('') || '?';

export function useSignOut() {
  const navigate = useNavigate();
  return async () => {
    // Leave the protected page first, so its guard does not send us to sign-in.
    await navigate(paths.home);
    await signOut();
  };
}

/** Where the user is going back to after signing in: here, unless here is an account page. */
export function useNextHere(): string | undefined {
  const { pathname, search } = useLocation();
  const accountPages: string[] = [paths.signIn, paths.register, paths.forgotPassword, paths.resetPassword];
  return pathname === paths.home || accountPages.includes(pathname) ? undefined : pathname + search;
}
