import type { CurveOverlay, PartResult, ShockResult } from '@loamline/shared-types';
import Box from '@mui/material/Box';
import Card from '@mui/material/Card';
import CardContent from '@mui/material/CardContent';
import Stack from '@mui/material/Stack';
import Table from '@mui/material/Table';
import TableBody from '@mui/material/TableBody';
import TableCell from '@mui/material/TableCell';
import TableHead from '@mui/material/TableHead';
import TableRow from '@mui/material/TableRow';
import Typography from '@mui/material/Typography';
import type { ReactNode } from 'react';
import { formatNumber, formatQuantity, nPerMmToLbPerIn, type UnitPrefs } from '@/lib/units';
import { pine } from '@/theme/primitives';
import { formatPsi, formatPsiRange, otherPressure } from './pressure-text';
import {
  CurveSwatch,
  curveStyles,
  formatForce,
  SpringCurveChart,
  type CurveStyle,
} from './spring-curve-chart';
import { MeasuredSpring } from './measured-spring';
import { maximaOf, pressureSafety, WarningList } from './warnings';

export { formatPsi, formatPsiRange } from './pressure-text';

const isShock = (r: PartResult): r is ShockResult => 'leverageRatio' in r;

function Figure({
  label,
  value,
  sub,
  muted,
}: {
  label: string;
  value: ReactNode;
  sub?: ReactNode;
  /** a number that is not an instruction (past a maximum): greyed, smaller */
  muted?: boolean;
}) {
  return (
    <Box sx={{ minWidth: 0 }}>
      <Typography
        variant="overline"
        sx={{ lineHeight: 1.6, display: 'block', color: muted ? 'error.dark' : 'text.secondary' }}
      >
        {label}
      </Typography>
      <Typography
        component="div"
        sx={{
          fontSize: muted ? { xs: '1.3rem', sm: '1.5rem' } : { xs: '1.9rem', sm: '2.2rem' },
          fontWeight: 700,
          lineHeight: 1.1,
          color: muted ? 'text.secondary' : pine[700],
        }}
      >
        {value}
      </Typography>
      {sub && (
        <Typography variant="body2" color="text.secondary" sx={{ mt: 0.5 }}>
          {sub}
        </Typography>
      )}
    </Box>
  );
}

/** "your maximum" or "Loamline's default maximum", for the line under a pressure. */
const maxWords = (psi: number, isDefault: boolean, unit: UnitPrefs['pressure']): string =>
  `max ${formatPsi(psi, unit)} (${isDefault ? 'default: check yours' : 'yours'})`;

/** The main chamber's pressure: an instruction when safe; otherwise worked out, not to be set. */
function PressureFigure({ part, result, units }: { part: string; result: PartResult; units: UnitPrefs }) {
  const p = result.pressure;
  const { mainBlocked } = pressureSafety(result);
  if (!p) {
    return (
      <Figure
        label="No safe pressure"
        muted
        value={<span data-testid={`${part}-pressure`}>—</span>}
        sub="No pressure in this spring carries you at the target sag: see the message above."
      />
    );
  }
  const max = typeof p.maxPsi === 'number' ? p.maxPsi : undefined;
  const [lo, hi] = p.rangePsi;
  const capped = max !== undefined && hi > max;
  // in the rider's unit first, then the other (bar as the server rounded it, when it gave one)
  const rangeIn = (unit: UnitPrefs['pressure']): string =>
    capped ? formatPsiRange([lo, max], unit) : formatPsiRange(p.rangePsi, unit, p.rangeBar);
  const range = (
    <>
      {rangeIn(units.pressure)}
      <span className="sheet-screen-only"> ({rangeIn(otherPressure(units.pressure))})</span>
      {capped ? ', never past the maximum' : ''}
    </>
  );
  const atRide = typeof p.atRidePsi === 'number' ? p.atRidePsi : null;
  return (
    <Figure
      label={mainBlocked ? 'Worked out: do not set' : atRide !== null ? 'Set at the pump' : 'Start at'}
      muted={mainBlocked}
      value={
        <span data-testid={`${part}-pressure`} data-blocked={mainBlocked || undefined}>
          {formatPsi(p.psi, units.pressure)}
        </span>
      }
      sub={
        <>
          {formatPsi(p.psi, otherPressure(units.pressure))}
          {!mainBlocked && (
            <>
              <br />
              range {range}
            </>
          )}
          {atRide !== null && !mainBlocked && (
            <>
              <br />
              <span data-testid={`${part}-at-ride`}>
                reads {formatPsi(atRide, units.pressure)} where you ride
              </span>
            </>
          )}
          {max !== undefined && (
            <>
              <br />
              {maxWords(max, p.maxIsDefault !== false, units.pressure)}
            </>
          )}
        </>
      }
    />
  );
}

/** A fork's end-stroke chamber: the rider's pressure or the recommended one, and its maximum. */
function EndStrokeFigure({ result, units }: { result: PartResult; units: UnitPrefs }) {
  const e = result.endStroke;
  if (!e) return null;
  const { endStrokeBlocked } = pressureSafety(result);
  const recommendedDiffers = e.given && Math.round(e.recommendedPsi) !== Math.round(e.psi);
  return (
    <Figure
      label={
        endStrokeBlocked
          ? 'End-stroke: do not set'
          : e.given
            ? 'End-stroke (yours)'
            : 'End-stroke (recommended)'
      }
      muted={endStrokeBlocked}
      value={<span data-testid="fork-end-stroke">{formatPsi(e.psi, units.pressure)}</span>}
      sub={
        <>
          {formatPsi(e.psi, otherPressure(units.pressure))}
          {recommendedDiffers && (
            <>
              <br />
              recommended {formatPsi(e.recommendedPsi, units.pressure)}
            </>
          )}
          <br />
          {maxWords(e.maxPsi, e.maxIsDefault, units.pressure)}
        </>
      }
    />
  );
}

/** The figures a curious rider or a technician wants, in plain words with units. */
function NumbersBehindIt({ result, units }: { result: PartResult | ShockResult; units: UnitPrefs }) {
  const shock = isShock(result) ? result : null;
  const lb = units.mass === 'lb';
  const rows: [string, string][] = [['Load on the spring at sag', formatForce(result.loadN, units)]];
  if (typeof result.rateAtSagNPerMm === 'number') {
    rows.push([
      'Stiffness at sag',
      lb
        ? `${formatNumber(nPerMmToLbPerIn(result.rateAtSagNPerMm), 0)} lb/in`
        : `${formatNumber(result.rateAtSagNPerMm, 1)} N/mm`,
    ]);
  }
  if (typeof result.energyToFullTravelJ === 'number') {
    rows.push(['Energy it stores to full travel', `${formatNumber(result.energyToFullTravelJ, 0)} J`]);
  }
  const multiple = result.loadN > 0 ? result.hardLandingLoadN / result.loadN : Number.NaN;
  rows.push([
    'Hard-landing load',
    `${formatForce(result.hardLandingLoadN, units)}${Number.isFinite(multiple) ? ` (${formatNumber(multiple, 1)}×)` : ''}`,
  ]);
  rows.push(['Progression (force at 90 % ÷ at sag)', `${formatNumber(result.progression, 1)}×`]);
  if (shock) {
    rows.push([
      shock.leverageRatioIsAverage === false ? 'Leverage ratio at sag (yours)' : 'Leverage ratio (average)',
      formatNumber(shock.leverageRatio, 2),
    ]);
  }
  return (
    <Box className="sheet-screen-only">
      <Typography variant="subtitle2" component="h4" sx={{ fontWeight: 700, color: pine[700], mb: 0.5 }}>
        The numbers behind it
      </Typography>
      <Box
        component="dl"
        sx={{
          m: 0,
          display: 'grid',
          gridTemplateColumns: 'minmax(0, 1fr) auto',
          columnGap: 2,
          rowGap: 0.25,
          fontSize: '0.875rem',
          '& dt': { color: 'text.secondary' },
          '& dd': { m: 0, fontWeight: 500, textAlign: 'right' },
        }}
      >
        {rows.map(([k, v]) => (
          <Box key={k} sx={{ display: 'contents' }}>
            <dt>{k}</dt>
            <dd>{v}</dd>
          </Box>
        ))}
      </Box>
    </Box>
  );
}

interface TravelRow {
  key: string;
  /** a row the groups above already show (left off paper) */
  screenOnly?: boolean;
  label: string;
  mark?: string;
  style: CurveStyle;
  used: number;
  progression: number;
}

/**
 * Travel used on a hard landing, ordered the way a rider would change things: spacer counts from
 * none up (the fitted count marked), then end-stroke pressures from low to high (the one in use
 * marked, yours or recommended), then the hard landing as set.
 */
export function travelRows(
  result: PartResult,
  units: UnitPrefs,
  fittedSpacers?: number,
): { group: string; rows: TravelRow[] }[] {
  const styles = curveStyles(result, units, fittedSpacers);
  const hitIndex = result.overlays.findIndex((o) => o.kind === 'fast-hit');
  const asSet: TravelRow =
    hitIndex >= 0
      ? {
          key: 'as-set',
          label: styles[hitIndex + 1].label,
          style: styles[hitIndex + 1],
          used: result.overlays[hitIndex].travelUsedMm,
          progression: result.overlays[hitIndex].progression,
        }
      : {
          key: 'as-set',
          label: 'This baseline',
          style: styles[0],
          used: result.travelUsedMm,
          progression: result.progression,
        };
  const row = (o: CurveOverlay, i: number): TravelRow => ({
    key: `overlay-${i}`,
    label: styles[i + 1].label,
    style: styles[i + 1],
    used: o.travelUsedMm,
    progression: o.progression,
  });
  const groups: { group: string; rows: TravelRow[] }[] = [];

  const spacerRows = result.overlays
    .map((o, i) => ({ n: o.spacers ?? 0, r: row(o, i), kind: o.kind }))
    .filter((x) => x.kind === 'spacers');
  if (spacerRows.length) {
    if (fittedSpacers !== undefined) {
      spacerRows.push({
        n: fittedSpacers,
        kind: 'spacers',
        r: {
          ...asSet,
          key: 'spacers-now',
          label: `${fittedSpacers} spacer${fittedSpacers === 1 ? '' : 's'}`,
          mark: 'fitted now',
        },
      });
    }
    spacerRows.sort((a, b) => a.n - b.n);
    groups.push({ group: 'Volume spacers', rows: spacerRows.map((x) => x.r) });
  }

  const e = result.endStroke ?? null;
  const endRows = result.overlays
    .map((o, i) => ({ o, r: row(o, i) }))
    .filter(({ o }) => o.kind === 'end-stroke')
    .map(({ o, r }) => ({
      psi: o.endStrokePsi ?? 0,
      r: e && o.endStrokePsi === e.recommendedPsi && e.given ? { ...r, mark: 'recommended' } : r,
    }));
  if (e) {
    endRows.push({
      psi: e.psi,
      r: {
        ...asSet,
        key: 'end-stroke-now',
        label: `End-stroke ${formatPsi(e.psi, units.pressure)}`,
        mark: e.given ? 'yours, as set' : 'recommended, as set',
      },
    });
  }
  if (endRows.length) {
    endRows.sort((a, b) => a.psi - b.psi);
    groups.push({ group: 'End-stroke pressure', rows: endRows.map((x) => x.r) });
  }
  groups.push({ group: 'As set', rows: [{ ...asSet, screenOnly: groups.length > 0 }] });
  return groups;
}

function TravelTable({
  result,
  units,
  fittedSpacers,
}: {
  result: PartResult;
  units: UnitPrefs;
  fittedSpacers?: number;
}) {
  const groups = travelRows(result, units, fittedSpacers);
  return (
    <Box>
      <Table
        size="small"
        aria-label="Travel used on a hard landing"
        sx={{
          '& .MuiTableCell-root': { px: 0.75, fontSize: '0.85rem' },
          '& .MuiTableCell-head': { fontWeight: 700 },
        }}
      >
        <TableHead>
          <TableRow>
            <TableCell sx={{ pl: '0 !important' }}>If you set</TableCell>
            <TableCell align="right">Travel used</TableCell>
            <TableCell align="right">Progres&shy;sion</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {groups.map((g) => [
            groups.length > 1 && (
              <TableRow key={`group-${g.group}`} className="sheet-screen-only">
                <TableCell
                  colSpan={3}
                  component="th"
                  scope="colgroup"
                  sx={{ pl: '0 !important', pt: 1.5, fontWeight: 700, color: pine[700], borderBottom: 0 }}
                >
                  {g.group}
                </TableCell>
              </TableRow>
            ),
            ...g.rows.map((r) => {
              const bottoms = r.used >= result.travelMm - 0.5;
              return (
                <TableRow
                  key={`${g.group}-${r.key}`}
                  data-mark={r.mark}
                  className={r.screenOnly ? 'sheet-screen-only' : undefined}
                >
                  <TableCell sx={{ pl: '0 !important' }}>
                    <Box sx={{ display: 'flex', alignItems: 'center', gap: 1 }}>
                      <CurveSwatch style={r.style} />
                      <span>
                        {r.label}
                        {r.mark && (
                          <Box
                            component="span"
                            className="sheet-mark"
                            sx={{ display: 'block', fontSize: '0.75rem', fontWeight: 700, color: pine[700] }}
                          >
                            ◆ {r.mark}
                          </Box>
                        )}
                      </span>
                    </Box>
                  </TableCell>
                  <TableCell align="right" sx={{ whiteSpace: 'nowrap' }}>
                    {formatQuantity('length', r.used, units)}
                    {bottoms && (
                      <Box
                        component="span"
                        className="sheet-bottoms"
                        sx={{ display: 'block', color: 'warning.dark', fontSize: '0.75rem' }}
                      >
                        bottoms out
                      </Box>
                    )}
                  </TableCell>
                  <TableCell align="right">{formatNumber(r.progression, 1)}×</TableCell>
                </TableRow>
              );
            }),
          ])}
        </TableBody>
      </Table>
      <Typography
        variant="caption"
        color="text.secondary"
        sx={{ display: 'block', mt: 1 }}
        className="sheet-note"
      >
        Travel used on a hard landing ({formatForce(result.hardLandingLoadN, units)}), out of{' '}
        {formatQuantity('length', result.travelMm, units)}.{' '}
        <span className="sheet-screen-only">
          Progression: the force at 90 % of travel ÷ the force at sag.{' '}
        </span>
        {result.pressure && (
          <span className="sheet-screen-only">
            Spacers and end-stroke pressure leave the start of the curve alone and firm up its end.
          </span>
        )}
      </Typography>
    </Box>
  );
}

/**
 * One part's baseline: its warnings first (errors, then warnings, then advice), then sag and the
 * pressure or coil rate (a pressure past a maximum is shown as worked out, not as one to set), the
 * numbers behind it, the curve and the travel-used table.
 */
export function PartResultCard({
  part,
  result,
  units,
  fittedSpacers,
}: {
  part: 'fork' | 'shock';
  result: PartResult | ShockResult;
  units: UnitPrefs;
  /** the spacers fitted now (from the input), to mark them in the table */
  fittedSpacers?: number;
}) {
  const title = part === 'fork' ? 'Fork' : 'Rear shock';
  const shock = isShock(result) ? result : null;
  const air = !result.coilRate;
  return (
    <Card component="section" aria-labelledby={`${part}-result-title`} className="sheet-part">
      <CardContent>
        <Stack spacing={2.5}>
          <Typography variant="h3" id={`${part}-result-title`}>
            {title}
          </Typography>
          <WarningList warnings={result.warnings} maxima={maximaOf(part, result)} units={units} />
          <MeasuredSpring part={part} result={result} units={units} />
          <Box
            className="sheet-figures"
            sx={{ display: 'grid', gridTemplateColumns: { xs: '1fr 1fr' }, gap: 2 }}
          >
            {result.coilRate ? (
              <Figure
                label="Spring rate"
                value={
                  <span data-testid={`${part}-coil-rate`}>
                    {formatNumber(result.coilRate.lbPerIn, 0)} lb/in
                  </span>
                }
                sub={
                  <>
                    {formatNumber(result.coilRate.nPerMm, 1)} N/mm
                    <br />
                    nearest stocked: <b>{formatNumber(result.coilRate.suggestedLbPerIn, 0)} lb/in</b>
                  </>
                }
              />
            ) : air ? (
              <PressureFigure part={part} result={result} units={units} />
            ) : (
              <Figure label="Start at" value="—" />
            )}
            <Figure
              label={shock ? 'Sag at the shock' : 'Target sag'}
              value={formatQuantity('length', result.targetSagMm, units)}
              sub={
                <>
                  {formatNumber(result.targetSagPct, 0)} % of {shock ? 'stroke' : 'travel'}
                  {shock && (
                    <>
                      <br />
                      {formatQuantity('length', shock.wheelSagMm, units)} at the wheel
                    </>
                  )}
                </>
              }
            />
            {result.endStroke && <EndStrokeFigure result={result} units={units} />}
          </Box>
          <NumbersBehindIt result={result} units={units} />
          {result.curve.length > 1 && (
            <SpringCurveChart
              result={result}
              units={units}
              fittedSpacers={fittedSpacers}
              title={`${title}: force against travel`}
            />
          )}
          <TravelTable result={result} units={units} fittedSpacers={fittedSpacers} />
        </Stack>
      </CardContent>
    </Card>
  );
}
