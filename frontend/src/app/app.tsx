import { AppBrowserRouter, ScrollRestoration } from './browser-router';
import { AppProvider } from './provider';
import { AppRoutes } from './router';

export function App() {
  return (
    <AppProvider>
      <AppBrowserRouter>
        <AppRoutes />
        <ScrollRestoration />
      </AppBrowserRouter>
    </AppProvider>
  );
}
