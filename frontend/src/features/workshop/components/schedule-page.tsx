import ChevronLeftIcon from '@mui/icons-material/ChevronLeft';
import ChevronRightIcon from '@mui/icons-material/ChevronRight';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import IconButton from '@mui/material/IconButton';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import type { AppointmentState, WorkshopAppointment } from '@loamline/shared-types';
import { Link as RouterLink, useSearchParams } from 'react-router';
import { LoadError } from '@/components/ui/load-error';
import { pathTo } from '@/config/paths';
import { ink, inkMuted, line, ochre, paper, pine, status, white } from '@/theme/primitives';
import { useWorkshopAppointments } from '../api/get-appointments';
import { useShopSettings } from '../api/settings';
import { layoutSchedule, type ScheduleDay } from '../utils/schedule-layout';
import { STATE_LABELS } from '../utils/states';
import {
  addDays,
  dayLabel,
  fromMinutes,
  localDate,
  localTime,
  longDayLabel,
  startOfWeek,
  todayIn,
  zoneLabel,
} from '../utils/time';
import { WorkshopShell } from './workshop-shell';

/** States that keep (or kept) bench time: what the schedule shows. */
const SHOWN: AppointmentState[] = ['held', 'requested', 'confirmed', 'completed', 'no_show'];

const BLOCK_LOOK: Record<string, { bg: string; border: string; dashed?: boolean }> = {
  held: { bg: white, border: inkMuted, dashed: true },
  requested: { bg: ochre[100], border: ochre[700] },
  confirmed: { bg: pine[100], border: pine[500] },
  completed: { bg: '#ECEAE4', border: inkMuted },
  no_show: { bg: '#F8E3E1', border: status.error },
};

const HEADER_H = 48;
const LANE_HEAD_H = 22;

function Block({
  a,
  top,
  height,
  left,
  width,
  compact,
}: {
  a: WorkshopAppointment;
  top: number;
  height: number;
  left: string;
  width: string;
  compact: boolean;
}) {
  const look = BLOCK_LOOK[a.status] ?? BLOCK_LOOK.confirmed;
  const time = `${localTime(a.start)}–${localTime(a.end)}`;
  return (
    <Box
      component={RouterLink}
      to={pathTo.workshopAppointment(a.id)}
      aria-label={`${time}, bench ${a.bench}: ${a.rider.name}, ${a.service.name}, ${STATE_LABELS[a.status]}`}
      title={`${time} ${a.rider.name} · ${a.service.name} · ${STATE_LABELS[a.status]}`}
      sx={{
        position: 'absolute',
        top,
        height: Math.max(height - 2, 14),
        left,
        width,
        boxSizing: 'border-box',
        px: 0.5,
        py: 0.25,
        overflow: 'hidden',
        bgcolor: look.bg,
        color: ink,
        border: 1,
        borderLeft: 4,
        borderColor: look.border,
        borderStyle: look.dashed ? 'dashed' : 'solid',
        borderRadius: 1,
        textDecoration: 'none',
        fontSize: compact ? 11 : 12.5,
        lineHeight: 1.25,
        zIndex: 1,
        '&:hover': { boxShadow: 2, zIndex: 2 },
        '&:focus-visible': { zIndex: 3 },
      }}
    >
      <Box component="span" sx={{ display: 'block', fontWeight: 700, whiteSpace: 'nowrap' }}>
        {compact ? localTime(a.start) : time}
      </Box>
      <Box
        component="span"
        sx={{ display: 'block', whiteSpace: 'nowrap', textOverflow: 'ellipsis', overflow: 'hidden' }}
      >
        {a.rider.name}
      </Box>
      {height > 44 && (
        <Box
          component="span"
          sx={{
            display: 'block',
            whiteSpace: 'nowrap',
            textOverflow: 'ellipsis',
            overflow: 'hidden',
            color: inkMuted,
          }}
        >
          {a.service.name}
        </Box>
      )}
    </Box>
  );
}

function DayColumn({
  day,
  startMin,
  endMin,
  pxPerMin,
  compact,
  isToday,
}: {
  day: ScheduleDay<WorkshopAppointment>;
  startMin: number;
  endMin: number;
  pxPerMin: number;
  compact: boolean;
  isToday: boolean;
}) {
  const height = (endMin - startMin) * pxPerMin;
  const y = (min: number) => (min - startMin) * pxPerMin;
  const lanes = day.lanes.length;
  return (
    <Box
      role="group"
      aria-label={`${longDayLabel(day.date)}${day.closure ? `, closed: ${day.closure.reason}` : ''}`}
      sx={{
        flex: 1,
        minWidth: compact ? 36 * Math.max(lanes, 1) + 8 : 120 * Math.max(lanes, 1),
        borderLeft: 1,
        borderColor: line,
      }}
    >
      <Box
        sx={{
          height: HEADER_H,
          px: 0.75,
          display: 'flex',
          flexDirection: 'column',
          justifyContent: 'center',
          bgcolor: isToday ? pine[50] : 'background.paper',
          borderBottom: 1,
          borderColor: line,
        }}
      >
        <Typography variant="body2" component="h3" sx={{ fontWeight: 700, lineHeight: 1.2 }}>
          {compact ? dayLabel(day.date) : longDayLabel(day.date)}
          {isToday && (
            <Box component="span" sx={{ color: pine[700], fontWeight: 500 }}>
              {' '}
              · today
            </Box>
          )}
        </Typography>
        <Typography
          variant="caption"
          sx={{ color: day.closure ? status.error : inkMuted, lineHeight: 1.2 }}
          noWrap
        >
          {day.closure
            ? `Closed: ${day.closure.reason}`
            : day.open.length
              ? day.open.map((o) => `${fromMinutes(o.startMin)}–${fromMinutes(o.endMin)}`).join(', ')
              : 'Closed'}
        </Typography>
      </Box>
      <Box sx={{ display: 'flex', height: LANE_HEAD_H, borderBottom: 1, borderColor: line, bgcolor: paper }}>
        {day.lanes.map((l) => (
          <Typography
            key={l.bench}
            variant="caption"
            sx={{ flex: 1, textAlign: 'center', color: inkMuted, lineHeight: `${LANE_HEAD_H}px` }}
            noWrap
          >
            {compact ? `B${l.bench}` : `Bench ${l.bench}`}
          </Typography>
        ))}
      </Box>
      <Box sx={{ position: 'relative', height, bgcolor: '#E9E6DE' }}>
        {/* opening hours: the open part is white, the rest stays shaded */}
        {!day.closure &&
          day.open.map((o) => (
            <Box
              key={o.startMin}
              aria-hidden
              sx={{
                position: 'absolute',
                left: 0,
                right: 0,
                top: y(Math.max(o.startMin, startMin)),
                height: (Math.min(o.endMin, endMin) - Math.max(o.startMin, startMin)) * pxPerMin,
                bgcolor: white,
              }}
            />
          ))}
        {day.closure && (
          <Box
            aria-hidden
            sx={{
              position: 'absolute',
              inset: 0,
              backgroundImage: `repeating-linear-gradient(135deg, transparent 0 8px, ${line} 8px 10px)`,
              display: 'flex',
              alignItems: 'flex-start',
              justifyContent: 'center',
              pt: 2,
            }}
          >
            <Typography
              variant="caption"
              sx={{ bgcolor: white, px: 0.75, borderRadius: 1, color: status.error }}
            >
              Closed · {day.closure.reason}
            </Typography>
          </Box>
        )}
        {/* hour lines */}
        {Array.from({ length: (endMin - startMin) / 60 + 1 }, (_, i) => (
          <Box
            key={i}
            aria-hidden
            sx={{
              position: 'absolute',
              left: 0,
              right: 0,
              top: i * 60 * pxPerMin,
              borderTop: 1,
              borderColor: line,
            }}
          />
        ))}
        {/* lane separators */}
        {day.lanes.slice(1).map((l, i) => (
          <Box
            key={l.bench}
            aria-hidden
            sx={{
              position: 'absolute',
              top: 0,
              bottom: 0,
              left: `${((i + 1) / lanes) * 100}%`,
              borderLeft: '1px dashed',
              borderColor: line,
            }}
          />
        ))}
        {day.lanes.map((l, li) =>
          l.blocks.map((b) => (
            <Block
              key={b.item.id}
              a={b.item}
              top={y(b.startMin)}
              height={(b.endMin - b.startMin) * pxPerMin}
              left={`calc(${((li + b.column / b.columns) / lanes) * 100}% + 2px)`}
              width={`calc(${100 / lanes / b.columns}% - 4px)`}
              compact={compact}
            />
          )),
        )}
      </Box>
    </Box>
  );
}

/** `/workshop/schedule?date&view`: the shop's day or week, one lane per bench, in the shop's zone. */
export function SchedulePage() {
  const [params, setParams] = useSearchParams();
  const { data: settings, error: settingsError, mutate: reloadSettings } = useShopSettings();
  const zone = settings?.timeZone;
  const view = params.get('view') === 'day' ? 'day' : 'week';
  const today = zone ? todayIn(zone) : null;
  const date = /^\d{4}-\d{2}-\d{2}$/.test(params.get('date') ?? '') ? params.get('date')! : today;
  const from = date ? (view === 'week' ? startOfWeek(date) : date) : null;
  const days = from ? Array.from({ length: view === 'week' ? 7 : 1 }, (_, i) => addDays(from, i)) : [];
  const to = days[days.length - 1];
  const { data, error, mutate } = useWorkshopAppointments(from && to ? { status: SHOWN, from, to } : null);

  const go = (next: string | null, nextView = view) =>
    setParams(
      (p) => {
        if (next) p.set('date', next);
        p.set('view', nextView);
        return p;
      },
      { replace: false },
    );

  const compact = view === 'week';
  const pxPerMin = compact ? 0.9 : 1.3;
  const layout =
    settings && data
      ? layoutSchedule(data, {
          days,
          benches: settings.benches,
          hours: settings.hours,
          closures: settings.closures,
        })
      : null;

  return (
    <WorkshopShell maxWidth="xl">
      <Stack
        direction={{ xs: 'column', md: 'row' }}
        spacing={1.5}
        sx={{ mb: 1.5, alignItems: { md: 'center' } }}
      >
        <Typography variant="h3" component="h2" sx={{ minWidth: 120 }}>
          Schedule
        </Typography>
        <Stack direction="row" spacing={0.5} sx={{ alignItems: 'center', flexGrow: 1 }}>
          <IconButton
            aria-label={view === 'week' ? 'Previous week' : 'Previous day'}
            onClick={() => date && go(addDays(date, view === 'week' ? -7 : -1))}
            disabled={!date}
          >
            <ChevronLeftIcon />
          </IconButton>
          <Button variant="outlined" size="small" onClick={() => today && go(today)} disabled={!today}>
            Today
          </Button>
          <IconButton
            aria-label={view === 'week' ? 'Next week' : 'Next day'}
            onClick={() => date && go(addDays(date, view === 'week' ? 7 : 1))}
            disabled={!date}
          >
            <ChevronRightIcon />
          </IconButton>
          <Typography sx={{ fontWeight: 500, ml: 1 }} aria-live="polite">
            {from && to ? (view === 'week' ? `${dayLabel(from)} – ${dayLabel(to)}` : longDayLabel(from)) : ''}
          </Typography>
        </Stack>
        <ToggleButtonGroup
          size="small"
          exclusive
          value={view}
          onChange={(_e, v: 'day' | 'week' | null) => v && go(date, v)}
          aria-label="View"
        >
          <ToggleButton value="day" sx={{ px: 2 }}>
            Day
          </ToggleButton>
          <ToggleButton value="week" sx={{ px: 2 }}>
            Week
          </ToggleButton>
        </ToggleButtonGroup>
      </Stack>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 1 }}>
        {zone ? `Times in ${zoneLabel(zone, from ? new Date(`${from}T12:00:00Z`) : undefined)}.` : ''} White
        is open, shaded is closed; a click opens the appointment.
      </Typography>
      <Stack direction="row" spacing={2} sx={{ mb: 1.5, flexWrap: 'wrap' }} aria-label="Key" role="list">
        {(['requested', 'confirmed', 'held', 'completed', 'no_show'] as const).map((s) => (
          <Stack key={s} direction="row" spacing={0.75} sx={{ alignItems: 'center' }} role="listitem">
            <Box
              sx={{
                width: 14,
                height: 14,
                bgcolor: BLOCK_LOOK[s].bg,
                border: 1,
                borderLeft: 4,
                borderColor: BLOCK_LOOK[s].border,
                borderStyle: BLOCK_LOOK[s].dashed ? 'dashed' : 'solid',
              }}
            />
            <Typography variant="caption">{STATE_LABELS[s]}</Typography>
          </Stack>
        ))}
      </Stack>
      {settingsError && (
        <LoadError what="The shop’s hours" error={settingsError} onRetry={() => void reloadSettings()} />
      )}
      {error && <LoadError what="The appointments" error={error} onRetry={() => void mutate()} />}
      {!layout && !error && !settingsError && <Skeleton variant="rounded" height={480} />}
      {layout && (
        <Box
          component="section"
          aria-label={view === 'week' ? 'Week schedule' : 'Day schedule'}
          sx={{
            overflowX: 'auto',
            border: 1,
            borderColor: line,
            borderRadius: 2.5,
            bgcolor: 'background.paper',
          }}
        >
          <Box sx={{ display: 'flex', minWidth: compact ? 760 : 0, pb: 1.5 }}>
            <Box aria-hidden sx={{ width: 52, flexShrink: 0 }}>
              <Box sx={{ height: HEADER_H + LANE_HEAD_H + 2 }} />
              <Box sx={{ position: 'relative', height: (layout.endMin - layout.startMin) * pxPerMin }}>
                {Array.from({ length: (layout.endMin - layout.startMin) / 60 + 1 }, (_, i) => (
                  <Typography
                    key={i}
                    variant="caption"
                    sx={{
                      position: 'absolute',
                      right: 6,
                      top: i === 0 ? 0 : i * 60 * pxPerMin - 8,
                      color: inkMuted,
                    }}
                  >
                    {fromMinutes(layout.startMin + i * 60)}
                  </Typography>
                ))}
              </Box>
            </Box>
            {layout.days.map((d) => (
              <DayColumn
                key={d.date}
                day={d}
                startMin={layout.startMin}
                endMin={layout.endMin}
                pxPerMin={pxPerMin}
                compact={compact}
                isToday={d.date === today}
              />
            ))}
          </Box>
        </Box>
      )}
      {data && data.length === 0 && (
        <Alert severity="info" sx={{ mt: 2 }}>
          No appointments {view === 'week' ? 'this week' : 'this day'}.
        </Alert>
      )}
      {data && layout && view === 'week' && (
        <Typography variant="caption" color="text.secondary" sx={{ display: 'block', mt: 1 }}>
          {data.length} appointment{data.length === 1 ? '' : 's'} this week ·{' '}
          {days.filter((d) => data.some((a) => localDate(a.start) === d)).length} busy day(s)
        </Typography>
      )}
    </WorkshopShell>
  );
}
