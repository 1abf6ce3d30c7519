import { evalMaterial, type EnthalpyMaterial } from "./solver1d";
import { bdf2Alpha0, bdf2Alpha2 } from "./numerics";

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
 * sub-steps of 10 % of the time since packing (shorter only at the very start, on the contact's own time
 * scale), with the pack's surface and the centre taken linearly between the box model's steps, so the
 * time at which the face crosses a limit does not depend on the box's step or grid. Heat capacity and
 * conductivity are taken at each node's temperature at the start of the sub-step (apparent heat
 * capacity): accurate above the freezing band, which is where it is used (the first crossing of a lower
 * limit at or above the initial freezing point); through the band itself it does not conserve the
 * latent heat exactly (a level 7 K below a 1 K freezing band was crossed 4 % early against a 16×-refined
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
 * first spacing the smaller of 0.05 mm and 0.5 % of k/h, growing by 1.15 a cell for 24 cells and by
 * 1.3 beyond; sub-steps 10 % of the time since packing, no shorter than 10⁻⁵ of the contact time
 * (between 0.1 µs and 0.2 s). Worst crossing-time error at these: 0.7 % (h from 20 to 10⁴ W/m²K).
 */
const FIRST_SPACING_M = 5e-5;
const FIRST_SPACING_PER_CONTACT_LENGTH = 0.005;
const GROWTH = 1.15;
const FINE_CELLS = 24;
const COARSE_GROWTH = 1.3;
const STEP_SHARE = 0.1;
/** Sub-steps as a share of the time since packing while no crossing is possible (see advance). */
const CARRY_SHARE = 0.5;
const MIN_STEP_PER_CONTACT_TIME = 1e-5;
/** Largest growth of one sub-step over the last (variable-step BDF2 is zero-stable below 1 + √2). */
const MAX_REGROWTH = 1.9;
const MIN_STEP_RANGE_S = [1e-7, 0.2] as const;

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
  // temperature). Geometric from the first spacing, slowly over the first cells and faster beyond
  // them; the last cell ends at the depth exactly (a sliver is merged into the cell before it).
  const d1 = Math.max(1e-9, Math.min(FIRST_SPACING_M, FIRST_SPACING_PER_CONTACT_LENGTH * contactLength_m)) / refine;
  const fineCells = Math.round(FINE_CELLS * refine);
  const coarseGrowth = Math.pow(COARSE_GROWTH, 1 / refine);
  const xs = [0];
  for (let dx = d1, i = 0; xs[xs.length - 1] < depth; i++) {
    xs.push(xs[xs.length - 1] + dx);
    dx *= i < fineCells ? growth : coarseGrowth;
  }
  if (xs.length > 2 && depth - xs[xs.length - 2] < 0.3 * (xs[xs.length - 2] - xs[xs.length - 3])) xs.splice(xs.length - 2, 1);
  xs[xs.length - 1] = depth;
  const x = Float64Array.from(xs);
  const n = x.length - 1;
  const vol = new Float64Array(n); // cell width per unit area of each free node, m
  for (let i = 0; i < n; i++) vol[i] = ((i === 0 ? 0 : x[i] - x[i - 1]) + (x[i + 1] - x[i])) / 2;
  const T = new Float64Array(n).fill(spec.start_C);
  const bp = new Float64Array(n);
  const dp = new Float64Array(n);
  const g = new Float64Array(n);
  const invDx = new Float64Array(n);
  for (let i = 0; i < n; i++) invDx[i] = 1 / (x[i + 1] - x[i]);
  const kn = new Float64Array(n);
  const cn = new Float64Array(n);
  const Hn = new Float64Array(n);
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
    const ratio = hPrev > 0 ? dt / hPrev : Infinity;
    const w = ratio <= 2 ? ratio : 0;
    const a0 = bdf2Alpha0(w);
    const star = bdf2Alpha2(w) / a0;
    const dtE = dt / a0;
    // H, its slope and k of every node from one fused look-up (the material's table where it has one).
    evalMaterial(m, T, 0, n, Hn, cn, kn, 1);
    // Interface conductances: harmonic mean of the two nodes' conductivities (patankar1980); the last
    // one reaches the centre, held at Tc.
    for (let i = 0; i < n - 1; i++) g[i] = ((2 * kn[i] * kn[i + 1]) / (kn[i] + kn[i + 1])) * invDx[i];
    g[n - 1] = kn[n - 1] * invDx[n - 1];
    // Assembly and forward elimination of the tridiagonal rows in one sweep (Thomas algorithm):
    // row i: −g[i−1]·T[i−1] + (C + g[i−1] + g[i] + hc·[i = 0])·T[i] − g[i]·T[i+1] = C·T*[i] + sources.
    const f = m.rho_kg_m3 / dtE;
    let bPrev = 1;
    let dPrev = 0;
    for (let i = 0; i < n; i++) {
      const C = f * cn[i] * vol[i];
      const gW = i === 0 ? 0 : g[i - 1];
      let bi = C + gW + g[i] + (i === 0 ? hc : 0);
      let di = C * (T[i] + star * (T[i] - Tm1[i])) + (i === 0 ? hc * Tp : 0) + (i === n - 1 ? g[i] * Tc : 0);
      if (i > 0) {
        const r = gW / bPrev;
        bi -= r * gW;
        di += r * dPrev;
      }
      bp[i] = bi;
      dp[i] = di;
      bPrev = bi;
      dPrev = di;
    }
    Tm1.set(T);
    hPrev = dt;
    T[n - 1] = dp[n - 1] / bp[n - 1];
    for (let i = n - 2; i >= 0; i--) T[i] = (dp[i] + g[i] * T[i + 1]) / bp[i];
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
      // While the pack's surface, the centre and the whole column stay at or above the level over the
      // step, the face cannot fall below it (the heat equation's maximum principle): the column is then
      // carried across in coarser sub-steps (CARRY_SHARE), which keep its state for a later crossing.
      let lowest = Math.min(packPrev, pack_C, corePrev, core_C);
      for (let i = 0; i < n && lowest >= level_C; i++) if (T[i] < lowest) lowest = T[i];
      const share = lowest >= level_C ? CARRY_SHARE : STEP_SHARE;
      while (t < t_s - 1e-9) {
        // After a step shortened to end on the box's step, regrow by at most 1.9× (BDF2 stays zero-stable).
        const dt = Math.min(t_s - t, Math.max(minStep_s, (share * t) / refine), hPrev > 0 ? MAX_REGROWTH * hPrev : Infinity);
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
