import { LazyNoticeSnackbar } from '@/components/ui/lazy-notice-snackbar';
import { useEffect, useRef, useState } from 'react';
import { SIGNED_OUT_EVENT } from '@/lib/api-client';
import { useSession } from '../api/get-me';

export { SIGNED_OUT_EVENT };

/**
 * When a call answers 401 while the app thought someone was signed in (the session expired or was
 * ended elsewhere), ask the server again and say so once. 401s while signed out (a wrong password,
 * the first `/auth/me`) change nothing.
 */
export function SignedOutNotice() {
  const { user, mutate } = useSession();
  const signedIn = useRef(false);
  const [open, setOpen] = useState(false);

  useEffect(() => {
    signedIn.current = !!user;
  }, [user]);

  useEffect(() => {
    const onSignedOut = () => {
      if (!signedIn.current) return;
      signedIn.current = false;
      setOpen(true);
      void mutate();
    };
    window.addEventListener(SIGNED_OUT_EVENT, onSignedOut);
    return () => window.removeEventListener(SIGNED_OUT_EVENT, onSignedOut);
  }, [mutate]);

  return (
    <LazyNoticeSnackbar open={open} onClose={() => setOpen(false)} severity="info" autoHideDuration={8000}>
      You were signed out. Sign in again to carry on.
    </LazyNoticeSnackbar>
  );
}
