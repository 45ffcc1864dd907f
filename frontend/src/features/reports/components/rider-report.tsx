import PrintOutlinedIcon from '@mui/icons-material/PrintOutlined';
import ReplayIcon from '@mui/icons-material/EventRepeat';
import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { Appointment, BaselineSheet, ServiceReport } from '@loamline/shared-types';
import { useEffect, useRef, type ReactNode } from 'react';
import { Link as RouterLink, useLocation } from 'react-router';
import { LoadError } from '@/components/ui/load-error';
import { pathTo } from '@/config/paths';
import { useSheet } from '@/features/baseline-sheets/api/get-sheet';
import { UnitsControl } from '@/features/baseline/components/units-control';
import { useUnitPrefs } from '@/features/baseline/hooks/use-unit-prefs';
import { choiceSearch } from '@/features/booking/hooks/use-booking-choice';
import { ApiRequestError } from '@/lib/api-client';
import type { UnitPrefs } from '@/lib/units';
import { useRiderReport } from '../api/rider-report';
import { partName, PARTS } from '../types';
import { compareWithSheet } from '../utils/compare';
import { longDate } from '../utils/time';
import { FitSummary } from './fit-panel';
import { PhotoGallery } from './photo-gallery';
import { ReportPrintStyles } from './report-print-styles';
import { RunCard } from './run-card';
import { SettingsTable } from './settings-table';
import { compactCells } from './table-styles';

/**
 * Read by screen readers, not shown. In `sx` a width of 1 means 100 %: one pixel must be written
 * '1px' (as 1 it stretched each "(done)" across the page, which then scrolled sideways on a phone).
 */
const hidden = {
  position: 'absolute',
  width: '1px',
  height: '1px',
  margin: '-1px',
  overflow: 'hidden',
  clip: 'rect(0 0 0 0)',
  whiteSpace: 'nowrap',
} as const;

function Block({ title, id, children }: { title: string; id: string; children: ReactNode }) {
  return (
    <Box component="section" aria-labelledby={id}>
      <Typography id={id} variant="h3" component="h3" sx={{ fontSize: '1.15rem', mb: 1 }}>
        {title}
      </Typography>
      {children}
    </Box>
  );
}

/** Where to book the same service again, with the same bike and sheet chosen (the booking flow reads them from the URL). */
export function bookAgainPath(a: Appointment): string {
  return `${pathTo.shop(a.shop.slug)}${choiceSearch({
    serviceId: a.service.id,
    bikeId: a.bike?.id ?? null,
    sheetId: a.baselineSheetId,
  })}`;
}

/** The rider's own baseline beside what the shop set, with the difference. */
export function BaselineBeside({
  sheet,
  report,
  prefs,
}: {
  sheet: BaselineSheet;
  report: ServiceReport;
  prefs: UnitPrefs;
}) {
  const parts = PARTS.map((p) => ({ p, rows: compareWithSheet(p, sheet, report[p], prefs) })).filter(
    (x) => x.rows.length,
  );
  if (!parts.length) return null;
  return (
    <Stack spacing={2}>
      <Typography variant="body2" color="text.secondary">
        Your baseline sheet “{sheet.name}” was worked out for you before the visit; the shop then set and
        measured the bike on the bench. The difference is the shop’s value minus your baseline.
      </Typography>
      {parts.map(({ p, rows }) => (
        <Table
          key={p}
          size="small"
          aria-label={`${partName(p)}: your baseline and the shop’s settings`}
          className="report-table"
          sx={compactCells}
        >
          <TableHead>
            <TableRow>
              <TableCell>{partName(p)}</TableCell>
              <TableCell>Your baseline</TableCell>
              <TableCell>Shop set</TableCell>
              <TableCell>Difference</TableCell>
            </TableRow>
          </TableHead>
          <TableBody>
            {rows.map((r) => (
              <TableRow key={r.key}>
                <TableCell component="th" scope="row">
                  {r.label}
                </TableCell>
                <TableCell>{r.baseline ?? '—'}</TableCell>
                <TableCell>{r.shop ?? '—'}</TableCell>
                <TableCell>{r.difference ?? '—'}</TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      ))}
    </Stack>
  );
}

function SheetBeside({ id, report, prefs }: { id: string; report: ServiceReport; prefs: UnitPrefs }) {
  const { data, error } = useSheet(id);
  if (error)
    return (
      <Typography variant="body2" color="text.secondary">
        {error instanceof ApiRequestError && error.status === 404
          ? 'The baseline sheet you shared has since been deleted.'
          : `Your baseline sheet did not load: ${error.message}`}
      </Typography>
    );
  if (!data) return <Skeleton variant="rounded" height={120} />;
  return <BaselineBeside sheet={data} report={report} prefs={prefs} />;
}

/** The report itself, once loaded. */
export function RiderReportBody({
  a,
  report,
  prefs,
}: {
  a: Appointment;
  report: ServiceReport;
  prefs: UnitPrefs;
}) {
  const photos = report.attachments.filter((x) => x.kind === 'photo');
  const runs = report.attachments.filter((x) => x.kind === 'curve' && x.run);
  const stored = report.fits.filter((f) => f.stored);
  const zone = a.shop.timeZone;
  return (
    <Stack spacing={3.5}>
      {report.completedAt && (
        <Typography color="text.secondary">
          Completed by {a.shop.name} on {longDate(report.completedAt, zone)}.
        </Typography>
      )}
      <Block title="Settings" id="report-settings-title">
        <SettingsTable fork={report.fork} shock={report.shock} prefs={prefs} />
      </Block>
      {a.baselineSheetId && (
        <Block title="Your baseline beside what the shop set" id="report-beside-title">
          <SheetBeside id={a.baselineSheetId} report={report} prefs={prefs} />
        </Block>
      )}
      <Block title="Work done" id="report-work-title">
        {report.checklist.length ? (
          <Box component="ul" sx={{ m: 0, pl: 0, listStyle: 'none' }}>
            {report.checklist.map((c, i) => (
              <Typography component="li" key={`${i}-${c.label}`} sx={{ py: 0.25 }}>
                <Box
                  component="span"
                  aria-hidden
                  sx={{ display: 'inline-block', width: '1.5em', fontWeight: 700 }}
                >
                  {c.done ? '✓' : '–'}
                </Box>
                {c.label}
                {!c.done && (
                  <Box component="span" sx={{ color: 'text.secondary' }}>
                    {' '}
                    (not done)
                  </Box>
                )}
                {c.done && (
                  <Box component="span" sx={hidden}>
                    {' '}
                    (done)
                  </Box>
                )}
              </Typography>
            ))}
          </Box>
        ) : (
          <Typography color="text.secondary">No checklist.</Typography>
        )}
      </Block>
      <Block title="Notes from the shop" id="report-notes-title">
        <Typography sx={{ whiteSpace: 'pre-line' }}>{report.notes || 'No notes.'}</Typography>
      </Block>
      {photos.length > 0 && (
        <Block title="Photos" id="report-photos-title">
          <PhotoGallery photos={photos} />
        </Block>
      )}
      {runs.length > 0 && (
        <Block title="Measured on the bench" id="report-runs-title">
          <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
            Each run is the spring’s force against travel as the shop’s dyno measured it — pushed in
            (compression) and let back out (rebound) — beside what Loamline’s model expects at the same
            settings.
          </Typography>
          <Stack spacing={2}>
            {runs.map((r) => (
              <RunCard key={r.id} run={r.run!} prefs={prefs} />
            ))}
          </Stack>
        </Block>
      )}
      {stored.length > 0 && (
        <Block title="Your bike’s measured spring" id="report-fit-title">
          <Typography variant="body2" sx={{ mb: 1.5 }}>
            The shop stored the geometry measured here on {a.bike?.name ?? 'your bike'}: your next baselines
            for it start from these numbers instead of a default.
          </Typography>
          <Stack spacing={2}>
            {stored.map((f) => (
              <Box key={f.part}>
                <Typography variant="subtitle1" component="h4" sx={{ fontWeight: 700 }}>
                  {partName(f.part)}
                </Typography>
                <FitSummary fit={f} prefs={prefs} />
              </Box>
            ))}
          </Stack>
        </Block>
      )}
    </Stack>
  );
}

/**
 * On a completed appointment's page (`/appointments/:id`): the shop's report, "Book this again" and
 * a print stylesheet. While the shop has not finished it the server answers 404: "not ready yet".
 */
export function RiderReport({ a }: { a: Appointment }) {
  const { data, error, mutate } = useRiderReport(a.id, a.status === 'completed');
  const [prefs, setPrefs] = useUnitPrefs();
  // from the history's "Report" (or the e-mail's link): to the report once it is there
  const { hash } = useLocation();
  const box = useRef<HTMLElement>(null);
  const loaded = data !== undefined;
  useEffect(() => {
    if (hash !== '#report' || !loaded || !box.current) return;
    box.current.scrollIntoView?.({ block: 'start' });
    box.current.focus({ preventScroll: true });
  }, [hash, loaded]);
  let body: ReactNode;
  if (error) body = <LoadError what="The service report" error={error} onRetry={() => void mutate()} />;
  else if (data === undefined) body = <Skeleton variant="rounded" height={200} />;
  else if (data === null)
    body = (
      <Alert severity="info">
        {a.shop.name} has not finished the report yet. It shows here once they have.
      </Alert>
    );
  else body = <RiderReportBody a={a} report={data} prefs={prefs} />;
  return (
    <Card component="section" aria-labelledby="service-report-title" id="report" ref={box} tabIndex={-1}>
      <ReportPrintStyles />
      <CardContent>
        <Stack
          direction="row"
          useFlexGap
          spacing={1}
          sx={{ justifyContent: 'space-between', alignItems: 'center', flexWrap: 'wrap', mb: 2 }}
        >
          <Typography id="service-report-title" variant="h2" sx={{ fontSize: '1.5rem' }}>
            Service report
          </Typography>
          <Stack direction="row" spacing={1} className="report-no-print">
            <UnitsControl units={prefs} onChange={setPrefs} />
            {data && (
              <Button startIcon={<PrintOutlinedIcon />} onClick={() => window.print()}>
                Print
              </Button>
            )}
          </Stack>
        </Stack>
        {body}
        <Box className="report-no-print" sx={{ mt: 3 }}>
          <Button
            variant="contained"
            size="large"
            component={RouterLink}
            to={bookAgainPath(a)}
            startIcon={<ReplayIcon />}
          >
            Book this again
          </Button>
        </Box>
      </CardContent>
    </Card>
  );
}
