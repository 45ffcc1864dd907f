import { G0 } from './units';

/**
 * One load model for air and coil. Each spring carries, at sag, the share of the rider's weight
 * that sits on its wheel in the position its sag is measured in:
 * - fork sag is measured standing in the riding position: W_f = m·g₀·s_f;
 * - rear sag is measured seated: W_r = m·g₀·s_r,seated, and at the shock W_s = W_r·LR, with LR the
 *   leverage ratio at sag where the bike's curve is known, the average (wheel travel ÷ stroke)
 *   otherwise.
 * The bike's own weight does not count: sag is measured from the unladen, topped-out bike.
 */

/**
 * Share of the rider's weight on the front wheel, standing in the riding position: about
 * 0.40–0.45 (an estimate; no published study found), overridable as `rider.frontShare`.
 */
export const DEFAULT_FRONT_SHARE = 0.42;

/**
 * Share of the rider's weight on the rear wheel, seated (where rear sag is measured): about
 * 0.70–0.75 with the saddle behind the bottom bracket (an estimate, from memory), overridable as
 * `rider.seatedRearShare`.
 */
export const DEFAULT_SEATED_REAR_SHARE = 0.72;

/** Where each part's sag is measured (common practice, no source). */
export const SAG_POSITION = { fork: 'standing', shock: 'seated' } as const;

export interface RiderLoads {
  /** m·g₀, N */
  weightN: number;
  /** W_f = m·g₀·s_f, standing, N */
  frontN: number;
  /** W_r = m·g₀·s_r, seated, N */
  rearN: number;
}

/** The rider's weight (with riding gear) on each wheel in the position its sag is measured in. */
export function riderLoads(massKg: number, frontShare: number, seatedRearShare: number): RiderLoads {
  const weightN = massKg * G0;
  return { weightN, frontN: weightN * frontShare, rearN: weightN * seatedRearShare };
}

/** Average leverage ratio LR = wheel travel / shock stroke (the real ratio varies through travel). */
export function leverageRatio(wheelTravel: number, stroke: number): number {
  return wheelTravel / stroke;
}

/** The load at the shock: the rear-wheel load times the leverage ratio, W_s = W_r·LR. */
export function shockLoad(rearWheelN: number, lr: number): number {
  return rearWheelN * lr;
}
