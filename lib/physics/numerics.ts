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
