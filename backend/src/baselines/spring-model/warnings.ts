import type { BaselineWarning, CurveOverlay, WarningSeverity } from '@loamline/shared-types';
import { BOTTOM_OUT_TOLERANCE_MM, HARD_LANDING_MULTIPLE, LEVERAGE_RATIO_BAND, SAG_WARN_BAND } from './policy';
import type { Part, ResolvedPart } from './resolve';

/**
 * Warnings and advice, each with a severity: `error` for a value past a maximum or impossible
 * (blocking: shown before the number), `warning` for what the rider should act on, `info` for
 * advice. Every message that names a maximum says whose it is.
 */

const SEVERITY_ORDER: Record<WarningSeverity, number> = { error: 0, warning: 1, info: 2 };

export function warn(code: string, severity: WarningSeverity, message: string): BaselineWarning {
  return { code, severity, message };
}

/** Errors first, then warnings, then advice; the order within each stays. */
export function bySeverity(list: BaselineWarning[]): BaselineWarning[] {
  return list
    .map((w, i) => ({ w, i }))
    .sort((x, y) => SEVERITY_ORDER[x.w.severity] - SEVERITY_ORDER[y.w.severity] || x.i - y.i)
    .map(({ w }) => w);
}

const psi = (v: number) => `${Math.round(v)} psi`;

/** A pump cannot set less than this; a solve below it has no usable answer (psi). */
export const LOWEST_SETTABLE_PSI = 1;

/** "the fork's main chamber", "the shock" */
function chamberName(part: Part): string {
  return part === 'fork' ? "the fork's main chamber" : 'the shock';
}

/** "the fork's main-chamber maximum of 150 psi (a default: use the one printed on your fork)" */
export function maxPhrase(part: Part, maxPsi: number, isDefault: boolean): string {
  const whose = part === 'fork' ? "the fork's main-chamber maximum" : "the shock's maximum";
  return `${whose} of ${psi(maxPsi)} (${isDefault ? `a default: use the one printed on your ${part}` : 'the one you gave'})`;
}

export function endStrokeMaxPhrase(maxPsi: number, isDefault: boolean): string {
  return `the end-stroke chamber's maximum of ${psi(maxPsi)} (${isDefault ? 'a default: use the one printed on your fork' : 'the one you gave'})`;
}

/** What a main-chamber pressure needs the rider to know (baseline and sag check alike). */
export interface PressureCheck {
  part: Part;
  /** the pressure to pump, psi (already known to be positive) */
  psi: number;
  /** the top of a range, when there is one */
  rangeTopPsi?: number;
  maxPsi: number;
  maxIsDefault: boolean;
  minPsi: number;
  /** the end-stroke chamber in use, if any */
  endStroke: {
    psi: number;
    given: boolean;
    recommendedPsi: number;
    maxPsi: number;
    maxIsDefault: boolean;
  } | null;
  /** "The baseline", "The target sag of 28 %" */
  subject: string;
}

export function pressureWarnings(c: PressureCheck): BaselineWarning[] {
  const out: BaselineWarning[] = [];
  const max = maxPhrase(c.part, c.maxPsi, c.maxIsDefault);
  if (c.psi > c.maxPsi) {
    out.push(
      warn(
        'above-max-pressure',
        'error',
        `${c.subject} would need ${psi(c.psi)} in ${chamberName(c.part)}, above ${max}. Never pump past ${psi(c.maxPsi)}: this spring does not suit your weight as it is. Ask a suspension technician.`,
      ),
    );
  } else if (c.rangeTopPsi !== undefined && c.rangeTopPsi > c.maxPsi) {
    out.push(
      warn(
        'range-above-max-pressure',
        'warning',
        `The top of the range (${psi(c.rangeTopPsi)}) is above ${max}: stay at or below ${psi(c.maxPsi)}.`,
      ),
    );
  }
  if (c.psi < c.minPsi) {
    out.push(
      warn(
        'below-min-pressure',
        'warning',
        `${c.subject} needs ${psi(c.psi)} in ${chamberName(c.part)}, below a sensible minimum of about ${psi(c.minPsi)}: the spring is too firm for your weight. Ask a suspension technician.`,
      ),
    );
  }
  const e = c.endStroke;
  if (e) {
    const endMax = endStrokeMaxPhrase(e.maxPsi, e.maxIsDefault);
    if (e.given && e.psi > e.maxPsi) {
      out.push(
        warn(
          'end-stroke-above-max',
          'error',
          `Your end-stroke pressure of ${psi(e.psi)} is above ${endMax}. Let air out to ${psi(Math.min(e.recommendedPsi, e.maxPsi))} or less before you ride.`,
        ),
      );
    }
    if (e.psi <= c.psi) {
      const fix =
        c.psi >= e.maxPsi
          ? `It cannot be set above the main chamber without passing ${endMax}: ask a suspension technician.`
          : `Set it above the main chamber, to about ${psi(Math.max(e.recommendedPsi, Math.min(c.psi + 5, e.maxPsi)))}, never past ${psi(e.maxPsi)}.`;
      out.push(
        warn(
          'end-stroke-below-main',
          'warning',
          `The end-stroke pressure (${psi(e.psi)}) is not above the main chamber's (${psi(c.psi)}): the two chambers act as one and the end-stroke chamber does nothing. ${fix}`,
        ),
      );
    }
  }
  return out;
}

export function sagWarnings(rp: ResolvedPart): BaselineWarning[] {
  const out: BaselineWarning[] = [];
  if (rp.targetPct < SAG_WARN_BAND.minPct || rp.targetPct > SAG_WARN_BAND.maxPct) {
    out.push(
      warn(
        'sag-out-of-range',
        'warning',
        `A sag of ${rp.targetPct} % is outside the usual ${SAG_WARN_BAND.minPct}–${SAG_WARN_BAND.maxPct} %: the ${rp.part} will ride ${rp.targetPct < SAG_WARN_BAND.minPct ? 'harsh and use little travel' : 'low in its travel and bottom out easily'}.`,
      ),
    );
  }
  const lr = rp.averageLeverageRatio;
  if (lr !== null && (lr < LEVERAGE_RATIO_BAND.min || lr > LEVERAGE_RATIO_BAND.max)) {
    out.push(
      warn(
        'leverage-ratio-unusual',
        'warning',
        `Wheel travel ÷ stroke gives a leverage ratio of ${lr.toFixed(2)}, outside the usual ${LEVERAGE_RATIO_BAND.min}–${LEVERAGE_RATIO_BAND.max}: check the wheel travel and the stroke.`,
      ),
    );
  }
  return out;
}

/**
 * What to change when the baseline uses all travel on a hard landing: the gentlest overlay that
 * does not (more end-stroke pressure first where there is a chamber, else one spacer more), never
 * past a maximum. A starting point: one change at a time, and only if bottom-outs feel harsh.
 */
export function bottomOutAdvice(
  rp: ResolvedPart,
  overlays: CurveOverlay[],
  usedEndPsi: number | null,
): BaselineWarning {
  const head = `A hard landing (${HARD_LANDING_MULTIPLE} × your static load) would use all ${rp.travelMm} mm of travel.`;
  const fits = (o: CurveOverlay) => o.travelUsedMm < rp.travelMm - BOTTOM_OUT_TOLERANCE_MM;
  const endStroke = overlays.find(
    (o) => o.kind === 'end-stroke' && (o.endStrokePsi ?? 0) > (usedEndPsi ?? Infinity) && fits(o),
  );
  const spacers = overlays.find((o) => o.kind === 'spacers' && (o.spacers ?? 0) > rp.spacers && fits(o));
  const pick = endStroke ?? spacers;
  if (!pick) {
    return warn(
      'bottoms-out-on-hard-landing',
      'info',
      `${head} Using all of it now and then is normal; if bottom-outs feel harsh, have a technician look at the spring.`,
    );
  }
  const change =
    pick.kind === 'end-stroke'
      ? `raise the end-stroke pressure to ${pick.endStrokePsi} psi (within ${endStrokeMaxPhrase(rp.endStroke!.maxPsi, rp.endStroke!.maxIsDefault)})`
      : `fit ${pick.spacers} volume spacer${pick.spacers === 1 ? '' : 's'}`;
  return warn(
    'bottoms-out-on-hard-landing',
    'info',
    `${head} Using all of it now and then is normal; if bottom-outs feel harsh, ${change}: that uses about ${Math.round(pick.travelUsedMm)} mm on the same landing. Change one thing at a time.`,
  );
}
