/**
 * Transient conduction without phase change, constant properties, convective surface,
 * uniform initial temperature.
 *
 * θ* = (T − T∞)/(Ti − T∞); Fo = αt/L² with L the half-thickness (slab) or radius.
 * - Lumped capacitance: θ = exp(−hA t/(ρVc)), valid for Bi = h(V/A)/k < 0.1 [incroperaLumped].
 * - Exact series: θ* = Σ Cn exp(−ζn² Fo) X(ζn x*) with eigenvalues from
 *     slab ζ tan ζ = Bi, cylinder ζ J1(ζ)/J0(ζ) = Bi, sphere 1 − ζ cot ζ = Bi, and
 *     Cn = 4 sin ζ/(2ζ + sin 2ζ), (2/ζ) J1/(J0² + J1²), 4(sin ζ − ζ cos ζ)/(2ζ − sin 2ζ) [incroperaSeries].
 *   Eigenvalues by bracketed bisection (each root lies in a known interval), Bessel functions
 *   from the `bessel` npm package.
 * - One-term approximation: the first term; error < 2 % for Fo > 0.2 [incroperaSeries].
 * - Rectangular block and finite cylinder: products of 1-D solutions [incroperaProduct].
 */
import bessel from "bessel";
import { requireNonNegative, requirePositive } from "./validation";

export type Shape1D = "slab" | "cylinder" | "sphere";

import { brent } from "./numerics";

const { besselj } = bessel;
const J0 = (x: number) => besselj(x, 0);
const J1 = (x: number) => besselj(x, 1);

/**
 * The root of f in a bracket known to hold one (Brent's method to round-off, numerics.ts). Where rounding
 * leaves no sign change at the ends (a root at an end), the end nearer zero is returned.
 */
function bisect(f: (x: number) => number, a: number, b: number): number {
  const fa = f(a);
  const fb = f(b);
  if (!(fa > 0 !== fb > 0) || fa === 0 || fb === 0) return Math.abs(fa) <= Math.abs(fb) ? a : b;
  return brent(f, a, b, { fa, fb, xtol_abs: 1e-15 * Math.max(1, Math.abs(b)), maxEvaluations: 200 }).x;
}

/** The first n zeros of J0 (needed to bracket the cylinder eigenvalues). */
const J0_ZEROS: number[] = [];
function j0Zero(k: number): number {
  while (J0_ZEROS.length <= k) {
    const m = J0_ZEROS.length + 1;
    // McMahon's asymptotic estimate brackets the m-th zero well: (m − 1/4)π ± 0.3.
    const guess = (m - 0.25) * Math.PI;
    J0_ZEROS.push(bisect(J0, guess - 0.4, guess + 0.4));
  }
  return J0_ZEROS[k];
}
const J1_ZEROS: number[] = [0];
function j1Zero(k: number): number {
  while (J1_ZEROS.length <= k) {
    const m = J1_ZEROS.length;
    const guess = (m + 0.25) * Math.PI;
    J1_ZEROS.push(bisect(J1, guess - 0.4, guess + 0.4));
  }
  return J1_ZEROS[k];
}

const cache = new Map<string, { zeta: number[]; C: number[] }>();

/** Eigenvalues ζ1…ζn and coefficients C1…Cn for a shape and Biot number. */
export function eigen(shape: Shape1D, Bi: number, n: number): { zeta: number[]; C: number[] } {
  requirePositive("Biot number", Bi);
  const key = `${shape}:${Bi}`;
  const hit = cache.get(key);
  if (hit && hit.zeta.length >= n) return { zeta: hit.zeta.slice(0, n), C: hit.C.slice(0, n) };
  const zeta: number[] = [];
  const C: number[] = [];
  const eps = 1e-12;
  for (let i = 0; i < n; i++) {
    let z: number;
    if (shape === "slab") {
      // ζ sin ζ − Bi cos ζ = 0 on ((i)π, (i)π + π/2)
      z = bisect((x) => x * Math.sin(x) - Bi * Math.cos(x), i * Math.PI + eps, i * Math.PI + Math.PI / 2 - eps);
      C.push((4 * Math.sin(z)) / (2 * z + Math.sin(2 * z)));
    } else if (shape === "cylinder") {
      // ζ J1(ζ) − Bi J0(ζ) = 0 between the i-th zero of J1 and the i-th zero of J0
      z = bisect((x) => x * J1(x) - Bi * J0(x), j1Zero(i) + eps, j0Zero(i) - eps);
      const a = J0(z);
      const b = J1(z);
      C.push(((2 / z) * b) / (a * a + b * b));
    } else {
      // (1 − Bi) sin ζ − ζ cos ζ = 0 on (iπ, (i+1)π)
      z = bisect((x) => (1 - Bi) * Math.sin(x) - x * Math.cos(x), i * Math.PI + eps, (i + 1) * Math.PI - eps);
      C.push((4 * (Math.sin(z) - z * Math.cos(z))) / (2 * z - Math.sin(2 * z)));
    }
    zeta.push(z);
  }
  if (cache.size > 2000) cache.clear();
  cache.set(key, { zeta, C });
  return { zeta: [...zeta], C: [...C] };
}

/** Spatial mode X(ζ x*) of each shape. */
function mode(shape: Shape1D, z: number, xs: number): number {
  if (shape === "slab") return Math.cos(z * xs);
  if (shape === "cylinder") return J0(z * xs);
  const u = z * xs;
  return u < 1e-8 ? 1 : Math.sin(u) / u;
}

/** Volume mean of the mode. */
function modeMean(shape: Shape1D, z: number): number {
  if (shape === "slab") return Math.sin(z) / z;
  if (shape === "cylinder") return (2 * J1(z)) / z;
  return (3 * (Math.sin(z) - z * Math.cos(z))) / (z * z * z);
}

/** Number of terms needed for the truncation error to fall below 1e-10 at this Fo. */
export function termsNeeded(Fo: number, maxTerms = 200): number {
  if (Fo <= 0) return maxTerms;
  // ζn ≳ (n − 1)π: need exp(−((n−1)π)² Fo) < 1e-10 → n > 1 + sqrt(23/Fo)/π
  return Math.min(maxTerms, Math.max(4, Math.ceil(1 + Math.sqrt(23.03 / Fo) / Math.PI) + 2));
}

/** Exact-series θ* at position x* (0 centre, 1 surface). Fo = 0 returns 1. */
export function seriesTheta(shape: Shape1D, Bi: number, Fo: number, xStar: number, nTerms = termsNeeded(Fo)): number {
  requireNonNegative("Fourier number", Fo);
  if (Bi <= 0 || Fo === 0) return 1;
  const { zeta, C } = eigen(shape, Bi, nTerms);
  let s = 0;
  for (let i = 0; i < zeta.length; i++) s += C[i] * Math.exp(-zeta[i] * zeta[i] * Fo) * mode(shape, zeta[i], xStar);
  return Math.min(1, Math.max(0, s));
}

/** Exact-series volume-mean θ*. */
export function seriesMeanTheta(shape: Shape1D, Bi: number, Fo: number, nTerms = termsNeeded(Fo)): number {
  requireNonNegative("Fourier number", Fo);
  if (Bi <= 0 || Fo === 0) return 1;
  const { zeta, C } = eigen(shape, Bi, nTerms);
  let s = 0;
  for (let i = 0; i < zeta.length; i++) s += C[i] * Math.exp(-zeta[i] * zeta[i] * Fo) * modeMean(shape, zeta[i]);
  return Math.min(1, Math.max(0, s));
}

/** One-term approximation of θ* at x* [incroperaSeries]; error < 2 % for Fo > 0.2. */
export function oneTermTheta(shape: Shape1D, Bi: number, Fo: number, xStar: number): number {
  return seriesTheta(shape, Bi, Fo, xStar, 1);
}

/** Lumped capacitance θ = exp(−Bi·Fo) with Bi, Fo on L = V/A [incroperaLumped]. */
export function lumpedTheta(h_W_m2K: number, area_m2: number, rho_kg_m3: number, volume_m3: number, c_J_kgK: number, t_s: number): number {
  return Math.exp((-h_W_m2K * area_m2 * t_s) / (rho_kg_m3 * volume_m3 * c_J_kgK));
}

/** A 3-D item as a product of 1-D solutions: each factor has its own shape, half-size L and Biot number. */
export interface ProductFactor {
  shape: Shape1D;
  halfSize_m: number;
}

export function factorsFor(
  g: { shape: "slab"; thickness_m: number } | { shape: "block"; a_m: number; b_m: number; c_m: number } | { shape: "cylinder"; diameter_m: number; length_m: number | null } | { shape: "sphere"; diameter_m: number },
): ProductFactor[] {
  switch (g.shape) {
    case "slab":
      return [{ shape: "slab", halfSize_m: g.thickness_m / 2 }];
    case "block":
      return [g.a_m, g.b_m, g.c_m].map((d) => ({ shape: "slab" as const, halfSize_m: d / 2 }));
    case "cylinder":
      return g.length_m ? [{ shape: "cylinder", halfSize_m: g.diameter_m / 2 }, { shape: "slab", halfSize_m: g.length_m / 2 }] : [{ shape: "cylinder", halfSize_m: g.diameter_m / 2 }];
    case "sphere":
      return [{ shape: "sphere", halfSize_m: g.diameter_m / 2 }];
  }
}
