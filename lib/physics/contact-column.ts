import type { EnthalpyMaterial } from "./solver1d";

/**
 * The face of a product where a coolant pack touches it, followed on its own fine grid.
 *
 * The box network carries each product as one body whose surface node is the mean over its whole
 * surface, on a grid sized for the body (a node spacing of several millimetres) and stepped with the
 * box's steps (the first one a minute long). A face pressed against a pack from the freezer cools much
 * faster than that: its temperature follows the semi-infinite contact solution, falling by a share
 * 1 − exp(β²)·erfc(β) of the gap, β = h·√(αt)/k, within seconds. The column here resolves that: a 1-D
 * slab from the touching face (node 0, at the face itself) to the product's centre, on a geometric
 * grid sized on the contact's own length k/h (see the constants below), with a contact coefficient to
 * the pack's surface at the face and the body's centre temperature at its far end. It is stepped by
 * variable-step BDF2 (finite volumes, Patankar's practice B: nodes on the faces, half cells at the ends) in
 * sub-steps of 5 % of the time since packing (shorter only at the very start, on the contact's own time
 * scale), with the pack's surface and the centre taken linearly between the box model's steps, so the
 * time at which the face crosses a limit does not depend on the box's step or grid. Heat capacity and
 * conductivity are taken at each node's temperature at the start of the sub-step (apparent heat
 * capacity): accurate above the freezing band, which is where it is used (the first crossing of a lower
 * limit at or above the initial freezing point); through the band itself it does not conserve the
 * latent heat exactly (a level 7 K below a 1 K freezing band was crossed 3 % early against a 16×-refined
 * column).
 *
 * Valid while the touching face is flat on the scale of the depth heat reaches (√(αt) ≲ the product's
 * half size); the column is one-dimensional, so a pack's edges and the product's own corners are not
 * seen. Sources: semiInfiniteConvection (the contact solution it reproduces, see
 * test/reference/contact-column.ref.test.ts) and patankar1980 (the discretisation).
 */
export interface ContactColumn {
  /** Temperature of the touching face now, °C. */
  readonly surface_C: number;
  /**
   * Steps from the column's time to t_s (> its time), the pack's surface and the centre going
   * linearly from the values at the last call (or the start) to pack_C / core_C. Returns the first
   * time within the step at which the face falls below level_C (linear between sub-steps), else null.
   */
  advance(t_s: number, pack_C: number, core_C: number, level_C: number): number | null;
}

/**
 * Grid and sub-steps, at refinement 1 (chosen by measured accuracy against the contact solution, see
 * test/reference/contact-column.ref.test.ts). The face's own scales are the contact length k/h (β = 1 at
 * √(αt) = k/h) and its time (k/h)²/α; a limit a share s of the gap away is crossed near β ≈ s, so both
 * the first cell and the first sub-steps are sized on them, for stiff contacts (h up to 10⁴ W/m²K) too:
 * first spacing the smaller of 0.05 mm and 0.5 % of k/h, growing by 1.15 a cell; sub-steps 5 % of the time
 * since packing, no shorter than 10⁻⁵ of the contact time (between 0.1 µs and 0.2 s).
 */
const FIRST_SPACING_M = 5e-5;
const FIRST_SPACING_PER_CONTACT_LENGTH = 0.005;
const GROWTH = 1.15;
const STEP_SHARE = 0.05;
const MIN_STEP_PER_CONTACT_TIME = 1e-5;
const MIN_STEP_RANGE_S = [1e-7, 0.2] as const;

const harmonic = (k1: number, k2: number) => (2 * k1 * k2) / (k1 + k2);

export function contactColumn(spec: {
  material: EnthalpyMaterial;
  /** From the touching face to the centre, m. */
  depth_m: number;
  start_C: number;
  /** Pack surface at packing, °C. */
  pack_C: number;
  contact_W_m2K: number;
  /** Multiplies the node count and divides the sub-steps (a convergence check uses 2 and 4). */
  refine?: number;
}): ContactColumn {
  const refine = Math.max(1, spec.refine ?? 1);
  const growth = Math.pow(GROWTH, 1 / refine);
  const depth = Number.isFinite(spec.depth_m) ? Math.max(spec.depth_m, 1e-3) : 1e-3;
  const m = spec.material;
  const hc = Math.max(0, spec.contact_W_m2K);
  const k0 = m.k_W_mK(spec.start_C);
  const alpha0 = k0 / (m.rho_kg_m3 * Math.max(m.c_J_kgK(spec.start_C), 1));
  const contactLength_m = hc > 0 ? k0 / hc : Infinity;
  const contactTime_s = (contactLength_m * contactLength_m) / alpha0;
  const minStep_s = Math.min(MIN_STEP_RANGE_S[1], Math.max(MIN_STEP_RANGE_S[0], MIN_STEP_PER_CONTACT_TIME * contactTime_s)) / refine;
  // Node positions: x[0] = 0 (the face), x[n] = depth (the centre, held at the body's centre
  // temperature). Geometric from the first spacing; the last cell ends at the depth exactly.
  const d1 = Math.max(1e-9, Math.min(FIRST_SPACING_M, FIRST_SPACING_PER_CONTACT_LENGTH * contactLength_m)) / refine;
  const n = Math.max(4, Math.ceil(Math.log(1 + (depth * (growth - 1)) / d1) / Math.log(growth)));
  const x = new Float64Array(n + 1);
  const scale = (depth * (growth - 1)) / (Math.pow(growth, n) - 1);
  for (let i = 1; i <= n; i++) x[i] = x[i - 1] + scale * Math.pow(growth, i - 1);
  x[n] = depth;
  const vol = new Float64Array(n); // cell width per unit area of each free node, m
  for (let i = 0; i < n; i++) vol[i] = ((i === 0 ? 0 : x[i] - x[i - 1]) + (x[i + 1] - x[i])) / 2;
  const T = new Float64Array(n).fill(spec.start_C);
  const a = new Float64Array(n);
  const b = new Float64Array(n);
  const c = new Float64Array(n);
  const d = new Float64Array(n);
  const kn = new Float64Array(n);
  let t = 0;
  let packPrev = spec.pack_C;
  let corePrev = spec.start_C;

  const Tm1 = new Float64Array(n);
  let hPrev = 0;
  /**
   * One step of dt with the pack at Tp and the centre at Tc (Thomas algorithm): variable-step BDF2,
   * written as a backward-Euler step of dt/α0 from T* = T⁰ + (α2/α0)(T⁰ − T⁻¹); backward Euler for the
   * first step and whenever the step grows by more than 2× (BDF2's zero-stability bound is 1 + √2).
   */
  const step = (dt: number, Tp: number, Tc: number) => {
    const w = hPrev > 0 ? dt / hPrev : Infinity;
    const a0 = w <= 2 ? (1 + 2 * w) / (1 + w) : 1;
    const star = w <= 2 ? (w * w) / (1 + w) / a0 : 0;
    const dtE = dt / a0;
    for (let i = 0; i < n; i++) kn[i] = m.k_W_mK(T[i]);
    for (let i = 0; i < n; i++) {
      const C = (m.rho_kg_m3 * Math.max(m.c_J_kgK(T[i]), 1) * vol[i]) / dtE;
      // Harmonic mean of the two nodes' conductivities at each interface (patankar1980).
      const gW = i === 0 ? 0 : harmonic(kn[i - 1], kn[i]) / (x[i] - x[i - 1]);
      const gE = (i === n - 1 ? kn[i] : harmonic(kn[i], kn[i + 1])) / (x[i + 1] - x[i]);
      a[i] = -gW;
      c[i] = i === n - 1 ? 0 : -gE;
      b[i] = C + gW + gE + (i === 0 ? hc : 0);
      d[i] = C * (T[i] + star * (T[i] - Tm1[i])) + (i === 0 ? hc * Tp : 0) + (i === n - 1 ? gE * Tc : 0);
    }
    Tm1.set(T);
    hPrev = dt;
    for (let i = 1; i < n; i++) {
      const w = a[i] / b[i - 1];
      b[i] -= w * c[i - 1];
      d[i] -= w * d[i - 1];
    }
    T[n - 1] = d[n - 1] / b[n - 1];
    for (let i = n - 2; i >= 0; i--) T[i] = (d[i] - c[i] * T[i + 1]) / b[i];
  };

  return {
    get surface_C() {
      return T[0];
    },
    advance(t_s, pack_C, core_C, level_C) {
      const t0 = t;
      const span = t_s - t0;
      if (!(span > 0)) return null;
      let crossing: number | null = T[0] < level_C ? t0 : null;
      while (t < t_s - 1e-9) {
        const dt = Math.min(t_s - t, Math.max(minStep_s, (STEP_SHARE * t) / refine));
        const f = (t + dt - t0) / span;
        const before = T[0];
        step(dt, packPrev + f * (pack_C - packPrev), corePrev + f * (core_C - corePrev));
        if (crossing === null && T[0] < level_C) crossing = t + (dt * (before - level_C)) / (before - T[0]);
        t += dt;
      }
      t = t_s;
      packPrev = pack_C;
      corePrev = core_C;
      return crossing;
    },
  };
}
