import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Divider from '@mui/material/Divider';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Typography from '@mui/material/Typography';
import type { Attachment, WorkshopAppointment } from '@loamline/shared-types';
import { useState } from 'react';
import { ConfirmDialog } from '@/features/garage/components/confirm-dialog';
import { UnitsControl } from '@/features/baseline/components/units-control';
import { useUnitPrefs } from '@/features/baseline/hooks/use-unit-prefs';
import { deleteAttachment, useWorkshopReport } from '../api/workshop-report';
import { PARTS, type FitResult } from '../types';
import { longDate } from '../utils/time';
import { FitPanel } from './fit-panel';
import { PhotoGallery } from './photo-gallery';
import { ReportForm } from './report-form';
import { RunCard } from './run-card';
import { CurveUpload, PhotoUpload } from './uploads';

function Block({ title, id, children }: { title: string; id: string; children: React.ReactNode }) {
  return (
    <Box component="section" aria-labelledby={id}>
      <Typography id={id} variant="h4" component="h3" sx={{ fontSize: '1rem', fontWeight: 700, mb: 1 }}>
        {title}
      </Typography>
      {children}
    </Box>
  );
}

/**
 * The service report on the Workshop appointment page (issue 11): the form (work done, notes, final
 * settings), photos, bench runs against the model, and the bike's measured spring per part.
 * Completing the appointment (the page's Complete action) makes it final and mails the rider.
 */
export function WorkshopReport({ a }: { a: WorkshopAppointment }) {
  const { data: report, error, mutate } = useWorkshopReport(a.id);
  const [prefs, setPrefs] = useUnitPrefs();
  const [removing, setRemoving] = useState<Attachment | null>(null);
  const zone = a.shop.timeZone;
  let body: React.ReactNode;
  if (error) {
    body = (
      <Alert
        severity="error"
        action={
          <Button color="inherit" onClick={() => void mutate()}>
            Try again
          </Button>
        }
      >
        The report did not load: {error.message}
      </Alert>
    );
  } else if (!report) {
    body = <Skeleton variant="rounded" height={320} />;
  } else {
    const final = report.status === 'final';
    const photos = report.attachments.filter((x) => x.kind === 'photo');
    const curves = report.attachments.filter((x) => x.kind === 'curve' && x.run);
    const fitOf = (p: 'fork' | 'shock') =>
      [...(report.fits as FitResult[])].reverse().find((f) => f.part === p) ?? null;
    body = (
      <Stack spacing={3}>
        {final ? (
          <Alert severity="success">
            Final{report.completedAt ? `: completed on ${longDate(report.completedAt, zone)}` : ''}. The rider
            sees this report; it can no longer be changed.
          </Alert>
        ) : (
          <Typography variant="body2" color="text.secondary">
            A draft until you complete the appointment: then it becomes final, as last saved, and the rider
            gets an e-mail with a link to it. Save before you complete.
          </Typography>
        )}
        <ReportForm
          appointmentId={a.id}
          report={report}
          prefs={prefs}
          zone={zone}
          onReload={() => mutate()}
        />
        <Divider />
        <Block title="Photos" id="report-photos-title">
          <Stack spacing={1.5}>
            {photos.length > 0 ? (
              <PhotoGallery photos={photos} onDelete={final ? undefined : setRemoving} />
            ) : (
              <Typography variant="body2" color="text.secondary">
                No photos yet.
              </Typography>
            )}
            {!final && <PhotoUpload appointmentId={a.id} count={photos.length} />}
          </Stack>
        </Block>
        <Divider />
        <Block title="Bench runs" id="report-runs-title">
          <Stack spacing={2}>
            {curves.length === 0 && (
              <Typography variant="body2" color="text.secondary">
                No curves yet. A report may hold several runs, e.g. the same fork at three end-stroke
                pressures.
              </Typography>
            )}
            {curves.map((c) => (
              <RunCard
                key={c.id}
                run={c.run!}
                prefs={prefs}
                actions={
                  !final && (
                    <Button
                      size="small"
                      color="error"
                      onClick={() => setRemoving(c)}
                      aria-label={`Delete run ${c.run!.label}`}
                    >
                      Delete
                    </Button>
                  )
                }
              />
            ))}
            {!final && <CurveUpload appointmentId={a.id} prefs={prefs} />}
          </Stack>
        </Block>
        <Divider />
        <Block title="The bike’s measured spring" id="report-fit-title">
          <Typography variant="body2" color="text.secondary" sx={{ mb: 2 }}>
            Fits what the model cannot know — the effective positive air column, the negative and end-stroke
            chamber volumes and a friction offset — to this part’s runs. Stored on{' '}
            {a.bike ? a.bike.name : 'the bike'}, it is what later baselines for that bike start from.
          </Typography>
          <Stack spacing={3}>
            {PARTS.map((p) => (
              <FitPanel
                key={p}
                appointmentId={a.id}
                part={p}
                runs={curves.filter((c) => c.run!.settings.part === p).length}
                fit={fitOf(p)}
                hasBike={!!a.bike}
                prefs={prefs}
                readOnly={final}
              />
            ))}
          </Stack>
        </Block>
      </Stack>
    );
  }
  return (
    <Card component="section" aria-labelledby="report-title">
      <CardContent>
        <Stack direction="row" sx={{ justifyContent: 'space-between', alignItems: 'center', mb: 1, gap: 1 }}>
          <Typography id="report-title" variant="h3" component="h2" sx={{ fontSize: '1.05rem' }}>
            Service report
          </Typography>
          <UnitsControl units={prefs} onChange={setPrefs} />
        </Stack>
        {body}
        <ConfirmDialog
          open={!!removing}
          title={removing?.kind === 'photo' ? 'Delete this photo?' : 'Delete this run?'}
          confirmLabel="Delete"
          onClose={() => setRemoving(null)}
          onConfirm={() => deleteAttachment(a.id, removing!.id)}
        >
          {removing?.kind === 'photo' ? removing.name : removing?.run?.label} is removed from the report.
        </ConfirmDialog>
      </CardContent>
    </Card>
  );
}
