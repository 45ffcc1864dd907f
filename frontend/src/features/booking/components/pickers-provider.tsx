import { AdapterLuxon } from '@mui/x-date-pickers/AdapterLuxon';
import { LocalizationProvider } from '@mui/x-date-pickers/LocalizationProvider';
import type { ReactNode } from 'react';

/** MUI X pickers on Luxon, in the browser's language (weeks start as the rider is used to). */
export function PickersProvider({ children }: { children: ReactNode }) {
  const locale = typeof navigator !== 'undefined' ? navigator.language : 'en-GB';
  return (
    <LocalizationProvider dateAdapter={AdapterLuxon} adapterLocale={locale}>
      {children}
    </LocalizationProvider>
  );
}
