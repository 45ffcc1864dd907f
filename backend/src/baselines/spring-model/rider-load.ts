import { G0 } from './units';

/**
 * Share of the rider's weight on the front wheel in the standing riding position: about 0.40–0.45
 * (an estimate; no published MTB study found), overridable as `rider.frontShare`.
 */
export const DEFAULT_FRONT_SHARE = 0.42;

export interface RiderLoads {
  /** m·g₀, N */
  weightN: number;
  /** W_f = m·g₀·s_f, N */
  frontN: number;
  /** W_r = m·g₀·(1 − s_f), N */
  rearN: number;
}

/**
 * The rider's weight (with riding gear) split between the wheels. The bike's own weight does not
 * count: sag is measured from the unladen, topped-out bike.
 */
export function riderLoads(massKg: number, frontShare: number): RiderLoads {
  const weightN = massKg * G0;
  return { weightN, frontN: weightN * frontShare, rearN: weightN * (1 - frontShare) };
}

/** Average leverage ratio LR = wheel travel / shock stroke (the real ratio varies through travel). */
export function leverageRatio(wheelTravel: number, stroke: number): number {
  return wheelTravel / stroke;
}

/** The load at the shock: the rear-wheel load times the leverage ratio, W_s = W_r·LR. */
export function shockLoad(rearWheelN: number, lr: number): number {
  return rearWheelN * lr;
}
