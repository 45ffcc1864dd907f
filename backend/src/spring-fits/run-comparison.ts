import type {
  AirSpringGeometry,
  CurveRun,
  ForkInput,
  PartSettings,
  RidingFeel,
  RidingStyle,
  RunComparison,
  ShockInput,
} from '@loamline/shared-types';
import {
  type BenchKnownGeometry,
  type BenchRun,
  compareRun,
  type FittedGeometry,
  forkGeometry,
  LIMITS,
  modelCurve,
  shockGeometry,
  SpringModelInputError,
  targetSag,
} from '../baselines/spring-model';

/**
 * One bench run read against the model, for the service report's chart (`Attachment.run.comparison`):
 * pure, no I/O, so the reports service can call it for every curve it lists.
 */

type Part = 'fork' | 'shock';

/** What the shop knows of the part from the bike: travel (a shock: stroke), the stanchion, bores given. */
export function benchKnown(part: Part, input: ForkInput | ShockInput): BenchKnownGeometry {
  const g = input.geometry ?? {};
  const num = (v: unknown) => (typeof v === 'number' ? v : undefined);
  const known: BenchKnownGeometry = {
    travelMm: part === 'fork' ? (input as ForkInput).travelMm : (input as ShockInput).strokeMm,
  };
  if (part === 'fork') known.stanchionMm = (input as ForkInput).stanchionMm;
  const piston = num(g.pistonDiameterMm);
  const shaft = num(g.shaftDiameterMm);
  const spacer = num(g.spacerVolumeCm3);
  if (piston !== undefined) known.pistonDiameterMm = piston;
  if (shaft !== undefined) known.shaftDiameterMm = shaft;
  if (spacer !== undefined) known.spacerVolumeCm3 = spacer;
  return known;
}

/**
 * The geometry a baseline for this part would use: the rider's explicit values, then the measured
 * spring (when stored on the bike), then the defaults, as `resolvePart` does.
 */
export function partGeometry(
  part: Part,
  input: ForkInput | ShockInput,
  withEndStroke: boolean,
): { known: BenchKnownGeometry; geometry: FittedGeometry; measured: boolean } {
  const given: Partial<AirSpringGeometry> = {};
  const m = input.measured ?? null;
  if (m) {
    given.positiveLengthMm = m.positiveLengthMm;
    given.negativeVolumeCm3 = m.negativeVolumeCm3;
    if (part === 'fork' && m.endStrokeVolumeCm3 !== null) given.endStrokeVolumeCm3 = m.endStrokeVolumeCm3;
  }
  for (const [k, v] of Object.entries(input.geometry ?? {})) {
    if (typeof v === 'number') given[k as keyof AirSpringGeometry] = v;
  }
  const resolved =
    part === 'fork'
      ? forkGeometry((input as ForkInput).stanchionMm, (input as ForkInput).travelMm, withEndStroke, given)
      : shockGeometry((input as ShockInput).strokeMm, given);
  const g = resolved.geometry;
  return {
    known: {
      ...benchKnown(part, input),
      pistonDiameterMm: g.pistonDiameterMm,
      shaftDiameterMm: g.shaftDiameterMm,
      spacerVolumeCm3: g.spacerVolumeCm3,
    },
    geometry: {
      positiveLengthMm: g.positiveLengthMm,
      negativeVolumeCm3: g.negativeVolumeCm3,
      endStrokeVolumeCm3: withEndStroke ? g.endStrokeVolumeCm3 : null,
    },
    measured: m !== null,
  };
}

export interface RunComparisonInput {
  /** the stored run (label, settings, points in mm and N) */
  run: Pick<CurveRun, 'label' | 'settings' | 'points'>;
  /** the appointment bike's fork or shock (the part of `run.settings.part`); its `measured` when stored */
  part: ForkInput | ShockInput | null;
  /** the report's settings of that part: its measured sag (mm; a shock's at the shock); null without a report */
  report?: PartSettings | null;
  /** for the target sag when there is no measured sag (default trail, balanced) */
  riding?: { style: RidingStyle; feel: RidingFeel };
}

/**
 * The comparison a technician reads for one run: force at sag (the report's measured sag, else the
 * model's target) and at 90 % of travel, measured against the model of the bike's geometry (its
 * measured spring when stored, else the defaults) at the run's own settings, the friction band and
 * a bump stop. The model's friction is the measured spring's, else the run's own half gap.
 *
 * Null when it cannot be read: no bike part, a coil, a run that does not span sag and 90 % of
 * travel on compression or has no rebound stroke (the contract's fields are all numbers), or a run
 * the model refuses (a point past the travel, a setting out of range).
 */
export function runComparison(input: RunComparisonInput): RunComparison | null {
  const { run } = input;
  const partName = run.settings.part;
  const part = input.part;
  if (!part || part.spring !== 'air') return null;
  try {
    const withEnd = run.settings.endStrokePsi !== null;
    const { known, geometry, measured } = partGeometry(partName, part, withEnd);
    const travelMm = known.travelMm;
    const bench: BenchRun = {
      label: run.label,
      mainPsi: run.settings.mainPsi,
      endStrokePsi: run.settings.endStrokePsi,
      spacers: run.settings.spacers,
      points: run.points,
    };
    const sagMm = input.report?.sagMm ?? null;
    const measuredPct = sagMm === null ? null : (100 * sagMm) / travelMm;
    const riding = input.riding ?? { style: 'trail', feel: 'balanced' };
    const sagPct =
      measuredPct !== null && measuredPct >= LIMITS.targetSagPct.min && measuredPct <= LIMITS.targetSagPct.max
        ? measuredPct
        : (part.targetSagPct ??
          targetSag(partName, riding.style, riding.feel, {
            endStroke: partName === 'fork' && !!(part as ForkInput).endStroke,
            travelMm,
          }).pct);
    const args = { part: partName, known, geometry, run: bench, sagPct };
    const frictionN = measured
      ? part.measured!.frictionN
      : (compareRun({ ...args, frictionN: 0 }).frictionBandN ?? 0);
    const c = compareRun({ ...args, frictionN: Math.max(0, frictionN) });
    if (c.atSag === null || c.nearEnd === null || c.frictionBandN === null) return null;
    const travels = [...new Set(run.points.map((p) => p.travelMm))].sort((a, b) => a - b);
    const model = modelCurve({
      part: partName,
      known,
      geometry,
      frictionN: Math.max(0, frictionN),
      mainPsi: run.settings.mainPsi,
      endStrokePsi: run.settings.endStrokePsi,
      spacers: run.settings.spacers,
      travelsMm: travels,
    });
    return {
      sagTravelMm: c.atSag.travelMm,
      measuredAtSagN: c.atSag.measuredN,
      modelAtSagN: c.atSag.modelN,
      endTravelMm: c.nearEnd.travelMm,
      measuredAtEndN: c.nearEnd.measuredN,
      modelAtEndN: c.nearEnd.modelN,
      frictionBandN: c.frictionBandN,
      bumpStopMm: c.bumpStop?.travelMm ?? null,
      model: model.map((p) => ({ travelMm: p.travelMm, compressionN: p.compressionN, reboundN: p.reboundN })),
    };
  } catch (e) {
    if (e instanceof SpringModelInputError) return null;
    throw e;
  }
}
