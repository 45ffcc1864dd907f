import type { Stripe } from '@stripe/stripe-js';
import { loadStripe } from '@stripe/stripe-js/pure';

/*
 * The payment library, loaded only when the payment step is shown (`@stripe/stripe-js/pure` loads
 * nothing on import). When the server names a script (`scriptUrl`, e.g. the local payment fake's),
 * that script is put on the page first and awaited: it defines `window.Stripe`, which `loadStripe`
 * then uses instead of fetching the hosted one.
 */

const scripts = new Map<string, Promise<void>>();
const libraries = new Map<string, Promise<Stripe | null>>();

function loadScript(src: string): Promise<void> {
  // already there (loaded before, or a test's stand-in)
  if (window.Stripe) return Promise.resolve();
  let loading = scripts.get(src);
  if (!loading) {
    loading = new Promise<void>((resolve, reject) => {
      const script = document.createElement('script');
      script.src = src;
      script.async = true;
      script.addEventListener('load', () => resolve());
      script.addEventListener('error', () => {
        script.remove();
        reject(new Error(`The payment script did not load (${src}).`));
      });
      document.head.appendChild(script);
    });
    // failed: the next try puts a fresh script on the page
    loading.catch(() => scripts.delete(src));
    scripts.set(src, loading);
  }
  return loading;
}

/** One promise of the library per (script, publishable key); a failed load is tried again next time. */
export function paymentsLibrary(publishableKey: string, scriptUrl: string | null): Promise<Stripe | null> {
  const key = `${scriptUrl ?? 'hosted'} ${publishableKey}`;
  let library = libraries.get(key);
  if (!library) {
    library = (scriptUrl ? loadScript(scriptUrl) : Promise.resolve()).then(() => loadStripe(publishableKey));
    library.catch(() => libraries.delete(key));
    libraries.set(key, library);
  }
  return library;
}
