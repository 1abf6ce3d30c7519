/**
 * Small numerical helpers shared by the planners.
 */

export interface RootResult {
  /** The root estimate. */
  x: number;
  /** f at x. */
  fx: number;
  /** Evaluations of f, the two end points included. */
  evaluations: number;
  /** True when the bracket shrank below the tolerance or f(x) was exactly zero. */
  converged: boolean;
}

/**
 * Brent's method for a root of f on [a, b] where f(a) and f(b) have opposite signs (or one is zero):
 * inverse quadratic interpolation or the secant step when they fall well inside the bracket, bisection
 * otherwise, so it never does worse than bisection and usually converges superlinearly [brent1973].
 * Stops when the bracket is below `xtol_abs + 4·ε·|x|` or after `maxEvaluations`.
 * Throws a RangeError when the ends do not bracket a sign change: callers test the ends first.
 */
export function brent(f: (x: number) => number, a: number, b: number, opts: { xtol_abs?: number; maxEvaluations?: number; fa?: number; fb?: number } = {}): RootResult {
  const tol = opts.xtol_abs ?? 1e-9;
  const maxEval = opts.maxEvaluations ?? 100;
  let fa = opts.fa ?? f(a);
  let fb = opts.fb ?? f(b);
  let evaluations = (opts.fa === undefined ? 1 : 0) + (opts.fb === undefined ? 1 : 0);
  if (fa === 0) return { x: a, fx: 0, evaluations, converged: true };
  if (fb === 0) return { x: b, fx: 0, evaluations, converged: true };
  if (!(Number.isFinite(fa) && Number.isFinite(fb)) || fa > 0 === fb > 0) throw new RangeError("brent: f(a) and f(b) must have opposite signs");
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  while (evaluations < maxEval) {
    if (fb > 0 === fc > 0) {
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
    const xm = 0.5 * (c - b);
    if (Math.abs(xm) <= tol1 || fb === 0) return { x: b, fx: fb, evaluations, converged: true };
    if (Math.abs(e) >= tol1 && Math.abs(fa) > Math.abs(fb)) {
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * xm * s; // secant
        q = 1 - s;
      } else {
        const qq = fa / fc; // inverse quadratic interpolation
        const r = fb / fc;
        p = s * (2 * xm * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      p = Math.abs(p);
      if (2 * p < Math.min(3 * xm * q - Math.abs(tol1 * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = xm; // interpolation would leave the bracket or converge too slowly: bisect
        e = d;
      }
    } else {
      d = xm;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol1 ? d : xm > 0 ? tol1 : -tol1;
    fb = f(b);
    evaluations++;
  }
  return { x: b, fx: fb, evaluations, converged: false };
}

/**
 * Linear interpolation of a sampled curve (times ascending) at t. Outside the samples: the end value when
 * `clamp` (the default), else null.
 */
export function interpolateAt(t_s: ArrayLike<number>, y: ArrayLike<number>, t: number, clamp = true): number | null {
  const n = t_s.length;
  if (n === 0) return null;
  if (t <= t_s[0]) return clamp || t >= t_s[0] - 1e-9 ? y[0] : null;
  if (t >= t_s[n - 1]) return clamp || t <= t_s[n - 1] + 1e-9 ? y[n - 1] : null;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (t_s[mid] <= t) lo = mid;
    else hi = mid;
  }
  const t0 = t_s[lo];
  const t1 = t_s[hi];
  if (t1 <= t0) return y[lo];
  const f = Math.min(1, Math.max(0, (t - t0) / (t1 - t0)));
  return y[lo] + f * (y[hi] - y[lo]);
}

/**
 * The first time a sampled curve reaches `level` going up (or down), interpolated linearly between the
 * samples either side; 0 if it starts there, null if it never gets there.
 */
export function firstCrossing(t_s: ArrayLike<number>, y: ArrayLike<number>, level: number, direction: "up" | "down"): number | null {
  const reached = direction === "up" ? (v: number) => v >= level : (v: number) => v <= level;
  if (y.length === 0) return null;
  if (reached(y[0])) return 0;
  for (let i = 1; i < y.length; i++) {
    if (reached(y[i])) {
      const f = (level - y[i - 1]) / (y[i] - y[i - 1]);
      return t_s[i - 1] + Math.min(1, Math.max(0, f)) * (t_s[i] - t_s[i - 1]);
    }
  }
  return null;
}

/**
 * The first time a continuous, monotone-in-time quantity f(t) reaches `level` in [0, tMax] (Brent's method on
 * f(t) − level, to 1 ms); 0 if it starts there, null if it does not get there by tMax.
 */
export function firstTimeReaching(f: (t: number) => number, level: number, direction: "up" | "down", tMax: number): number | null {
  const g = (t: number) => (direction === "up" ? f(t) - level : level - f(t));
  const g0 = g(0);
  if (g0 >= 0) return 0;
  const g1 = g(tMax);
  if (!(g1 >= 0)) return null;
  return brent(g, 0, tMax, { fa: g0, fb: g1, xtol_abs: 1e-3, maxEvaluations: 200 }).x;
}

/**
 * Variable-step BDF2, α0 E¹ + α1 E⁰ + α2 E⁻¹ = h·F(E¹) with ω = h/h_prev, which the solvers take as a
 * backward-Euler step of length h/α0 from E* = E⁰ + (α2/α0)(E⁰ − E⁻¹): α0 = (1 + 2ω)/(1 + ω) and
 * α2 = ω²/(1 + ω); ω = 0 (no history) gives backward Euler, α0 = 1 and α2 = 0. Zero-stable for
 * ω < 1 + √2 [hairerWanner1996].
 */
export function bdf2Alpha0(w: number): number {
  return (1 + 2 * w) / (1 + w);
}

/** α2 of variable-step BDF2 at the step ratio ω (see bdf2Alpha0). */
export function bdf2Alpha2(w: number): number {
  return (w * w) / (1 + w);
}
