import {
  createContext,
  useContext,
  useEffect,
  useLayoutEffect,
  useRef,
  useState,
  useTransition,
  type ReactNode,
} from 'react';
import {
  Router,
  UNSAFE_createBrowserHistory as createBrowserHistory,
  useLocation,
  useNavigationType,
  type Location,
  NavigationType,
} from 'react-router';

/*
 * React Router in its declarative mode, with the two things the app took from its data router:
 * whether a navigation is still on its way, and scroll restoration. The data router (loaders,
 * actions, fetchers — none of which Loamline uses: pages fetch with SWR) is about 20 kB of gzipped
 * JavaScript on every route, and issue 12 caps a route at 150 kB.
 */

const NavigationPending = createContext(false);

/** True while a navigation waits for its page's lazy code (the old page stays on screen meanwhile). */
export const useNavigationPending = () => useContext(NavigationPending);

/**
 * `<BrowserRouter>` as React Router writes it, with the location change in our own `useTransition`:
 * React keeps the current page while the next one's code loads (as the router's own transition does)
 * and `pending` says so, for the bar under the app bar.
 */
export function AppBrowserRouter({ children }: { children: ReactNode }) {
  const historyRef = useRef<ReturnType<typeof createBrowserHistory>>(null);
  historyRef.current ??= createBrowserHistory({ window, v5Compat: true });
  const history = historyRef.current;
  const [state, setState] = useState<{ action: NavigationType; location: Location }>({
    action: history.action,
    location: history.location,
  });
  const [pending, startTransition] = useTransition();
  useLayoutEffect(() => history.listen((update) => startTransition(() => setState(update))), [history]);
  return (
    <NavigationPending.Provider value={pending}>
      <Router location={state.location} navigationType={state.action} navigator={history}>
        {children}
      </Router>
    </NavigationPending.Provider>
  );
}

/** Where each history entry was scrolled to, by its key: Back and Forward return there. */
const scrollPositions = new Map<string, number>();

/**
 * Scroll restoration for the declarative router: Back and Forward return to where the page was
 * scrolled; a new page (a pushed entry, or another path) starts at the top, or at its `#hash`; a
 * replaced entry on the same path (a filter, a booking choice) stays where it is.
 */
export function ScrollRestoration() {
  const location = useLocation();
  const action = useNavigationType();
  const previousPath = useRef<string | null>(null);

  useEffect(() => {
    window.history.scrollRestoration = 'manual';
    return () => {
      window.history.scrollRestoration = 'auto';
    };
  }, []);

  // Remember this entry's position as the reader scrolls. A layout effect, so the listener moves to
  // the next entry in the same commit that draws it, before a scroll event of the new page can fire.
  useLayoutEffect(() => {
    const save = () => scrollPositions.set(location.key, window.scrollY);
    window.addEventListener('scroll', save, { passive: true });
    return () => window.removeEventListener('scroll', save);
  }, [location.key]);

  useLayoutEffect(() => {
    const from = previousPath.current;
    previousPath.current = location.pathname;
    if (from === null) return; // the first page: the browser's own position
    const saved = scrollPositions.get(location.key);
    if (action === NavigationType.Pop && saved !== undefined) return window.scrollTo(0, saved);
    if (location.hash) {
      let target: HTMLElement | null = null;
      try {
        target = document.getElementById(decodeURIComponent(location.hash.slice(1)));
      } catch {
        // a malformed #hash names no element
      }
      if (target) return target.scrollIntoView();
    }
    if (action === NavigationType.Push || from !== location.pathname) window.scrollTo(0, 0);
  }, [location, action]);

  return null;
}
