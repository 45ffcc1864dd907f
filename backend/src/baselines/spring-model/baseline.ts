import type {
  BaselineInput,
  BaselineResult,
  BaselineWarning,
  CurveOverlay,
  CurvePoint,
  EndStrokeResult,
  ForkInput,
  MeasuredSpringResult,
  PartResult,
  ShockInput,
  ShockResult,
} from '@loamline/shared-types';
import { type AirCharge, type AirSpring, springForce, springRate, storedEnergy } from './air-spring';
import { gaugeAtTemperature } from './atmosphere';
import { coilRate } from './coil';
import {
  BOTTOM_OUT_TOLERANCE_MM,
  CAUTIONS,
  CURVE_POINTS,
  END_STROKE_OVERLAY_FACTORS,
  END_STROKE_RESERVE_SHARE,
  END_STROKE_START_MULTIPLE,
  END_STROKE_STEP_PSI,
  FULL_TRAVEL_SHARE,
  HARD_LANDING_MULTIPLE,
  INDOOR_TEMPERATURE_C,
  SAG_RANGE_POINTS,
  PUMP_ALTITUDE_NOTE_M,
  SPACER_OVERLAYS_ABOVE,
} from './policy';
import { LIMITS, SpringModelInputError } from './limits';
import {
  airSpringWith,
  type Context,
  type Part,
  requireObject,
  resolveContext,
  resolvePart,
  type ResolvedPart,
  round,
} from './resolve';
import { solveChargePressure, travelUnderLoad } from './solve';
import { mmToM, paToPsi, psiToBar, psiToPa } from './units';
import {
  bottomOutAdvice,
  bySeverity,
  LOWEST_SETTABLE_PSI,
  pressureWarnings,
  sagWarnings,
  warn,
} from './warnings';

/**
 * The baseline for a rider, a bike and the conditions: the static curve (n = 1) for sag and the
 * pressure; a hard landing (the fast-hit index) for travel used, bottoming out and "too
 * progressive"; the end-stroke chamber's recommended pressure; the warnings. docs/spring-model.md.
 */

/** The gauge pressures of one air part, where the rider pumps: main chamber and end-stroke chamber. */
export interface AirSetting {
  /** absolute main-chamber pressure at full extension, Pa */
  p0: number;
  /** gauge at the pump, psi (may be ≤ 0: then no positive pressure works) */
  psi: number;
  /** the end-stroke gauge pressure in use, psi, and whether the rider gave it */
  endStroke: { psi: number; given: boolean; recommendedPsi: number; recommendedTravelUsedMm: number } | null;
}

/** Absolute pressure of a gauge reading taken where the rider pumps. */
const absAtPump = (gaugePsi: number, ctx: Context) => psiToPa(gaugePsi) + ctx.pAmbPump;
/** Gauge reading where the rider pumps of an absolute pressure. */
const gaugeAtPump = (abs: number, ctx: Context) => paToPsi(abs - ctx.pAmbPump);

/** The charge of a part: forces work against the ambient pressure where the rider rides. */
export function chargeOf(p0: number, endStrokePsi: number | null, ctx: Context, n: number): AirCharge {
  return { p0, pEnd: endStrokePsi === null ? null : absAtPump(endStrokePsi, ctx), pAmb: ctx.pAmbRide, n };
}

export function fastIndex(rp: ResolvedPart): number {
  return rp.geometry!.geometry.polytropicIndex;
}

/** Travel used (mm) by a hard landing, at the fast-hit index. */
function hardLandingTravelMm(
  rp: ResolvedPart,
  s: AirSpring,
  p0: number,
  endPsi: number | null,
  ctx: Context,
) {
  return (
    travelUnderLoad(s, chargeOf(p0, endPsi, ctx, fastIndex(rp)), HARD_LANDING_MULTIPLE * rp.loadN) * 1000
  );
}

/** Absolute p₀ that carries the part's load at `pct` % sag, slow compression. */
function solveAt(rp: ResolvedPart, s: AirSpring, pct: number, endPsi: number | null, ctx: Context): number {
  const x = (s.travel * pct) / 100;
  const pEnd = endPsi === null ? null : absAtPump(endPsi, ctx);
  return solveChargePressure(s, x, rp.loadN, ctx.pAmbRide, pEnd, 1);
}

const stepUp = (v: number) => Math.ceil(v / END_STROKE_STEP_PSI - 1e-9) * END_STROKE_STEP_PSI;
const stepDown = (v: number) => {
  const down = Math.floor(v / END_STROKE_STEP_PSI) * END_STROKE_STEP_PSI;
  return down > v ? down - END_STROKE_STEP_PSI : down;
};

/**
 * The recommended end-stroke pressure: from twice the main chamber's (common practice) upward in
 * 5 psi steps, the first at which a hard landing keeps travel in reserve; never above the chamber's
 * maximum (at the maximum when nothing below it does).
 */
function recommendEndStroke(rp: ResolvedPart, s: AirSpring, p0: number, mainPsi: number, ctx: Context) {
  const max = stepDown(rp.endStroke!.maxPsi);
  const start = Math.min(
    max,
    stepUp(Math.max(END_STROKE_START_MULTIPLE * mainPsi, mainPsi + END_STROKE_STEP_PSI)),
  );
  // keep a reserve a gauge a few psi off does not use up: 3 % of travel, at least 1 mm
  const limit = rp.travelMm - Math.max(2 * BOTTOM_OUT_TOLERANCE_MM, END_STROKE_RESERVE_SHARE * rp.travelMm);
  let psi = start;
  let used = hardLandingTravelMm(rp, s, p0, psi, ctx);
  while (used >= limit && psi + END_STROKE_STEP_PSI <= max) {
    psi += END_STROKE_STEP_PSI;
    used = hardLandingTravelMm(rp, s, p0, psi, ctx);
  }
  return { psi: Math.max(psi, LIMITS.endStrokePsi.min), used };
}

/** The main pressure (and the end-stroke pressure in use) for a sag, with a recommendation. */
export function airSetting(rp: ResolvedPart, ctx: Context, pct = rp.targetPct): AirSetting {
  const s = rp.air!;
  const e = rp.endStroke;
  if (e === null) {
    const p0 = solveAt(rp, s, pct, null, ctx);
    return { p0, psi: gaugeAtPump(p0, ctx), endStroke: null };
  }
  // The chamber joins late at the pressures recommended, so solve first as if it had not, then
  // again with the pressure in use (which changes nothing unless it joins before sag).
  let p0 = solveAt(rp, s, pct, e.givenPsi, ctx);
  let psi = gaugeAtPump(p0, ctx);
  if (!Number.isFinite(p0)) return { p0, psi, endStroke: null };
  const rec = recommendEndStroke(rp, s, p0, Math.max(psi, 0), ctx);
  if (e.givenPsi === null) {
    p0 = solveAt(rp, s, pct, rec.psi, ctx);
    psi = gaugeAtPump(p0, ctx);
  }
  return {
    p0,
    psi,
    endStroke: {
      psi: e.givenPsi ?? rec.psi,
      given: e.givenPsi !== null,
      recommendedPsi: rec.psi,
      recommendedTravelUsedMm: rec.used,
    },
  };
}

function curve(force: (x: number) => number, travel: number): CurvePoint[] {
  const out: CurvePoint[] = [];
  for (let i = 0; i < CURVE_POINTS; i++) {
    const x = (travel * i) / (CURVE_POINTS - 1);
    out.push({ travelMm: round(x * 1000, 2), forceN: round(force(x), 1) });
  }
  return out;
}

/** A hard landing's curve, progression and travel used for one spring and charge. */
function describeFast(rp: ResolvedPart, s: AirSpring, p0: number, endPsi: number | null, ctx: Context) {
  const c = chargeOf(p0, endPsi, ctx, fastIndex(rp));
  const f = (x: number) => springForce(s, c, x);
  const xSag = (s.travel * rp.targetPct) / 100;
  return {
    curve: curve(f, s.travel),
    progression: f(0.9 * s.travel) / f(xSag),
    travelUsedMm: travelUnderLoad(s, c, HARD_LANDING_MULTIPLE * rp.loadN) * 1000,
  };
}

const spacerLabel = (total: number, fitted: number): string => {
  const d = total - fitted;
  const what = `${total} spacer${total === 1 ? '' : 's'}`;
  return `${what} (${Math.abs(d)} ${d < 0 ? 'fewer' : 'more'})`;
};

/**
 * Overlays at the same main pressure, each on a hard landing: 0…N spacers (fewer and more than
 * fitted), other end-stroke pressures (never above its maximum, always above the main chamber),
 * and the baseline itself.
 */
function overlaysFor(rp: ResolvedPart, setting: AirSetting, ctx: Context): CurveOverlay[] {
  const out: CurveOverlay[] = [];
  const endPsi = setting.endStroke?.psi ?? null;
  const top = Math.min(LIMITS.spacers.max, rp.spacers + SPACER_OVERLAYS_ABOVE);
  for (let total = 0; total <= top; total++) {
    if (total === rp.spacers) continue;
    const sp = airSpringWith(rp, total);
    if (!sp) break;
    out.push({
      label: spacerLabel(total, rp.spacers),
      kind: 'spacers',
      spacers: total,
      ...describeFast(rp, sp, setting.p0, endPsi, ctx),
    });
  }
  if (setting.endStroke && rp.endStroke) {
    const used = setting.endStroke.psi;
    const max = rp.endStroke.maxPsi;
    const candidates = new Set<number>([setting.endStroke.recommendedPsi]);
    for (const factor of END_STROKE_OVERLAY_FACTORS) candidates.add(Math.round((used * factor) / 5) * 5);
    const pressures = [...candidates]
      .filter((e) => e !== used && e > setting.psi && e <= max && e >= LIMITS.endStrokePsi.min)
      .sort((a, b) => a - b);
    for (const e of pressures) {
      out.push({
        label: `end-stroke ${e} psi${e === setting.endStroke.recommendedPsi ? ' (recommended)' : ''}`,
        kind: 'end-stroke',
        endStrokePsi: e,
        ...describeFast(rp, rp.air!, setting.p0, e, ctx),
      });
    }
  }
  out.push({
    label: 'hard landing',
    kind: 'fast-hit',
    ...describeFast(rp, rp.air!, setting.p0, endPsi, ctx),
  });
  return out;
}

function computeAir(rp: ResolvedPart, ctx: Context): PartResult {
  const s = rp.air!;
  const T = s.travel;
  const xSag = (T * rp.targetPct) / 100;
  const setting = airSetting(rp, ctx);
  const warnings: BaselineWarning[] = [...sagWarnings(rp)];
  const hardLandingLoadN = HARD_LANDING_MULTIPLE * rp.loadN;
  const base = {
    travelMm: rp.travelMm,
    targetSagPct: rp.targetPct,
    targetSagMm: (rp.travelMm * rp.targetPct) / 100,
    loadN: rp.loadN,
    coilRate: null,
    hardLandingLoadN,
    hardLandingIndex: fastIndex(rp),
  };

  const atRide = paToPsi(setting.p0 - ctx.pAmbRide);
  const unreachable = !Number.isFinite(setting.p0);
  if (unreachable || !(setting.psi >= LOWEST_SETTABLE_PSI) || !(atRide >= LOWEST_SETTABLE_PSI)) {
    warnings.unshift(
      unreachable
        ? warn(
            'above-max-pressure',
            'error',
            `No air pressure this ${rp.part} could hold gives ${rp.targetPct} % sag: never pump past the maximum trying. Check the numbers you gave; if they are right, ask a suspension technician.`,
          )
        : warn(
            'no-positive-pressure',
            'error',
            `No air pressure can give ${rp.targetPct} % sag: even with the chamber empty this ${rp.part} holds you up higher. The spring is far too firm for your weight as it is. Ask a suspension technician.`,
          ),
    );
    return {
      ...base,
      pressure: null,
      endStroke: null,
      curve: [],
      rateAtSagNPerMm: 0,
      energyToFullTravelJ: 0,
      progression: 0,
      travelUsedMm: 0,
      overlays: [],
      warnings: bySeverity(warnings),
    };
  }

  const psi = setting.psi;
  const endPsi = setting.endStroke?.psi ?? null;
  // A range end no pressure reaches (a sag too small for a very soft chamber) stays at the baseline.
  const rangeAbs = [rp.targetPct + SAG_RANGE_POINTS, rp.targetPct - SAG_RANGE_POINTS].map((pct) => {
    const end = gaugeAtPump(airSetting(rp, ctx, pct).p0, ctx);
    return Number.isFinite(end) ? Math.max(0, end) : psi;
  });
  const rangePsi: [number, number] = [Math.round(rangeAbs[0]), Math.round(rangeAbs[1])];
  const rangeBar: [number, number] = [round(psiToBar(rangeAbs[0]), 1), round(psiToBar(rangeAbs[1]), 1)];

  const slow = chargeOf(setting.p0, endPsi, ctx, 1);
  const f = (x: number) => springForce(s, slow, x);
  const fast = describeFast(rp, s, setting.p0, endPsi, ctx);
  const overlays = overlaysFor(rp, setting, ctx);

  let endStroke: EndStrokeResult | null = null;
  if (setting.endStroke && rp.endStroke) {
    const e = setting.endStroke;
    endStroke = {
      psi: e.psi,
      bar: psiToBar(e.psi),
      given: e.given,
      recommendedPsi: e.recommendedPsi,
      recommendedBar: psiToBar(e.recommendedPsi),
      recommendedTravelUsedMm: e.recommendedTravelUsedMm,
      maxPsi: rp.endStroke.maxPsi,
      maxIsDefault: rp.endStroke.maxIsDefault,
    };
  }

  warnings.push(
    ...pressureWarnings({
      part: rp.part,
      psi,
      rangeTopPsi: rangePsi[1],
      maxPsi: rp.maxPsi,
      maxIsDefault: rp.maxIsDefault,
      minPsi: rp.minPsi,
      endStroke,
      subject: 'The baseline',
    }),
  );
  if (fast.travelUsedMm < FULL_TRAVEL_SHARE * rp.travelMm) {
    warnings.push(
      warn(
        'no-full-travel',
        'warning',
        `Even a hard landing (${HARD_LANDING_MULTIPLE} × your static load) would use only ${Math.round(fast.travelUsedMm)} of ${rp.travelMm} mm: the spring is too progressive for you. Remove spacers${endStroke ? ' or lower the end-stroke pressure' : ''}.`,
      ),
    );
  }
  if (fast.travelUsedMm >= rp.travelMm - BOTTOM_OUT_TOLERANCE_MM) {
    warnings.push(bottomOutAdvice(rp, overlays, endPsi));
  }
  if (Math.abs(ctx.pumpAltitudeM - ctx.altitudeM) >= PUMP_ALTITUDE_NOTE_M) {
    warnings.push(
      warn(
        'pump-altitude',
        'info',
        `Pump to ${Math.round(psi)} psi where you pump (${Math.round(ctx.pumpAltitudeM) || 0} m). The chamber keeps its air, so where you ride (${Math.round(ctx.altitudeM) || 0} m) the gauge reads about ${Math.round(atRide)} psi: that is the same setting, don't correct it there.`,
      ),
    );
  }
  if (Math.abs(ctx.temperatureC - INDOOR_TEMPERATURE_C) >= 5) {
    const riding = round(ctx.temperatureC, 1) || 0; // never "-0"
    const indoor = paToPsi(gaugeAtTemperature(psiToPa(psi), riding, INDOOR_TEMPERATURE_C, ctx.pAmbPump));
    warnings.push(
      warn(
        'temperature-offset',
        'info',
        `${Math.round(psi)} psi is what the gauge should read at ${riding} °C. Pumped indoors at ${INDOOR_TEMPERATURE_C} °C, set about ${Math.round(indoor)} psi so that it reads ${Math.round(psi)} psi outside (ideal gas law).`,
      ),
    );
  }
  if (rp.geometry?.extrapolated) {
    warnings.push(
      warn(
        'geometry-extrapolated',
        'info',
        `Your ${rp.part === 'fork' ? 'stanchion size' : 'stroke'} is outside Loamline's table of typical springs, so the spring's inside was extrapolated: treat this baseline as rougher than usual and trust the sag check.`,
      ),
    );
  }

  return {
    ...base,
    pressure: {
      psi,
      bar: psiToBar(psi),
      rangePsi,
      rangeBar,
      maxPsi: rp.maxPsi,
      maxIsDefault: rp.maxIsDefault,
      minPsi: rp.minPsi,
      atRidePsi: ctx.pumpAltitudeM !== ctx.altitudeM ? atRide : null,
    },
    endStroke,
    curve: curve(f, T),
    rateAtSagNPerMm: springRate(s, slow, xSag) / 1000,
    energyToFullTravelJ: storedEnergy(s, slow, T),
    progression: f(0.9 * T) / f(xSag),
    travelUsedMm: fast.travelUsedMm,
    overlays,
    warnings: bySeverity(warnings),
  };
}

function computeCoil(rp: ResolvedPart): PartResult {
  const T = mmToM(rp.travelMm);
  const xSag = (T * rp.targetPct) / 100;
  const rate = coilRate(rp.loadN, xSag, rp.part);
  const k = rp.loadN / xSag; // N/m
  const hardLandingLoadN = HARD_LANDING_MULTIPLE * rp.loadN;
  const warnings: BaselineWarning[] = sagWarnings(rp);
  if (rp.ignoredAirFields.length > 0) {
    const names: Record<string, string> = {
      spacers: 'volume spacers',
      endStroke: 'the end-stroke chamber',
      maxPressurePsi: 'the maximum pressure',
      geometry: 'the air-spring geometry',
      measured: 'the measured spring',
    };
    warnings.push(
      warn(
        'air-settings-ignored',
        'info',
        `A coil spring has no air: ${rp.ignoredAirFields.map((f) => names[f]).join(', ')} ${rp.ignoredAirFields.length === 1 ? 'is' : 'are'} left out.`,
      ),
    );
  }
  return {
    travelMm: rp.travelMm,
    targetSagPct: rp.targetPct,
    targetSagMm: (rp.travelMm * rp.targetPct) / 100,
    loadN: rp.loadN,
    pressure: null,
    coilRate: rate,
    endStroke: null,
    curve: curve((x) => k * x, T),
    rateAtSagNPerMm: k / 1000,
    energyToFullTravelJ: 0.5 * k * T * T,
    progression: (0.9 * T) / xSag,
    hardLandingLoadN,
    hardLandingIndex: 1,
    travelUsedMm: Math.min(T, hardLandingLoadN / k) * 1000,
    overlays: [],
    warnings: bySeverity(warnings),
  };
}

function computePart(part: Part, input: ForkInput | ShockInput, ctx: Context): PartResult {
  const rp = resolvePart(part, input, ctx);
  if (rp.spring !== 'air') return computeCoil(rp);
  const result = computeAir(rp, ctx);
  if (rp.measuredLabel === null || result.pressure === null) return result;
  const measuredSpring = defaultComparison(part, input, ctx, rp.measuredLabel, result.pressure.psi);
  return measuredSpring ? { ...result, measuredSpring } : result;
}

/**
 * With a measured spring: the same input on the default geometry (the measured spring left out),
 * so the rider sees how far the default would have been off. Null when the default geometry gives
 * no positive pressure, or cannot be computed (spacers that close its chamber).
 */
function defaultComparison(
  part: Part,
  input: ForkInput | ShockInput,
  ctx: Context,
  label: string,
  psi: number,
): MeasuredSpringResult | null {
  const quiet: Context = { ...ctx, assumptions: [] };
  let pressure: PartResult['pressure'];
  try {
    pressure = computeAir(resolvePart(part, { ...input, measured: null }, quiet), quiet).pressure;
  } catch (e) {
    if (e instanceof SpringModelInputError) return null;
    throw e;
  }
  if (pressure === null) return null;
  return {
    label,
    defaultPressurePsi: pressure.psi,
    differencePct: (100 * (pressure.psi - psi)) / psi,
  };
}

/** What only an air spring depends on: left out of "what we assumed" when every spring is a coil. */
const AIR_ONLY_ASSUMPTIONS = new Set([
  'conditions.altitudeM',
  'conditions.pumpAltitudeM',
  'conditions.ambientPressure',
  'conditions.temperatureC',
  'model.staticPolytropicIndex',
]);

/** The baseline for a rider, a bike and the conditions. */
export function computeBaseline(input: BaselineInput): BaselineResult {
  requireObject('body', input);
  const ctx = resolveContext(input);
  const fork = input.fork ? computePart('fork', input.fork, ctx) : null;
  let shock: ShockResult | null = null;
  if (input.shock) {
    const rp = resolvePart('shock', input.shock, { ...ctx, assumptions: [] });
    const result = computePart('shock', input.shock, ctx);
    shock = {
      ...result,
      leverageRatio: rp.leverageRatio!,
      leverageRatioIsAverage: rp.leverageRatioIsAverage,
      wheelSagMm: (rp.wheelTravelMm! * result.targetSagPct) / 100,
    };
  }
  const anyAir = input.fork?.spring === 'air' || input.shock?.spring === 'air';
  const assumptions = anyAir
    ? ctx.assumptions
    : ctx.assumptions.filter((a) => !AIR_ONLY_ASSUMPTIONS.has(a.key));
  return { fork, shock, cautions: [...CAUTIONS], assumptions };
}
