import { type AirCharge, type AirSpring, joinTravel, springForce } from './air-spring';

/**
 * Brent's method (R. P. Brent, "Algorithms for Minimization without Derivatives", 1973, ch. 4):
 * inverse quadratic interpolation and the secant step, falling back to bisection, always keeping
 * the root bracketed. `f(a)` and `f(b)` must differ in sign (or one be zero).
 */
export function brent(f: (x: number) => number, lo: number, hi: number, tol = 1e-12, maxIter = 200): number {
  let a = lo;
  let b = hi;
  let fa = f(a);
  let fb = f(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (fa * fb > 0) throw new RangeError(`brent: the root is not bracketed by [${lo}, ${hi}]`);
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let i = 0; i < maxIter; i++) {
    if (fb * fc > 0) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol1 = 2 * Number.EPSILON * Math.abs(b) + 0.5 * tol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol1 || fb === 0) return b;
    if (Math.abs(e) >= tol1 && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        // secant step
        p = 2 * m * s;
        q = 1 - s;
      } else {
        // inverse quadratic interpolation
        const qa = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qa * (qa - r) - (b - a) * (r - 1));
        q = (qa - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol1 * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = d;
      }
    } else {
      d = m;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol1 ? d : m > 0 ? tol1 : -tol1;
    fb = f(b);
  }
  return b;
}

/**
 * The absolute main-chamber pressure p₀ (Pa) at which the spring carries `load` (N) at travel `x`
 * (m), with an end-stroke chamber set to the absolute pressure `pEnd` (or none).
 *
 * Closed form while the end-stroke chamber has not joined at x: F is then linear in p₀,
 *   F = p₀·(A·r₊ − A₋·r₋) − p_amb·(A − A₋), r₊ = (V₀'/(V₀' − A·x))ⁿ, r₋ = (V₋₀/(V₋₀ + A₋·x))ⁿ,
 * so p₀ = (W + p_amb·(A − A₋)) / (A·r₊ − A₋·r₋). Otherwise Brent's method on p₀ (F rises with p₀).
 * Infinity when no pressure carries the load at x (a chamber too soft to ever get there).
 */
export function solveChargePressure(
  s: AirSpring,
  x: number,
  load: number,
  pAmb: number,
  pEnd: number | null,
  n = 1,
): number {
  const rPos = Math.pow(s.positiveVolume / (s.positiveVolume - s.area * x), n);
  const withNegative = s.negativeArea > 0 && s.negativeVolume > 0;
  const aNeg = withNegative ? s.negativeArea : 0;
  const rNeg = withNegative ? Math.pow(s.negativeVolume / (s.negativeVolume + s.negativeArea * x), n) : 0;
  const closed = (load + pAmb * (s.area - aNeg)) / (s.area * rPos - aNeg * rNeg);
  const joinedAtX = pEnd !== null && s.endStrokeVolume > 0 && closed * rPos >= Math.max(pEnd, closed);
  if (!joinedAtX && closed > 0) return closed;

  const charge = (p0: number): AirCharge => ({ p0, pEnd, pAmb, n });
  const f = (p0: number) => springForce(s, charge(p0), x) - load;
  const lo = pAmb * 1e-3;
  if (f(lo) >= 0) return lo;
  let hi = Math.max(2 * pAmb, 2 * closed);
  while (f(hi) < 0 && hi < 1e10) hi *= 2;
  // No pressure up to 10 GPa carries the load at x: there is no answer, and callers must say so.
  if (f(hi) < 0) return Infinity;
  return brent(f, lo, hi, 1e-9 * hi);
}

/**
 * The travel (m) at which the spring's force reaches `load`: 0 when it already holds it at full
 * extension, the full travel when it bottoms out before (F rises with x, so the root is unique).
 */
export function travelUnderLoad(s: AirSpring, c: AirCharge, load: number): number {
  const f = (x: number) => springForce(s, c, x) - load;
  if (f(0) >= 0) return 0;
  if (f(s.travel) <= 0) return s.travel;
  return brent(f, 0, s.travel, 1e-12);
}

/** True when the end-stroke chamber joins within the travel. */
export function endStrokeJoinsWithin(s: AirSpring, c: AirCharge): boolean {
  const xj = joinTravel(s, c);
  return xj !== null && xj < s.travel;
}
