import type { BaselineWarning, PartResult, WarningSeverity } from '@loamline/shared-types';
import BlockIcon from '@mui/icons-material/Block';
import InfoOutlinedIcon from '@mui/icons-material/InfoOutlined';
import WarningAmberIcon from '@mui/icons-material/WarningAmber';
import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import Stack from '@mui/material/Stack';
import type { UnitPrefs } from '@/lib/units';
import { riderText } from './plain-text';
import { formatPsi } from './pressure-text';

/*
 * Warnings in three levels (the contract's `severity`): an `error` is a value past a maximum or an
 * impossible one, and blocks: it comes before the number it is about, and that number is not shown
 * as something to pump. A `warning` asks the rider to act or check; an `info` is advice. Sheets
 * saved before severities existed have none: those read as `warning`.
 */

/** Read by screen readers, not shown. */
export const visuallyHidden = {
  border: 0,
  clip: 'rect(0 0 0 0)',
  height: '1px',
  margin: '-1px',
  overflow: 'hidden',
  padding: 0,
  position: 'absolute',
  whiteSpace: 'nowrap',
  width: '1px',
} as const;

const ORDER: Record<WarningSeverity, number> = { error: 0, warning: 1, info: 2 };

/** A warning's level; a missing one (an old sheet) is a `warning`. */
export function severityOf(w: { severity?: unknown }): WarningSeverity {
  const s = w.severity;
  return s === 'error' || s === 'warning' || s === 'info' ? s : 'warning';
}

/** Errors first, then warnings, then advice; the server's order within a level. */
export function sortWarnings<W extends { severity?: unknown }>(warnings: readonly W[]): W[] {
  return warnings
    .map((w, i) => ({ w, i }))
    .sort((a, b) => ORDER[severityOf(a.w)] - ORDER[severityOf(b.w)] || a.i - b.i)
    .map(({ w }) => w);
}

/** True when any warning blocks (an `error`): the number it is about is not an instruction. */
export const isBlocked = (warnings: readonly { severity?: unknown }[]): boolean =>
  warnings.some((w) => severityOf(w) === 'error');

/** A rated maximum as the warnings mean it: which chamber, its value, and whose number it is. */
export interface MaxInfo {
  chamber: 'fork' | 'end-stroke' | 'shock';
  psi: number;
  isDefault: boolean;
}

const CHAMBER: Record<MaxInfo['chamber'], string> = {
  fork: "the fork's main chamber",
  'end-stroke': "the fork's end-stroke chamber",
  shock: 'the shock',
};

/** "the fork's main chamber maximum, 150 psi (Loamline's default …)" in plain words. */
export function describeMax(m: MaxInfo, unit: UnitPrefs['pressure']): string {
  const whose = m.isDefault
    ? `Loamline's default, not your ${m.chamber === 'shock' ? 'shock' : 'fork'}'s own: use the maximum printed on it or in its manual if it is lower`
    : 'the maximum you entered';
  return `the maximum for ${CHAMBER[m.chamber]} is ${formatPsi(m.psi, unit)} (${whose})`;
}

/** The maxima of one part's result, for its warnings. */
export function maximaOf(part: 'fork' | 'shock', r: PartResult): { main?: MaxInfo; endStroke?: MaxInfo } {
  const out: { main?: MaxInfo; endStroke?: MaxInfo } = {};
  // a sheet saved before maxima existed has none: nothing is said about them then
  const p = r.pressure as { maxPsi?: number; maxIsDefault?: boolean } | null;
  if (p && typeof p.maxPsi === 'number')
    out.main = { chamber: part, psi: p.maxPsi, isDefault: p.maxIsDefault !== false };
  const e = r.endStroke ?? null;
  if (e && typeof e.maxPsi === 'number')
    out.endStroke = { chamber: 'end-stroke', psi: e.maxPsi, isDefault: e.maxIsDefault !== false };
  return out;
}

/** Which maximum a warning is about, read from its stable code. */
function maxFor(code: string, maxima: { main?: MaxInfo; endStroke?: MaxInfo }): MaxInfo | undefined {
  if (!/max/.test(code)) return undefined;
  return /end-stroke/.test(code) ? maxima.endStroke : maxima.main;
}

function titleFor(
  w: BaselineWarning,
  severity: WarningSeverity,
  max: MaxInfo | undefined,
  unit: UnitPrefs['pressure'],
): string | null {
  if (max && severity === 'error') return `Don't pump past ${formatPsi(max.psi, unit)}`;
  if (max && /range/.test(w.code)) return `Stay at or below ${formatPsi(max.psi, unit)}`;
  if (severity === 'error') return 'Not safe as it is';
  return null;
}

const capitalise = (s: string): string => s.charAt(0).toUpperCase() + s.slice(1);

const LEVEL_WORD: Record<WarningSeverity, string> = {
  error: 'Stop:',
  warning: 'Warning:',
  info: 'Note:',
};

/**
 * A part's warnings, errors first. Errors are filled red with a title and `role="alert"`; warnings
 * amber; advice outlined. Each says its level in words for screen readers, and a message about a
 * maximum says which maximum it means and whose number it is.
 */
export function WarningList({
  warnings,
  maxima = {},
  units,
  only,
}: {
  warnings: readonly BaselineWarning[];
  maxima?: { main?: MaxInfo; endStroke?: MaxInfo };
  units: UnitPrefs;
  /** show only these levels (e.g. the errors above a number, the rest below it) */
  only?: readonly WarningSeverity[];
}) {
  const shown = sortWarnings(warnings).filter((w) => !only || only.includes(severityOf(w)));
  if (!shown.length) return null;
  return (
    <Stack spacing={1} className="warning-list">
      {shown.map((w, i) => {
        const severity = severityOf(w);
        const max = maxFor(w.code, maxima);
        const title = titleFor(w, severity, max, units.pressure);
        // the server's message names the maximum it means; an older one may not: then say it here
        const maxLine =
          max && !/maximum/i.test(w.message) ? ` ${capitalise(describeMax(max, units.pressure))}.` : '';
        return (
          <Alert
            key={`${w.code}-${i}`}
            severity={severity}
            variant={severity === 'error' ? 'filled' : severity === 'warning' ? 'standard' : 'outlined'}
            role={severity === 'error' ? 'alert' : 'note'}
            data-severity={severity}
            icon={
              severity === 'error' ? (
                <BlockIcon />
              ) : severity === 'warning' ? (
                <WarningAmberIcon />
              ) : (
                <InfoOutlinedIcon />
              )
            }
            sx={severity === 'error' ? { fontWeight: 500 } : undefined}
          >
            {title && <AlertTitle sx={{ fontWeight: 700 }}>{title}</AlertTitle>}
            <Box component="span" sx={visuallyHidden}>
              {LEVEL_WORD[severity]}{' '}
            </Box>
            {riderText(w.message, units)}
            {maxLine}
          </Alert>
        );
      })}
    </Stack>
  );
}

/** Whether an error is about the end-stroke chamber (its code says so) rather than the main spring. */
const aboutEndStroke = (w: { code: string }): boolean => /end-stroke/.test(w.code);

/**
 * What a part's numbers may be shown as. `mainBlocked`: the main pressure is not an instruction to
 * pump (an error about it, no pressure at all, or a pressure past its maximum, even if no warning
 * said so). `endStrokeBlocked`: the same for the end-stroke chamber's pressure.
 */
export function pressureSafety(r: PartResult): { mainBlocked: boolean; endStrokeBlocked: boolean } {
  const errors = r.warnings.filter((w) => severityOf(w) === 'error');
  const { main, endStroke } = maximaOf('fork', r);
  const p = r.pressure;
  const e = r.endStroke ?? null;
  return {
    mainBlocked:
      errors.some((w) => !aboutEndStroke(w)) ||
      (!!p && !!main && p.psi > main.psi + 1e-9) ||
      (!!p && p.psi < 0),
    endStrokeBlocked:
      !!e && (errors.some(aboutEndStroke) || (!!endStroke && e.psi > endStroke.psi + 1e-9) || e.psi < 0),
  };
}
