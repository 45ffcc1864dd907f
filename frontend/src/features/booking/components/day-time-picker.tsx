import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import { DatePicker } from '@mui/x-date-pickers/DatePicker';
import { DayCalendarSkeleton } from '@mui/x-date-pickers/DayCalendarSkeleton';
import type { ShopDetail, ShopService } from '@loamline/shared-types';
import { DateTime } from 'luxon';
import { useId, useMemo, useState } from 'react';
import { LoadError } from '@/components/ui/load-error';
import { useAvailability } from '../api/get-availability';
import { zoneLabelForDay } from '../utils/zoned-day';
import { formatLocalDate, formatTime, otherBrowserZone, todayIn } from '../utils/zoned-time';
import { PickersProvider } from './pickers-provider';

interface Props {
  shop: ShopDetail;
  service: Pick<ShopService, 'id' | 'name'>;
  day: string | null;
  start: string | null;
  onDay: (day: string) => void;
  onStart: (start: string) => void;
  /** a start to leave out (the appointment being moved) */
  exceptStart?: string;
}

/**
 * A day from the MUI X DatePicker (days with no free time are greyed out), then the free starts of
 * that day as buttons, in the shop's zone with the zone named, wherever the browser is.
 */
export function DayTimePicker({ shop, service, day, start, onDay, onStart, exceptStart }: Props) {
  const zone = shop.timeZone;
  const today = todayIn(zone);
  const lastDay = DateTime.fromISO(today, { zone }).plus({ days: shop.maxDaysAhead }).toISODate()!;
  const [month, setMonth] = useState(() => (day ?? today).slice(0, 7));
  const headingId = useId();

  // the visible month, within today … the last bookable day: to grey out days with nothing free
  const monthRange = useMemo(() => {
    const first = DateTime.fromISO(`${month}-01`, { zone });
    const from = first.toISODate()! < today ? today : first.toISODate()!;
    const endOfMonth = first.endOf('month').toISODate()!;
    const to = endOfMonth > lastDay ? lastDay : endOfMonth;
    return from <= to ? { from, to } : null;
  }, [month, today, lastDay, zone]);
  const monthQ = useAvailability(monthRange && { slug: shop.slug, serviceId: service.id, ...monthRange });
  const daysWithTimes = useMemo(
    () => new Set((monthQ.data ?? []).map((s) => s.start.slice(0, 10))),
    [monthQ.data],
  );
  const dayQ = useAvailability(day ? { slug: shop.slug, serviceId: service.id, from: day, to: day } : null);
  const starts = (dayQ.data ?? []).filter((s) => s.start !== exceptStart);

  const value = day ? DateTime.fromISO(day, { zone }) : null;
  const otherZone = otherBrowserZone(zone);

  return (
    <Stack spacing={2.5}>
      <PickersProvider>
        <DatePicker
          label="Date"
          value={value}
          timezone={zone}
          minDate={DateTime.fromISO(today, { zone })}
          maxDate={DateTime.fromISO(lastDay, { zone })}
          loading={monthQ.isLoading}
          renderLoading={() => <DayCalendarSkeleton />}
          onMonthChange={(m) => setMonth(m.setZone(zone).toFormat('yyyy-MM'))}
          shouldDisableDate={(d) => {
            const iso = d.setZone(zone, { keepLocalTime: true }).toISODate()!;
            // the API's starts carry the shop's offset, so their first ten characters are its local date
            return !!monthQ.data && iso.slice(0, 7) === month && !daysWithTimes.has(iso);
          }}
          onChange={(d) => {
            if (d?.isValid) onDay(d.toISODate()!);
          }}
          slotProps={{
            textField: { fullWidth: true, helperText: `Days with no free time are greyed out.` },
          }}
        />
      </PickersProvider>

      {day && (
        <Box component="section" aria-labelledby={headingId}>
          <Typography id={headingId} variant="h3" component="h3" sx={{ fontSize: '1.15rem' }}>
            Free times on {formatLocalDate(day)}
          </Typography>
          <Typography variant="body2" color="text.secondary" sx={{ mt: 0.5 }}>
            In {zoneLabelForDay(zone, day)}, the shop&apos;s clock ({zone}).
          </Typography>
          {otherZone && (
            <Typography variant="body2" color="text.secondary">
              Your device is set to {otherZone}; the times below are the shop&apos;s local times.
            </Typography>
          )}
          <Box sx={{ mt: 1.5 }}>
            {dayQ.error && (
              <LoadError what="The free times" error={dayQ.error} onRetry={() => void dayQ.mutate()} />
            )}
            {dayQ.isLoading && <Skeleton variant="rounded" height={96} />}
            {dayQ.data && starts.length === 0 && (
              <Alert severity="info">
                No free times on this day: the shop is closed, or every bench is taken. Try another day.
              </Alert>
            )}
            {starts.length > 0 && (
              <Box
                role="group"
                aria-labelledby={headingId}
                sx={{
                  display: 'grid',
                  gridTemplateColumns: 'repeat(auto-fill, minmax(96px, 1fr))',
                  gap: 1,
                }}
              >
                {starts.map((s) => {
                  const selected = s.start === start;
                  return (
                    <Button
                      key={s.start}
                      variant={selected ? 'contained' : 'outlined'}
                      aria-pressed={selected}
                      onClick={() => onStart(s.start)}
                      sx={{ minHeight: 44, fontVariantNumeric: 'tabular-nums' }}
                    >
                      {formatTime(s.start, zone)}
                    </Button>
                  );
                })}
              </Box>
            )}
          </Box>
        </Box>
      )}
    </Stack>
  );
}
