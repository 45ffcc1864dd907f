import type { ReactNode } from 'react';
import { SWRConfig } from 'swr';
import { apiFetcher } from '@/lib/api-client';
import { AppTheme } from '@/theme/app-theme';

export function AppProvider({ children }: { children: ReactNode }) {
  return (
    <AppTheme>
      <SWRConfig value={{ fetcher: apiFetcher, revalidateOnFocus: false }}>{children}</SWRConfig>
    </AppTheme>
  );
}
