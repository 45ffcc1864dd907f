import Button from '@mui/material/Button';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { WorkshopAppointment } from '@loamline/shared-types';
import { useEffect, useRef, useState } from 'react';
import { Link as RouterLink } from 'react-router';
import { pathTo } from '@/config/paths';
import { staffActions } from '../utils/states';
import { dayLabel, localDate, localTime } from '../utils/time';
import { ACTION_LABELS, type useAppointmentActions } from './action-dialogs';
import { StateChip } from './state-chip';

const PAGE = 25;

/**
 * Workshop › Requests on a phone: one card per appointment, soonest first, with the same actions as
 * the table on a wide screen (requests-page.tsx). A seven-column grid does not fit a phone's width, and
 * its code and layout work cost a phone seconds of a blocked main thread (issue 12); a list reads
 * top to bottom and every action is a full-size button. 25 at a time, "Show more" adds the next 25.
 */
export function RequestsList({
  rows,
  loading,
  actions,
}: {
  rows: WorkshopAppointment[] | undefined;
  loading: boolean;
  actions: ReturnType<typeof useAppointmentActions>;
}) {
  const [shown, setShown] = useState(PAGE);
  // what the last Confirm did, said in a status line that takes the focus: the confirmed card leaves a
  // "Needs an answer" list, and the focus must not fall back to the top of the page with it
  const [done, setDone] = useState<string | null>(null);
  const doneRef = useRef<HTMLParagraphElement>(null);
  useEffect(() => {
    if (done) doneRef.current?.focus();
  }, [done]);
  // after "Show more", the focus goes to the first card that came (the button may be gone)
  const listRef = useRef<HTMLUListElement>(null);
  const focusFrom = useRef<number | null>(null);
  useEffect(() => {
    if (focusFrom.current === null) return;
    listRef.current?.querySelectorAll<HTMLElement>(':scope > li a')[focusFrom.current]?.focus();
    focusFrom.current = null;
  }, [shown]);
  const notice = done && (
    <Typography
      ref={doneRef}
      role="status"
      tabIndex={-1}
      sx={{ mb: 1, p: 1, borderRadius: 1, bgcolor: 'success.light', color: 'success.contrastText' }}
    >
      {done}
    </Typography>
  );
  if (!rows) {
    // the height of a few cards, so that the footer does not jump away when they come
    return loading ? (
      <Typography role="status" color="text.secondary" sx={{ py: 2, minHeight: '60vh' }}>
        Loading the appointments…
      </Typography>
    ) : null;
  }
  if (rows.length === 0) {
    return (
      <>
        {notice}
        <Typography sx={{ py: 2 }}>No appointments match.</Typography>
      </>
    );
  }
  const sorted = [...rows].sort((a, b) => Date.parse(a.start) - Date.parse(b.start));
  return (
    <>
      {notice}
      <Stack
        ref={listRef}
        component="ul"
        aria-label="Appointments"
        aria-busy={loading || undefined}
        spacing={1}
        sx={{ listStyle: 'none', m: 0, p: 0 }}
      >
        {sorted.slice(0, shown).map((row) => {
          const allowed = staffActions(row);
          const when = `${dayLabel(localDate(row.start))}, ${localTime(row.start)}–${localTime(row.end)}`;
          const label = `${row.rider.name}, ${dayLabel(localDate(row.start))} ${localTime(row.start)}`;
          return (
            <Stack
              component="li"
              key={row.id}
              aria-label={`${when}: ${row.service.name}, ${row.rider.name}`}
              spacing={0.75}
              sx={{
                bgcolor: 'background.paper',
                border: 1,
                borderColor: 'divider',
                borderRadius: 2.5,
                p: 1.5,
              }}
            >
              <Stack
                direction="row"
                sx={{ justifyContent: 'space-between', alignItems: 'flex-start', gap: 1 }}
              >
                <Typography
                  component={RouterLink}
                  to={pathTo.workshopAppointment(row.id)}
                  sx={{ fontWeight: 700, color: 'inherit' }}
                >
                  {when}
                </Typography>
                <StateChip state={row.status} />
              </Stack>
              <Typography variant="body2">
                {row.service.name}
                {row.bench ? ` · bench ${row.bench}` : ''}
              </Typography>
              <Typography variant="body2">
                {row.rider.name}
                {row.rider.massKg !== null ? ` · ${Math.round(row.rider.massKg)} kg with gear` : ''}
                {row.bike ? ` · ${row.bike.name}` : ''}
              </Typography>
              {row.proposedStart && (
                <Typography variant="body2" color="text.secondary">
                  Proposed: {dayLabel(localDate(row.proposedStart))} {localTime(row.proposedStart)}
                </Typography>
              )}
              {(allowed.includes('confirm') ||
                allowed.includes('decline') ||
                allowed.includes('propose')) && (
                <Stack direction="row" sx={{ flexWrap: 'wrap', gap: 1, pt: 0.5 }}>
                  {allowed.includes('confirm') && (
                    <Button
                      variant="contained"
                      size="small"
                      aria-label={`Confirm: ${label}`}
                      disabled={actions.busy === `${row.id}:confirm`}
                      onClick={() => {
                        setDone(null);
                        void actions.run(row, 'confirm').then((ok) => ok && setDone(`Confirmed: ${label}.`));
                      }}
                    >
                      Confirm
                    </Button>
                  )}
                  {allowed.includes('decline') && (
                    <Button
                      variant="outlined"
                      size="small"
                      aria-label={`Decline: ${label}`}
                      onClick={() => void actions.run(row, 'decline')}
                    >
                      {ACTION_LABELS.decline}
                    </Button>
                  )}
                  {allowed.includes('propose') && (
                    <Button
                      size="small"
                      aria-label={`Propose another time: ${label}`}
                      onClick={() => void actions.run(row, 'propose')}
                    >
                      {ACTION_LABELS.propose}
                    </Button>
                  )}
                </Stack>
              )}
            </Stack>
          );
        })}
      </Stack>
      {sorted.length > shown && (
        <Button
          sx={{ mt: 1.5 }}
          onClick={() => {
            focusFrom.current = shown;
            setShown((n) => n + PAGE);
          }}
        >
          Show more ({sorted.length - shown} left)
        </Button>
      )}
    </>
  );
}
