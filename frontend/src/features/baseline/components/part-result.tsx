import type { PartResult, ShockResult } from '@loamline/shared-types';
import WarningAmberIcon from '@mui/icons-material/WarningAmber';
import Alert from '@mui/material/Alert';
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
import { formatNumber, formatQuantity, psiToBar, type UnitPrefs } from '@/lib/units';
import { formatForce, overlayColours, overlayLabel, SpringCurveChart } from './spring-curve-chart';
import { pine } from '@/theme/primitives';

/** A pressure as a pump reads it: whole psi, or bar to 0.1. */
export function formatPsi(psi: number, unit: UnitPrefs['pressure']): string {
  return unit === 'bar' ? `${formatNumber(psiToBar(psi), 1)} bar` : `${formatNumber(psi, 0)} psi`;
}
/** The other unit, for the line under the big number. */
const otherPressure = (unit: UnitPrefs['pressure']): UnitPrefs['pressure'] =>
  unit === 'bar' ? 'psi' : 'bar';

export function formatPsiRange([lo, hi]: [number, number], unit: UnitPrefs['pressure']): string {
  return unit === 'bar'
    ? `${formatNumber(psiToBar(lo), 1)}–${formatNumber(psiToBar(hi), 1)} bar`
    : `${formatNumber(lo, 0)}–${formatNumber(hi, 0)} psi`;
}

const isShock = (r: PartResult): r is ShockResult => 'leverageRatio' in r;

function Figure({ label, value, sub }: { label: string; value: ReactNode; sub?: ReactNode }) {
  return (
    <Box sx={{ minWidth: 0 }}>
      <Typography variant="overline" color="text.secondary" sx={{ lineHeight: 1.6, display: 'block' }}>
        {label}
      </Typography>
      <Typography
        component="div"
        sx={{ fontSize: { xs: '1.9rem', sm: '2.2rem' }, fontWeight: 700, lineHeight: 1.1, color: pine[700] }}
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

/** Travel used under the hard landing and the progression, for the baseline and each overlay. */
function OverlayTable({ result, units }: { result: PartResult; units: UnitPrefs }) {
  const colours = overlayColours(result.overlays);
  const rows = [
    { label: 'This baseline', colour: pine[500], used: result.travelUsedMm, progression: result.progression },
    ...result.overlays.map((o, i) => ({
      label: overlayLabel(o, units),
      colour: colours[i],
      used: o.travelUsedMm,
      progression: o.progression,
    })),
  ];
  const multiple = result.loadN > 0 ? result.hardLandingLoadN / result.loadN : Number.NaN;
  return (
    <Box>
      <Table
        size="small"
        aria-label="Travel used and progression"
        sx={{
          '& .MuiTableCell-root': { px: 0.75, fontSize: '0.85rem' },
          '& .MuiTableCell-head': { fontWeight: 700, whiteSpace: 'nowrap' },
        }}
      >
        <TableHead>
          <TableRow>
            <TableCell sx={{ pl: '0 !important' }}>Setting</TableCell>
            <TableCell align="right">Travel used</TableCell>
            <TableCell align="right">Progression</TableCell>
          </TableRow>
        </TableHead>
        <TableBody>
          {rows.map((r) => {
            const bottoms = r.used >= result.travelMm - 0.5;
            return (
              <TableRow key={r.label}>
                <TableCell sx={{ pl: '0 !important' }}>
                  <Box sx={{ display: 'flex', alignItems: 'center', gap: 1 }}>
                    <Box
                      aria-hidden
                      sx={{ width: 14, height: 4, borderRadius: 2, bgcolor: r.colour, flex: '0 0 auto' }}
                    />
                    {r.label}
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
          })}
        </TableBody>
      </Table>
      <Typography
        variant="caption"
        color="text.secondary"
        sx={{ display: 'block', mt: 1 }}
        className="sheet-note"
      >
        Travel used under a hard landing of {formatForce(result.hardLandingLoadN, units)}
        {Number.isFinite(multiple) && ` (${formatNumber(multiple, 1)} × the load at sag)`}, out of{' '}
        {formatQuantity('length', result.travelMm, units)}. Progression: the force at 90 % of travel ÷ the
        force at sag.{' '}
        {result.pressure && (
          <span className="sheet-screen-only">
            Spacers and end-stroke pressure leave the start of the curve alone and firm up its end.
          </span>
        )}
      </Typography>
    </Box>
  );
}

/** Warnings that are advice about the setting rather than a problem with it: shown quieter. */
const ADVICE_CODES = new Set(['bottoms-out-on-hard-landing', 'temperature-offset']);

/** One part's baseline: warnings first, then sag, pressure or coil rate, the curve and its table. */
export function PartResultCard({
  part,
  result,
  units,
}: {
  part: 'fork' | 'shock';
  result: PartResult | ShockResult;
  units: UnitPrefs;
}) {
  const title = part === 'fork' ? 'Fork' : 'Rear shock';
  const shock = isShock(result) ? result : null;
  return (
    <Card component="section" aria-labelledby={`${part}-result-title`} className="sheet-part">
      <CardContent>
        <Stack spacing={2.5}>
          <Typography variant="h3" id={`${part}-result-title`}>
            {title}
          </Typography>
          {result.warnings.map((w) =>
            ADVICE_CODES.has(w.code) ? (
              <Alert key={w.code} severity="info" variant="outlined">
                {w.message}
              </Alert>
            ) : (
              <Alert
                key={w.code}
                severity="warning"
                icon={<WarningAmberIcon />}
                variant="filled"
                sx={{ fontWeight: 500 }}
              >
                {w.message}
              </Alert>
            ),
          )}
          <Box
            sx={{
              display: 'grid',
              gridTemplateColumns: { xs: '1fr 1fr' },
              gap: 2,
            }}
          >
            {result.pressure ? (
              <Figure
                label="Start at"
                value={
                  <span data-testid={`${part}-pressure`}>
                    {formatPsi(result.pressure.psi, units.pressure)}
                  </span>
                }
                sub={
                  <>
                    {formatPsi(result.pressure.psi, otherPressure(units.pressure))}
                    <br />
                    range {formatPsiRange(result.pressure.rangePsi, units.pressure)}
                  </>
                }
              />
            ) : result.coilRate ? (
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
          </Box>
          <Typography variant="body2" color="text.secondary" className="sheet-screen-only">
            Load on the spring at sag {formatForce(result.loadN, units)}
            {shock && ` · leverage ratio ${formatNumber(shock.leverageRatio, 2)} (wheel travel ÷ stroke)`} ·
            travel {formatQuantity('length', result.travelMm, units)}
          </Typography>
          {result.curve.length > 1 && (
            <SpringCurveChart result={result} units={units} title={`${title}: force against travel`} />
          )}
          <OverlayTable result={result} units={units} />
        </Stack>
      </CardContent>
    </Card>
  );
}
