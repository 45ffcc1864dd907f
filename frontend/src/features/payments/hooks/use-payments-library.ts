import type { Stripe } from '@stripe/stripe-js';
import { useCallback, useEffect, useMemo, useState } from 'react';
import { paymentsLibrary } from '../utils/load-payments-library';

/** The payment library for a key and script: loading, ready (its promise for `<Elements>`), or failed. */
export function usePaymentsLibrary(publishableKey: string, scriptUrl: string | null) {
  const [attempt, setAttempt] = useState(0);
  const promise = useMemo(
    () => paymentsLibrary(publishableKey, scriptUrl),
    // `attempt`: "Try again" asks for a fresh promise (a failed one is forgotten by the loader)
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [publishableKey, scriptUrl, attempt],
  );
  const [settled, setSettled] = useState<{ promise: Promise<Stripe | null>; ok: boolean } | null>(null);
  useEffect(() => {
    let live = true;
    promise.then(
      (stripe) => live && setSettled({ promise, ok: !!stripe }),
      () => live && setSettled({ promise, ok: false }),
    );
    return () => {
      live = false;
    };
  }, [promise]);
  const status: 'loading' | 'ready' | 'failed' =
    settled?.promise !== promise ? 'loading' : settled.ok ? 'ready' : 'failed';
  const retry = useCallback(() => setAttempt((n) => n + 1), []);
  return { status, promise, retry };
}
