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
 * grid (first spacing about 0.05 mm), with a contact coefficient to the pack's surface at the face and
 * the body's centre temperature at its far end. It is stepped by backward Euler (finite volumes,
 * Patankar's practice B: nodes on the faces, half cells at the ends) in sub-steps no longer than 5 % of
 * the time since packing, with the pack's surface and the centre taken linearly between the box
 * model's steps, so the time at which the face crosses a limit does not depend on the box's step or
 * grid. Heat capacity and conductivity are taken at each node's temperature at the start of the
 * sub-step (apparent heat capacity, with the latent heat inside it).
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

/** Spacing of the column's first cell at refinement 1, m, and its growth from the face inwards. */
const FIRST_SPACING_M = 5e-5;
const GROWTH = 1.3;
/** Longest sub-step as a share of the time since packing, and the shortest sub-step, s. */
const STEP_SHARE = 0.05;
const MIN_STEP_S = 0.2;

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
  const depth = Math.max(spec.depth_m, 1e-3);
  // Node positions: x[0] = 0 (the face), x[n] = depth (the centre, held at the body's centre
  // temperature). Geometric from the first spacing; the last cell ends at the depth exactly.
  const d1 = FIRST_SPACING_M / refine;
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
  const m = spec.material;
  const hc = spec.contact_W_m2K;
  let t = 0;
  let packPrev = spec.pack_C;
  let corePrev = spec.start_C;

  /** One backward-Euler step of dt with the pack at Tp and the centre at Tc (Thomas algorithm). */
  const step = (dt: number, Tp: number, Tc: number) => {
    for (let i = 0; i < n; i++) {
      const C = (m.rho_kg_m3 * Math.max(m.c_J_kgK(T[i]), 1) * vol[i]) / dt;
      const gW = i === 0 ? 0 : (0.5 * (m.k_W_mK(T[i - 1]) + m.k_W_mK(T[i]))) / (x[i] - x[i - 1]);
      const gE = (i === n - 1 ? m.k_W_mK(T[i]) : 0.5 * (m.k_W_mK(T[i]) + m.k_W_mK(T[i + 1]))) / (x[i + 1] - x[i]);
      a[i] = -gW;
      c[i] = i === n - 1 ? 0 : -gE;
      b[i] = C + gW + gE + (i === 0 ? hc : 0);
      d[i] = C * T[i] + (i === 0 ? hc * Tp : 0) + (i === n - 1 ? gE * Tc : 0);
    }
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
        const dt = Math.min(t_s - t, Math.max(MIN_STEP_S, STEP_SHARE * t) / refine);
        const f = (t + dt - t0) / span;
        const before = T[0];
        step(dt, packPrev + f * (pack_C - packPrev), corePrev + f * (core_C - corePrev));
        if (crossing === null && T[0] < level_C) crossing = before === T[0] ? t + dt : t + (dt * (before - level_C)) / (before - T[0]);
        t += dt;
      }
      t = t_s;
      packPrev = pack_C;
      corePrev = core_C;
      return crossing;
    },
  };
}
