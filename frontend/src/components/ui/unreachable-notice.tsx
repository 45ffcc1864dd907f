import { LazyNoticeSnackbar } from './lazy-notice-snackbar';
import { useEffect, useState } from 'react';
import { UNREACHABLE_EVENT } from '@/lib/api-client';

/**
 * "Can't reach Loamline": shown when a call got no answer, or the server said it cannot reach its
 * database (503). Nothing about the session changes — the rider stays signed in and the page
 * keeps what it showed; the next call or "Try again" picks up once the server is back.
 */
export function UnreachableNotice() {
  const [open, setOpen] = useState(false);

  useEffect(() => {
    const onUnreachable = () => setOpen(true);
    window.addEventListener(UNREACHABLE_EVENT, onUnreachable);
    return () => window.removeEventListener(UNREACHABLE_EVENT, onUnreachable);
  }, []);

  return (
    <LazyNoticeSnackbar
      open={open}
      onClose={() => setOpen(false)}
      severity="warning"
      autoHideDuration={10_000}
    >
      Can&apos;t reach Loamline just now. You are still signed in; try again in a moment.
    </LazyNoticeSnackbar>
  );
}
