import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import { lazy, Suspense, type ComponentProps } from 'react';
import type { DayTimePicker as Picker } from './day-time-picker';

// The calendar (MUI X Date Pickers and its Luxon adapter) in its own chunk, fetched when the time step
// is drawn, not with the shop's page (docs/performance.md, "First screen").
const DayTimePicker = lazy(() => import('./day-time-picker').then((m) => ({ default: m.DayTimePicker })));

/** DayTimePicker, loaded on first use; until then a calendar-sized placeholder. */
export function LazyDayTimePicker(props: ComponentProps<typeof Picker>) {
  return (
    <Suspense
      fallback={
        <Stack spacing={2} role="status" aria-label="Loading the calendar">
          <Skeleton variant="rounded" height={56} />
          <Skeleton variant="rounded" height={300} />
        </Stack>
      }
    >
      <DayTimePicker {...props} />
    </Suspense>
  );
}
