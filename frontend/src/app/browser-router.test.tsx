import { act, render, screen } from '@testing-library/react';
import { Suspense, lazy, useEffect, type ComponentType } from 'react';
import { Route, Routes, useNavigate, type NavigateFunction } from 'react-router';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { AppBrowserRouter, ScrollRestoration, useNavigationPending } from './browser-router';

// The app's own router glue (declarative React Router): scroll positions per history entry, and
// "a navigation is on its way" while the next page's lazy code loads.

let navigate: NavigateFunction = () => undefined;
function GrabNavigate() {
  const n = useNavigate();
  useEffect(() => {
    navigate = n;
  }, [n]);
  return null;
}

function Pending() {
  return <output aria-label="pending">{String(useNavigationPending())}</output>;
}

let releaseLate: () => void = () => undefined;
const Late = lazy(
  () =>
    new Promise<{ default: ComponentType }>((resolve) => {
      releaseLate = () => resolve({ default: () => <h1>Late page</h1> });
    }),
);

function renderApp() {
  return render(
    <AppBrowserRouter>
      <GrabNavigate />
      <Pending />
      <Suspense fallback={<p>first load</p>}>
        <Routes>
          <Route path="/" element={<h1>Home</h1>} />
          <Route path="/list" element={<h1>List</h1>} />
          <Route path="/late" element={<Late />} />
        </Routes>
      </Suspense>
      <ScrollRestoration />
    </AppBrowserRouter>,
  );
}

const scrollTo = vi.fn<(x: number, y: number) => void>();

beforeEach(() => {
  window.history.replaceState(null, '', '/');
  vi.stubGlobal('scrollTo', scrollTo);
  scrollTo.mockReset();
});
afterEach(() => vi.unstubAllGlobals());

/** The page scrolled by the reader: jsdom has no layout, so set scrollY and fire the event. */
function scrollReaderTo(y: number) {
  Object.defineProperty(window, 'scrollY', { value: y, configurable: true });
  window.dispatchEvent(new Event('scroll'));
}

describe('app router', () => {
  it('starts a pushed page at the top, keeps the place on a replace, and returns there on Back', async () => {
    renderApp();
    expect(screen.getByRole('heading', { name: 'Home' })).toBeInTheDocument();
    expect(scrollTo).not.toHaveBeenCalled(); // the first page keeps the browser's own position

    scrollReaderTo(640);
    await act(() => navigate('/list'));
    expect(await screen.findByRole('heading', { name: 'List' })).toBeInTheDocument();
    expect(scrollTo).toHaveBeenLastCalledWith(0, 0);

    scrollTo.mockReset();
    scrollReaderTo(120);
    await act(() => navigate('/list?sort=date', { replace: true })); // a filter: same path, same place
    expect(scrollTo).not.toHaveBeenCalled();

    await act(async () => {
      window.history.back();
      await new Promise((r) => setTimeout(r, 20)); // jsdom's popstate is asynchronous
    });
    expect(await screen.findByRole('heading', { name: 'Home' })).toBeInTheDocument();
    expect(scrollTo).toHaveBeenLastCalledWith(0, 640);
  });

  it('keeps the current page and says a navigation is pending while the next page’s code loads', async () => {
    renderApp();
    expect(screen.getByLabelText('pending')).toHaveTextContent('false');
    await act(() => navigate('/late'));
    // the old page stays (a transition), no loading fallback in its place
    expect(screen.getByRole('heading', { name: 'Home' })).toBeInTheDocument();
    expect(screen.queryByText('first load')).not.toBeInTheDocument();
    expect(screen.getByLabelText('pending')).toHaveTextContent('true');
    act(() => releaseLate());
    expect(await screen.findByRole('heading', { name: 'Late page' })).toBeInTheDocument();
    expect(screen.getByLabelText('pending')).toHaveTextContent('false');
  });
});
