import Box from '@mui/material/Box';
import Skeleton from '@mui/material/Skeleton';
import Stack from '@mui/material/Stack';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { CurveRun } from '@loamline/shared-types';
import { lazy, Suspense, type ReactNode } from 'react';
import type { UnitPrefs } from '@/lib/units';
import { partName } from '../types';
import { formatForceN, formatLength, formatPct, formatPressure } from '../utils/settings-units';
import { RUN_COLOURS } from './run-colours';
import { compactCells } from './table-styles';

const RunChart = lazy(() => import('./run-chart'));

/** "Fork · 85 psi main, end-stroke 190 psi, 2 spacers" */
export function runSettingsText(run: CurveRun, prefs: UnitPrefs): string {
  const s = run.settings;
  const parts = [`${formatPressure(s.mainPsi, prefs)} main`];
  if (s.endStrokePsi !== null) parts.push(`end-stroke ${formatPressure(s.endStrokePsi, prefs)}`);
  parts.push(`${s.spacers} spacer${s.spacers === 1 ? '' : 's'}`);
  return `${partName(s.part)} · ${parts.join(', ')}`;
}

function Key({
  colour,
  dashed,
  dot,
  children,
}: {
  colour: string;
  dashed?: boolean;
  dot?: boolean;
  children: ReactNode;
}) {
  return (
    <Stack direction="row" spacing={0.75} sx={{ alignItems: 'center' }} component="li">
      <Box component="svg" aria-hidden width={24} height={10} viewBox="0 0 24 10">
        {dot ? (
          <>
            <circle cx={6} cy={5} r={2.5} fill={colour} />
            <circle cx={12} cy={5} r={2.5} fill={colour} />
            <circle cx={18} cy={5} r={2.5} fill={colour} />
          </>
        ) : (
          <line
            x1={1}
            x2={23}
            y1={5}
            y2={5}
            stroke={colour}
            strokeWidth={2}
            strokeDasharray={dashed ? '6 4' : undefined}
          />
        )}
      </Box>
      <Typography variant="caption">{children}</Typography>
    </Stack>
  );
}

const diffPct = (measured: number, model: number): string =>
  model > 0 ? formatPct(((measured - model) / model) * 100) : '—';

/** The comparison a technician reads: force at sag and near the end, friction band, bump stop. */
export function RunComparisonTable({ run, prefs }: { run: CurveRun; prefs: UnitPrefs }) {
  const c = run.comparison;
  if (!c)
    return (
      <Typography variant="body2" color="text.secondary">
        No comparison with the model for this run.
      </Typography>
    );
  return (
    <Table
      size="small"
      aria-label={`${run.label}: measured against the model`}
      className="report-table"
      sx={compactCells}
    >
      <TableHead>
        <TableRow>
          <TableCell>At</TableCell>
          <TableCell align="right">Measured</TableCell>
          <TableCell align="right">Model</TableCell>
          <TableCell align="right">Difference</TableCell>
        </TableRow>
      </TableHead>
      <TableBody>
        <TableRow>
          <TableCell component="th" scope="row">
            Sag ({formatLength(c.sagTravelMm, prefs)})
          </TableCell>
          <TableCell align="right">{formatForceN(c.measuredAtSagN, prefs)}</TableCell>
          <TableCell align="right">{formatForceN(c.modelAtSagN, prefs)}</TableCell>
          <TableCell align="right">{diffPct(c.measuredAtSagN, c.modelAtSagN)}</TableCell>
        </TableRow>
        <TableRow>
          <TableCell component="th" scope="row">
            Near the end ({formatLength(c.endTravelMm, prefs)})
          </TableCell>
          <TableCell align="right">{formatForceN(c.measuredAtEndN, prefs)}</TableCell>
          <TableCell align="right">{formatForceN(c.modelAtEndN, prefs)}</TableCell>
          <TableCell align="right">{diffPct(c.measuredAtEndN, c.modelAtEndN)}</TableCell>
        </TableRow>
        <TableRow>
          <TableCell component="th" scope="row">
            Friction band
          </TableCell>
          <TableCell align="right" colSpan={3}>
            ± {formatForceN(c.frictionBandN, prefs)} (half the gap between compression and rebound,
            mid-travel)
          </TableCell>
        </TableRow>
        <TableRow>
          <TableCell component="th" scope="row">
            Bump stop
          </TableCell>
          <TableCell align="right" colSpan={3} data-testid="bump-stop">
            {c.bumpStopMm === null
              ? 'none: the curve follows the model to the end'
              : `at ${formatLength(c.bumpStopMm, prefs)}, where the curve leaves the model`}
          </TableCell>
        </TableRow>
      </TableBody>
    </Table>
  );
}

/** One bench run: what it was run at, the chart against the model, and the comparison in numbers. */
export function RunCard({ run, prefs, actions }: { run: CurveRun; prefs: UnitPrefs; actions?: ReactNode }) {
  const title = `${run.label}: force against travel`;
  const hasModel = (run.comparison?.model.length ?? 0) > 1;
  return (
    <Box
      component="article"
      aria-label={run.label}
      className="report-run"
      sx={{
        border: 1,
        borderColor: 'divider',
        borderRadius: 2.5,
        p: { xs: 1.25, sm: 2 },
        bgcolor: 'background.paper',
      }}
    >
      <Stack direction="row" sx={{ justifyContent: 'space-between', alignItems: 'flex-start', gap: 1 }}>
        <Box>
          <Typography variant="subtitle1" component="h4" sx={{ fontWeight: 700 }}>
            {run.label}
          </Typography>
          <Typography variant="body2" color="text.secondary">
            {runSettingsText(run, prefs)} · file in {run.units.travel} and {run.units.force} ·{' '}
            {run.points.length} points
          </Typography>
        </Box>
        {actions}
      </Stack>
      <Suspense fallback={<Skeleton variant="rounded" height={280} sx={{ my: 1 }} />}>
        <RunChart run={run} prefs={prefs} title={title} />
      </Suspense>
      <Stack
        component="ul"
        direction="row"
        useFlexGap
        spacing={2}
        sx={{ flexWrap: 'wrap', listStyle: 'none', p: 0, m: 0, mb: 1 }}
        aria-label="Key"
      >
        <Key colour={RUN_COLOURS.compression} dot>
          Measured, compression
        </Key>
        <Key colour={RUN_COLOURS.rebound} dot>
          Measured, rebound
        </Key>
        {hasModel && (
          <>
            <Key colour={RUN_COLOURS.modelCompression}>Model, compression</Key>
            <Key colour={RUN_COLOURS.modelRebound} dashed>
              Model, rebound
            </Key>
          </>
        )}
      </Stack>
      <RunComparisonTable run={run} prefs={prefs} />
    </Box>
  );
}
