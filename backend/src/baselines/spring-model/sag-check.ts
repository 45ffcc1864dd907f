import type { BaselineWarning, SagCheckInput, SagCheckResult } from '@loamline/shared-types';
import { springForce } from './air-spring';
import { airSetting, chargeOf } from './baseline';
import { LIMITS, requireInRange, SpringModelInputError } from './limits';
import { MEASURED_MIN_SHARE_OF_MINIMUM, MEASURED_SAG_PLAUSIBLE_PCT } from './policy';
import { requireObject, requireOneOf, resolveContext, resolvePart } from './resolve';
import { solveChargePressure } from './solve';
import { mmToM, paToPsi, psiToBar, psiToPa } from './units';
import { bySeverity, LOWEST_SETTABLE_PSI, maxPhrase, pressureWarnings, warn } from './warnings';

/**
 * From a sag measured at a known pressure, the pressure that gives the target sag. The load the
 * spring really carries is W' = F(s_m; P_m), measured where the rider pumps (it absorbs friction
 * and the real weight split); then F(x_target; P') = W' is solved for P' where the rider rides.
 * A measurement no working spring could give is refused, not corrected; the answer carries the
 * baseline's warnings. For a shock, the sag is measured at the shock.
 */
export function sagCheck(input: SagCheckInput): SagCheckResult {
  requireObject('body', input);
  requireObject('measured', input.measured);
  const part = requireOneOf('measured.part', input.measured.part, ['fork', 'shock'] as const);
  const ctx = resolveContext(input);
  const partInput = input[part];
  if (!partInput) throw new SpringModelInputError('measured.part', `there is no ${part} in this baseline`);
  const rp = resolvePart(part, partInput, ctx);
  if (rp.spring !== 'air' || !rp.air) {
    throw new SpringModelInputError(
      'measured.part',
      `the ${part} has a coil spring: the sag check corrects air pressure (change the coil's rate instead)`,
    );
  }
  const measuredPsi = requireInRange(
    'measured.pressurePsi',
    input.measured.pressurePsi,
    LIMITS.measuredPressurePsi,
  );
  const sagMm = requireInRange('measured.sagMm', input.measured.sagMm, LIMITS.measuredSagMm);
  if (measuredPsi > rp.maxPsi) {
    throw new SpringModelInputError(
      'measured.pressurePsi',
      `${Math.round(measuredPsi)} psi is above ${maxPhrase(part, rp.maxPsi, rp.maxIsDefault)}. Let air out to ${rp.maxPsi} psi or less before you ride, then measure again. If your ${part}'s own maximum is higher, enter it in the Bike step.`,
    );
  }
  const floor = rp.minPsi * MEASURED_MIN_SHARE_OF_MINIMUM;
  if (measuredPsi < floor) {
    throw new SpringModelInputError(
      'measured.pressurePsi',
      `${Math.round(measuredPsi)} psi is too little for an air ${part} to hold a rider, so a sag measured at it says little. Pump to the baseline pressure and measure again.`,
    );
  }
  if (sagMm >= rp.travelMm) {
    throw new SpringModelInputError(
      'measured.sagMm',
      `must be less than the ${part}'s travel (${rp.travelMm} mm)`,
    );
  }
  const sagPct = (sagMm / rp.travelMm) * 100;
  if (sagPct < MEASURED_SAG_PLAUSIBLE_PCT.min) {
    throw new SpringModelInputError(
      'measured.sagMm',
      `${sagMm} mm is less than ${MEASURED_SAG_PLAUSIBLE_PCT.min} % of the ${rp.travelMm} mm travel: too little for a sag. Push the rubber ring against the seal, get on in your riding position, get off gently and measure again.`,
    );
  }
  if (sagPct > MEASURED_SAG_PLAUSIBLE_PCT.max) {
    throw new SpringModelInputError(
      'measured.sagMm',
      `${sagMm} mm is more than ${MEASURED_SAG_PLAUSIBLE_PCT.max} % of the ${rp.travelMm} mm travel: the spring is not holding you up. Pump to the baseline pressure (never past the maximum) and measure again.`,
    );
  }

  // The end-stroke chamber in use: the rider's, or the one the baseline recommends.
  const baseline = airSetting(rp, ctx);
  const endPsi = baseline.endStroke?.psi ?? null;
  const s = rp.air;
  const measured = chargeOf(psiToPa(measuredPsi) + ctx.pAmbPump, endPsi, ctx, 1);
  // Measured where the rider pumps: the sag happened against that ambient pressure.
  const carried = springForce(s, { ...measured, pAmb: ctx.pAmbPump }, mmToM(sagMm));
  const targetSagMm = (rp.travelMm * rp.targetPct) / 100;
  const p0 = solveChargePressure(s, mmToM(targetSagMm), carried, ctx.pAmbRide, measured.pEnd, 1);
  const newPsi = paToPsi(p0 - ctx.pAmbPump);
  const common = {
    measuredSagPct: sagPct,
    targetSagPct: rp.targetPct,
    targetSagMm,
    maxPsi: rp.maxPsi,
    maxIsDefault: rp.maxIsDefault,
    minPsi: rp.minPsi,
  };
  if (
    Number.isFinite(p0) &&
    (!(newPsi >= LOWEST_SETTABLE_PSI) || !(p0 - ctx.pAmbRide >= psiToPa(LOWEST_SETTABLE_PSI)))
  ) {
    const warnings: BaselineWarning[] = [
      warn(
        'no-positive-pressure',
        'error',
        `No air pressure gives ${rp.targetPct} % sag from this measurement: the ${part} would sit higher even with the chamber empty. Check the measurement; if it is right, ask a suspension technician.`,
      ),
    ];
    return { ...common, newPressurePsi: null, newPressureBar: null, changePsi: null, warnings };
  }
  if (!Number.isFinite(p0)) {
    const warnings: BaselineWarning[] = [
      warn(
        'above-max-pressure',
        'error',
        `No air pressure this ${part} could hold gives ${rp.targetPct} % sag from this measurement: never pump past ${maxPhrase(part, rp.maxPsi, rp.maxIsDefault)} trying. Ask a suspension technician.`,
      ),
    ];
    return { ...common, newPressurePsi: null, newPressureBar: null, changePsi: null, warnings };
  }
  const warnings = pressureWarnings({
    part,
    psi: newPsi,
    maxPsi: rp.maxPsi,
    maxIsDefault: rp.maxIsDefault,
    minPsi: rp.minPsi,
    endStroke:
      baseline.endStroke && rp.endStroke
        ? { ...baseline.endStroke, maxPsi: rp.endStroke.maxPsi, maxIsDefault: rp.endStroke.maxIsDefault }
        : null,
    subject: `The target sag of ${rp.targetPct} %`,
  });
  return {
    ...common,
    newPressurePsi: newPsi,
    newPressureBar: psiToBar(newPsi),
    changePsi: newPsi - measuredPsi,
    warnings: bySeverity(warnings),
  };
}
