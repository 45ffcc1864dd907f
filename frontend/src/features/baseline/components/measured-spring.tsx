import StraightenIcon from '@mui/icons-material/Straighten';
import Box from '@mui/material/Box';
import Typography from '@mui/material/Typography';
import type { PartResult } from '@loamline/shared-types';
import { formatNumber, type UnitPrefs } from '@/lib/units';
import { pine } from '@/theme/primitives';
import { formatPsi } from './pressure-text';

/**
 * On a result computed for a bike with a measured spring (issue 11): the server names the
 * measurement and says what the default geometry would have given.
 *
 * The shared contract gains `measuredSpring` on the fork and shock results in the same issue; until
 * it lands in shared-types it is read here as optional, so results without it are unchanged.
 */
export interface MeasuredSpringNote {
  /** "measured on 2 December 2026 at <shop>" */
  label: string;
  /** what the default geometry would have given, gauge psi */
  defaultPressurePsi: number;
  /** how far that default is from this result's pressure, % */
  differencePct: number;
}

export const measuredSpringOf = (r: PartResult): MeasuredSpringNote | null =>
  (r as PartResult & { measuredSpring?: MeasuredSpringNote | null }).measuredSpring ?? null;

/** "Geometry measured on … at …" and how far the default would have been off. */
export function MeasuredSpring({
  part,
  result,
  units,
}: {
  part: string;
  result: PartResult;
  units: UnitPrefs;
}) {
  const m = measuredSpringOf(result);
  if (!m) return null;
  const psi = result.pressure?.psi ?? null;
  const off = Math.abs(m.differencePct);
  const direction =
    psi === null || Math.round(m.defaultPressurePsi) === Math.round(psi)
      ? null
      : m.defaultPressurePsi > psi
        ? 'too high'
        : 'too low';
  return (
    <Box
      data-testid={`${part}-measured-spring`}
      sx={{
        display: 'flex',
        gap: 1,
        alignItems: 'flex-start',
        border: 1,
        borderColor: pine[300],
        borderRadius: 2.5,
        p: 1.5,
        bgcolor: pine[50],
      }}
    >
      <StraightenIcon aria-hidden sx={{ color: pine[700], mt: 0.25 }} />
      <Box>
        <Typography variant="body2" sx={{ fontWeight: 700, color: pine[900] }}>
          Geometry {m.label}
        </Typography>
        <Typography variant="body2" sx={{ color: pine[900] }}>
          This baseline starts from your bike’s measured spring. Loamline’s default geometry would have said{' '}
          {formatPsi(m.defaultPressurePsi, units.pressure)}
          {direction
            ? `: ${formatNumber(off, 1)} % ${direction}`
            : `, a difference of ${formatNumber(off, 1)} %`}
          .
        </Typography>
      </Box>
    </Box>
  );
}
