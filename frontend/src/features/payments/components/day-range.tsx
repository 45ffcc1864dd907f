import Stack from '@mui/material/Stack';
import { DatePicker } from '@mui/x-date-pickers/DatePicker';
import { DateTime } from 'luxon';
import { PickersProvider } from '@/features/booking/components/pickers-provider';

/** The first and last day shown (YYYY-MM-DD, the shop's zone): two date pickers, in their own chunk. */
export default function DayRange({
  from,
  to,
  onChange,
}: {
  from: string | null;
  to: string | null;
  onChange: (which: 'from' | 'to', isoDate: string) => void;
}) {
  const set = (which: 'from' | 'to', value: DateTime | null) => {
    if (value?.isValid) onChange(which, value.toISODate()!);
  };
  return (
    <PickersProvider>
      <Stack direction="row" spacing={1.5} role="group" aria-label="Days shown">
        <DatePicker
          label="From"
          value={from ? DateTime.fromISO(from) : null}
          onChange={(v) => set('from', v)}
          slotProps={{ textField: { size: 'small' } }}
        />
        <DatePicker
          label="To"
          value={to ? DateTime.fromISO(to) : null}
          onChange={(v) => set('to', v)}
          slotProps={{ textField: { size: 'small' } }}
        />
      </Stack>
    </PickersProvider>
  );
}
