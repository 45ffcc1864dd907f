import { SpringModelInputError } from './limits';
import { circleArea } from './units';

/**
 * One air spring (a fork leg or a shock's air can) in SI units, as in docs/spring-model.md: a positive
 * chamber (area A, volume V₀' after spacers), a negative chamber equalised with it at full
 * extension (annulus A₋, volume V₋₀) and an optional end-stroke chamber (volume V_e) behind a
 * floating piston. The formulas hold in any consistent units; the model feeds them SI.
 */
export interface AirSpring {
  /** positive-chamber piston area A, m² */
  area: number;
  /** negative-chamber annulus A₋ = A − πd²/4, m² (0 when the shaft fills the bore) */
  negativeArea: number;
  /** positive chamber volume at full extension after spacers, V₀' = A·L₀ − k·V_sp, m³ */
  positiveVolume: number;
  /** negative chamber volume at full extension V₋₀, m³; 0 means no negative chamber (vented) */
  negativeVolume: number;
  /** end-stroke chamber volume V_e, m³; 0 when there is none */
  endStrokeVolume: number;
  /** travel T (for a shock: stroke), m */
  travel: number;
}

/** The gas state: what the pump set, the ambient air and how fast the spring moves. */
export interface AirCharge {
  /** absolute main-chamber pressure at full extension p₀, Pa */
  p0: number;
  /** absolute end-stroke pressure p_e, Pa; null without an end-stroke chamber */
  pEnd: number | null;
  /** ambient absolute pressure p_amb, Pa */
  pAmb: number;
  /** polytropic index n: 1 for the static baseline and sag, up to γ = 1.4 for a fast hit */
  n: number;
}

/** Geometry of one air spring in SI, before it is checked. */
export interface AirSpringParams {
  pistonDiameter: number;
  shaftDiameter: number;
  positiveLength: number;
  negativeVolume: number;
  spacerVolume: number;
  spacers: number;
  endStrokeVolume: number;
  travel: number;
}

/**
 * Builds and checks an air spring. `prefix` is the input path of the part (`fork` or `shock`), so
 * that an error names the field the rider can change.
 */
export function makeAirSpring(p: AirSpringParams, prefix: string): AirSpring {
  const area = circleArea(p.pistonDiameter);
  if (p.shaftDiameter > p.pistonDiameter) {
    throw new SpringModelInputError(
      `${prefix}.geometry.shaftDiameterMm`,
      'the shaft cannot be wider than the air piston',
    );
  }
  const negativeArea = area - circleArea(p.shaftDiameter);
  const positiveVolume = area * p.positiveLength - p.spacers * p.spacerVolume;
  const swept = area * p.travel;
  if (positiveVolume <= swept) {
    const field = p.spacers > 0 ? `${prefix}.spacers` : `${prefix}.geometry.positiveLengthMm`;
    const why =
      p.spacers > 0
        ? `${p.spacers} spacers leave less air than the travel sweeps: the chamber would close before full travel`
        : 'the positive air column must be longer than the travel';
    throw new SpringModelInputError(field, why);
  }
  return {
    area,
    negativeArea,
    positiveVolume,
    negativeVolume: p.negativeVolume,
    endStrokeVolume: p.endStrokeVolume,
    travel: p.travel,
  };
}

function hasNegativeChamber(s: AirSpring): boolean {
  return s.negativeArea > 0 && s.negativeVolume > 0;
}

function hasEndStroke(s: AirSpring, c: AirCharge): c is AirCharge & { pEnd: number } {
  return c.pEnd !== null && s.endStrokeVolume > 0;
}

/**
 * The end-stroke pressure the spring really works with: set below the main chamber, the floating
 * piston is pushed back as the main chamber is pumped, and both share p₀ (one chamber of V₀' + V_e).
 */
export function effectiveEndStrokePressure(c: AirCharge): number | null {
  return c.pEnd === null ? null : Math.max(c.pEnd, c.p0);
}

/**
 * Travel at which the main chamber reaches p_e and the end-stroke chamber joins:
 * x_j = (V₀'/A)·(1 − (p₀/p_e)^(1/n)). Null without an end-stroke chamber; may exceed the travel.
 */
export function joinTravel(s: AirSpring, c: AirCharge): number | null {
  if (!hasEndStroke(s, c)) return null;
  const pe = Math.max(c.pEnd, c.p0);
  return (s.positiveVolume / s.area) * (1 - Math.pow(c.p0 / pe, 1 / c.n));
}

/** Absolute positive-chamber pressure p(x), Pa. */
export function positivePressure(s: AirSpring, c: AirCharge, x: number): number {
  const alone = c.p0 * Math.pow(s.positiveVolume / (s.positiveVolume - s.area * x), c.n);
  if (!hasEndStroke(s, c)) return alone;
  const pe = Math.max(c.pEnd, c.p0);
  if (alone < pe) return alone;
  // p(x) = [(V₀'·p₀^(1/n) + V_e·p_e^(1/n)) / (V₀' + V_e − A·x)]ⁿ
  const gas = s.positiveVolume * Math.pow(c.p0, 1 / c.n) + s.endStrokeVolume * Math.pow(pe, 1 / c.n);
  return Math.pow(gas / (s.positiveVolume + s.endStrokeVolume - s.area * x), c.n);
}

/** Absolute negative-chamber pressure p₋(x) = p₀·(V₋₀/(V₋₀ + A₋·x))ⁿ, Pa (ambient when there is none). */
export function negativePressure(s: AirSpring, c: AirCharge, x: number): number {
  if (!hasNegativeChamber(s)) return c.pAmb;
  return c.p0 * Math.pow(s.negativeVolume / (s.negativeVolume + s.negativeArea * x), c.n);
}

/** Spring force F(x) = (p(x) − p_amb)·A − (p₋(x) − p_amb)·A₋, N. */
export function springForce(s: AirSpring, c: AirCharge, x: number): number {
  const positive = (positivePressure(s, c, x) - c.pAmb) * s.area;
  if (!hasNegativeChamber(s)) return positive;
  return positive - (negativePressure(s, c, x) - c.pAmb) * s.negativeArea;
}

/**
 * Spring rate k(x) = dF/dx, N/m, from the polytropic law: dp/dx = n·p·A/V(x) with V(x) the gas
 * volume the positive pressure acts in, dp₋/dx = −n·p₋·A₋/(V₋₀ + A₋·x).
 */
export function springRate(s: AirSpring, c: AirCharge, x: number): number {
  const p = positivePressure(s, c, x);
  const xj = joinTravel(s, c);
  const joined = xj !== null && x >= xj;
  const volume = (joined ? s.positiveVolume + s.endStrokeVolume : s.positiveVolume) - s.area * x;
  let k = (s.area * c.n * p * s.area) / volume;
  if (hasNegativeChamber(s)) {
    const pn = negativePressure(s, c, x);
    k += (s.negativeArea * c.n * pn * s.negativeArea) / (s.negativeVolume + s.negativeArea * x);
  }
  return k;
}

/** Composite Simpson's rule over [a, b] with `panels` (even) panels. */
function simpson(f: (x: number) => number, a: number, b: number, panels = 400): number {
  if (b <= a) return 0;
  const h = (b - a) / panels;
  let sum = f(a) + f(b);
  for (let i = 1; i < panels; i++) sum += (i % 2 === 1 ? 4 : 2) * f(a + i * h);
  return (sum * h) / 3;
}

/**
 * Energy stored from full extension to x, ∫₀ˣ F dx, J — numerically (Simpson), split where the
 * end-stroke chamber joins so that each piece is smooth. The tests check it against the closed-form
 * polytropic work and an independent ODE integrator.
 */
export function storedEnergy(s: AirSpring, c: AirCharge, x: number): number {
  const f = (t: number) => springForce(s, c, t);
  const xj = joinTravel(s, c);
  if (xj !== null && xj > 0 && xj < x) return simpson(f, 0, xj) + simpson(f, xj, x);
  return simpson(f, 0, x);
}
