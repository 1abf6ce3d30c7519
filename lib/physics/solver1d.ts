/**
 * One-dimensional transient conduction with phase change: implicit finite-volume scheme on an enthalpy
 * formulation [patankar1980, voller1990], stepped by variable-step BDF2 (the first step backward Euler).
 *
 * - Geometry: slab (half-thickness L, symmetric), infinite cylinder or sphere (radius R), vertex-centred
 *   grid with half cells at the centre and at the surface, so both temperatures are node values. A
 *   hollow cylinder or sphere (a shell from `innerRadius_m` to R with an insulated inner face, a closed
 *   cavity) uses the same grid between the two faces; its "centre" is the inner face.
 * - Unknowns: node temperatures; the stored quantity is ρ·H(T) with the material's tabulated enthalpy,
 *   so latent heat is released across the freezing range without tracking a front.
 * - Time: BDF2 on the stored enthalpy, α0 E¹ + α1 E⁰ + α2 E⁻¹ = h·F(T¹); with `adaptive`, the step follows
 *   an estimate of BDF2's local error (distance to the quadratic extrapolation of the last three states).
 * - Each step solves the nonlinear balance by Newton iterations on a tridiagonal system, with the
 *   tangent slope of the tabulated H as heat capacity; a step that does not converge is retried with
 *   half the time step. Interface conductance is the harmonic mean of the nodes' k(T).
 * - Boundary: convection plus radiation to time-varying temperatures (radiation exact, σT⁴), a fixed
 *   temperature, or a coupled lumped node (a tray) with its own capacity and its own exchange with air.
 *   A convective boundary may add a heat flux that depends on the surface temperature, with its slope
 *   (evaporation). A slab may also exchange at its other face (`innerBoundary`, x* = 0): then it is not
 *   symmetric, `halfSize_m` is its full thickness and `center_C` is the temperature of that face.
 * - Energy bookkeeping: after convergence the change of stored enthalpy equals the boundary heat
 *   integrated over the steps to round-off (internal fluxes cancel pairwise); `energyError_J` reports it.
 *
 * Quantities are per unit of surface "measure": per m² of face (slab), per m of length × 2π… — the solver
 * works with r^m areas and the caller scales with `surfaceArea_m2` and `volume_m3` of the real item.
 */
import { SIGMA_W_M2K4 } from "./surfaces";
import { KELVIN_OFFSET, PhysicsInputError, requirePositive, requireTemperature } from "./validation";
import type { Shape1D } from "./conduction";
import { evalTable, evalTableH, type PropertyTable } from "./table";
import { bdf2Alpha0, bdf2Alpha2 } from "./numerics";

export interface EnthalpyMaterial {
  rho_kg_m3: number;
  H_J_kg(T_C: number): number;
  c_J_kgK(T_C: number): number;
  k_W_mK(T_C: number): number;
  /** The tabulated form (foods and packs have one): the solvers then read H, c and k with one fused look-up. */
  table?: PropertyTable;
}

/**
 * H, dH/dT (at least `cMin`) and k of nodes from … to−1: the fused table look-up when the material has a
 * table, else its three functions. Shared by the 1-D solver and the box network.
 */
export function evalMaterial(mat: EnthalpyMaterial, T: Float64Array, from: number, to: number, H: Float64Array, c: Float64Array, k: Float64Array, cMin: number): void {
  if (mat.table) {
    evalTable(mat.table, T, from, to, H, c, k, cMin);
    return;
  }
  for (let j = from; j < to; j++) {
    H[j] = mat.H_J_kg(T[j]);
    c[j] = Math.max(mat.c_J_kgK(T[j]), cMin);
    k[j] = mat.k_W_mK(T[j]);
  }
}

/** H only of nodes from … to−1. */
export function evalMaterialH(mat: EnthalpyMaterial, T: Float64Array, from: number, to: number, H: Float64Array): void {
  if (mat.table) {
    evalTableH(mat.table, T, from, to, H);
    return;
  }
  for (let j = from; j < to; j++) H[j] = mat.H_J_kg(T[j]);
}

export type Boundary =
  | {
      kind: "convective";
      /** Convective coefficient, may depend on time and on the current surface temperature. */
      h_W_m2K: (t_s: number, Ts_C: number) => number;
      fluid_C: (t_s: number) => number;
      /** Long-wave emissivity and radiant surroundings; omit for no radiation (e.g. in water). */
      emissivity?: number;
      radiant_C?: (t_s: number) => number;
      /** Extra heat flux into the surface, W/m² (e.g. absorbed sun). */
      extraFlux_W_m2?: (t_s: number) => number;
      /** Heat flux into the surface that depends on its temperature (e.g. evaporation, negative), W/m², and its slope d q/d Ts, W/(m²·K). */
      surfaceFlux?: (t_s: number, Ts_C: number) => { q_W_m2: number; dq_dT_W_m2K: number };
    }
  | { kind: "fixed"; T_C: (t_s: number) => number }
  | {
      kind: "node";
      /** Contact conductance between the item's surface and the node, W/(m²·K) of item surface. */
      contact_W_m2K: number;
      /** Node heat capacity per m² of item surface, J/(m²·K). */
      capacity_J_m2K: number;
      /** Node's own exchange with a fluid, W/(m²·K) per m² of item surface, to this temperature. */
      exchange_W_m2K: (t_s: number, Tnode_C: number) => number;
      fluid_C: (t_s: number) => number;
      node0_C: number;
      /** The rest of the item's surface exchanges with a fluid too (coefficients per m² of the whole surface). */
      air?: { h_W_m2K: (t_s: number, Ts_C: number) => number; fluid_C: (t_s: number) => number; emissivity?: number; radiant_C?: (t_s: number) => number };
    };

export interface Solver1DInput {
  shape: Shape1D;
  halfSize_m: number;
  /** Hollow cylinder or sphere: radius of the insulated inner face (0 or omitted: solid). */
  innerRadius_m?: number;
  nodes: number;
  material: EnthalpyMaterial;
  initial_C: number | ((xStar: number) => number);
  boundary: Boundary;
  /** Slab only: a convective exchange at the face x* = 0 too (instead of symmetry). */
  innerBoundary?: Extract<Boundary, { kind: "convective" }>;
  tEnd_s: number;
  dt_s: number;
  /** Stop early once this returns true (checked after every step). */
  stopWhen?: (s: StepState) => boolean;
  /** Keep every k-th step in the series (the last step is always kept). */
  recordEvery?: number;
  /**
   * Adaptive steps, between dt_s/1000 and `dtMax_s`, each step at most twice the last: the first two steps
   * so that the largest change of a node's enthalpy, in kelvin of a 3 kJ/(kg·K) material, is about
   * `target_K`; then so that BDF2's estimated local error is about target_K/100 K. Off when omitted (fixed dt_s).
   */
  adaptive?: { target_K: number; dtMax_s: number };
}

export interface StepState {
  t_s: number;
  center_C: number;
  surface_C: number;
  mean_C: number;
  node_C: number | null;
  /** Warmest node. */
  max_C: number;
}

export interface Solver1DResult {
  t_s: number[];
  center_C: number[];
  surface_C: number[];
  mean_C: number[];
  node_C: number[] | null;
  /** Warmest node at each recorded step (the slowest point of a cooling, wherever it sits). */
  max_C?: number[];
  steps: number;
  newtonIterations: number;
  /** Stored enthalpy change of the item (and node), J per unit surface measure × area factor. */
  storedChange_J: number;
  /** Integrated heat in through the boundary, same basis. */
  boundaryHeat_J: number;
  energyError_J: number;
  /** Final profile, centre to surface. */
  profile_C: number[];
  minT_C: number;
  maxT_C: number;
  stoppedEarly: boolean;
}

/**
 * Newton stops once the temperature error left after an update is below this, K (or the residuals are at
 * round-off): the update itself, or its contraction estimate θ/(1 − θ)·|δ| [hairerWanner1996]. Seven orders
 * below the local error the step control aims at (0.01 K per kelvin of target), so the answers do not
 * depend on it (1e-9 and 1e-7 give thaw times within 1e-5 of each other). What sets it is the energy
 * balance: internal fluxes cancel pairwise and H is linear within a table cell, so the balance is exact
 * except where a last update crosses a cell edge; at 1e-8 a freezing slab's balance error reached 2e-9 of
 * the heat stored, at 1e-9 it stays at round-off. The contraction test cuts the iterations per step from
 * about 4.7 to 3.6 on the bench thaw. Every loop is bounded: Newton at 60 iterations, then the step is
 * halved, down to 1e-4 of dt_s before a field error.
 */
const NEWTON_TOL_K = 1e-9;
/** Local error aimed at per step, K, for each kelvin of `adaptive.target_K` (tuned with npm run bench:peer). */
const LTE_PER_TARGET = 0.01;
const M_OF: Record<Shape1D, number> = { slab: 0, cylinder: 1, sphere: 2 };

/** ∫ r^m dr from a to b. */
function shellVolume(m: number, a: number, b: number): number {
  return (Math.pow(b, m + 1) - Math.pow(a, m + 1)) / (m + 1);
}

export function solve1D(inp: Solver1DInput): Solver1DResult {
  const L = requirePositive("halfSize_m", inp.halfSize_m);
  if (!Number.isInteger(inp.nodes) || inp.nodes < 3) throw new PhysicsInputError("nodes", "needs at least 3 nodes");
  requirePositive("tEnd_s", inp.tEnd_s);
  requirePositive("dt_s", inp.dt_s);
  const n = inp.nodes;
  const m = M_OF[inp.shape];
  const r0 = inp.innerRadius_m ?? 0;
  if (!(r0 >= 0 && r0 < L)) throw new PhysicsInputError("innerRadius_m", "the inner radius must be at least 0 and smaller than the outer one");
  if (r0 > 0 && m === 0) throw new PhysicsInputError("innerRadius_m", "a slab cannot be hollow");
  const ib = inp.innerBoundary;
  if (ib && m !== 0) throw new PhysicsInputError("innerBoundary", "only a slab has a second face");
  const dr = (L - r0) / (n - 1);
  const r = Float64Array.from({ length: n }, (_, i) => r0 + i * dr);
  const vol = new Float64Array(n);
  const area = new Float64Array(n); // area of face between i and i+1
  for (let i = 0; i < n; i++) vol[i] = shellVolume(m, Math.max(r0, r[i] - dr / 2), Math.min(L, r[i] + dr / 2));
  for (let i = 0; i < n - 1; i++) area[i] = Math.pow(r[i] + dr / 2, m);
  const Asurf = Math.pow(L, m);
  const rho = requirePositive("density", inp.material.rho_kg_m3);
  const mat = inp.material;
  const { H_J_kg: H, k_W_mK: kOf } = mat;

  const T = new Float64Array(n);
  for (let i = 0; i < n; i++) T[i] = typeof inp.initial_C === "number" ? inp.initial_C : inp.initial_C(i / (n - 1));
  for (let i = 0; i < n; i++) requireTemperature("initial temperature", T[i]);
  const Hold = new Float64Array(n);
  // H of the current temperatures, carried from the last Newton iteration into the next step.
  const Hcur = new Float64Array(n);
  evalMaterialH(mat, T, 0, n, Hcur);
  const cN = new Float64Array(n);
  // BDF2 history: H at the step's start and at the two accepted steps before, their lengths, the node's past temperatures.
  const Hs = new Float64Array(n);
  const Hm1 = new Float64Array(n);
  const Hm2 = new Float64Array(n);
  let hist = 0;
  let hPrev1 = 0;
  let hPrev2 = 0;
  let TnM1 = 0;
  let TnStar = 0;
  let qPrev = 0;
  const Told = new Float64Array(n);
  const G = new Float64Array(n - 1);
  const kNode = new Float64Array(n);
  const Hnow = new Float64Array(n);
  const Tprev = new Float64Array(n);
  let dtPrev = 0;
  const a = new Float64Array(n + 1);
  const b = new Float64Array(n + 1);
  const cc = new Float64Array(n + 1);
  const d = new Float64Array(n + 1);
  const Rr = new Float64Array(n + 1);
  const bc = inp.boundary;
  const hasNode = bc.kind === "node";
  let Tn = hasNode ? bc.node0_C : 0;
  let TnOld = Tn;
  const Cnode = hasNode ? bc.capacity_J_m2K * Asurf : 0;

  const volTotal = vol.reduce((s, v) => s + v, 0);
  const maxT = () => {
    let s = -Infinity;
    for (let i = 0; i < n; i++) if (T[i] > s) s = T[i];
    return s;
  };
  const meanT = () => {
    let s = 0;
    for (let i = 0; i < n; i++) s += vol[i] * T[i];
    return s / volTotal;
  };
  const energy = () => {
    let s = 0;
    for (let i = 0; i < n; i++) s += rho * vol[i] * H(T[i]);
    return s + (hasNode ? Cnode * Tn : 0);
  };

  const rec = Math.max(1, Math.floor(inp.recordEvery ?? 1));
  const out: Solver1DResult = {
    t_s: [0],
    center_C: [T[0]],
    surface_C: [T[n - 1]],
    mean_C: [meanT()],
    node_C: hasNode ? [Tn] : null,
    max_C: [maxT()],
    steps: 0,
    newtonIterations: 0,
    storedChange_J: 0,
    boundaryHeat_J: 0,
    energyError_J: 0,
    profile_C: [],
    minT_C: Math.min(...T),
    maxT_C: Math.max(...T),
    stoppedEarly: false,
  };
  const E0 = energy();
  let Qin = 0;
  let t = 0;

  // Boundary heat flow into the surface node (W per area-measure) and its derivative w.r.t. Ts.
  // Results of the flow functions (no tuple per call): heat flow and its slope.
  let flowQ = 0;
  let flowDQ = 0;
  const convectiveFlow = (c: NonNullable<Extract<Boundary, { kind: "node" }>["air"]> | Extract<Boundary, { kind: "convective" }>, tNew: number, Ts: number, A: number): void => {
    const h = c.h_W_m2K(tNew, Ts);
    let q = h * (c.fluid_C(tNew) - Ts);
    let dq = -h;
    if (c.emissivity && c.emissivity > 0) {
      const Tr = (c.radiant_C ? c.radiant_C(tNew) : c.fluid_C(tNew)) + KELVIN_OFFSET;
      const Tk = Ts + KELVIN_OFFSET;
      q += c.emissivity * SIGMA_W_M2K4 * (Tr ** 4 - Tk ** 4);
      dq -= 4 * c.emissivity * SIGMA_W_M2K4 * Tk ** 3;
    }
    if ("kind" in c) {
      if (c.extraFlux_W_m2) q += c.extraFlux_W_m2(tNew);
      if (c.surfaceFlux) {
        const f = c.surfaceFlux(tNew, Ts);
        q += f.q_W_m2;
        dq += f.dq_dT_W_m2K;
      }
    }
    flowQ = q * A;
    flowDQ = dq * A;
  };
  const surfaceConv = bc.kind === "convective" ? bc : bc.kind === "node" ? bc.air : undefined;
  /** Sets flowQ, flowDQ for the outer surface. */
  const surfaceFlow = (tNew: number, Ts: number): void => {
    if (surfaceConv) convectiveFlow(surfaceConv, tNew, Ts, Asurf);
    else flowQ = flowDQ = 0;
  };
  // The slab's other face (x* = 0) has unit area.
  const innerFlow = (tNew: number, T0: number): void => {
    if (ib) convectiveFlow(ib, tNew, T0, 1);
    else flowQ = flowDQ = 0;
  };

  let dt = inp.dt_s;
  let step = 0;
  // One state object, refilled after every step (stopWhen reads it there and then).
  const state: StepState = { t_s: 0, center_C: 0, surface_C: 0, mean_C: 0, node_C: null, max_C: 0 };
  while (t < inp.tEnd_s - 1e-9) {
    const dtStep = Math.min(dt, inp.tEnd_s - t);
    const tNew = t + dtStep;
    // Guard: a step too small to change t (below its rounding) would repeat for ever; t is then at tEnd.
    if (!(tNew > t)) break;
    Told.set(T);
    TnOld = Tn;
    // Variable-step BDF2 on the stored enthalpy, α0 E¹ + α1 E⁰ + α2 E⁻¹ = h·F(T¹), solved as a backward-Euler
    // step of length h/α0 from E* = E⁰ + (α2/α0)(E⁰ − E⁻¹); the first step is backward Euler.
    const bdf = hist >= 1;
    const w = bdf ? dtStep / hPrev1 : 0;
    const a0 = bdf2Alpha0(w);
    const a2 = bdf2Alpha2(w);
    const hE = dtStep / a0;
    const star = a2 / a0;
    Hs.set(Hcur);
    if (bdf) for (let i = 0; i < n; i++) Hold[i] = Hs[i] + star * (Hs[i] - Hm1[i]);
    else Hold.set(Hs);
    TnStar = bdf ? Tn + star * (Tn - TnM1) : Tn;
    // Predictor: extrapolate the last step's change (one fewer Newton iteration, usually).
    if (dtPrev > 0) {
      const f = Math.min(dtStep / dtPrev, 2);
      for (let i = 0; i < n; i++) T[i] = Told[i] + f * (Told[i] - Tprev[i]);
    }
    let converged = false;
    let iter = 0;
    let lastStep = Infinity;
    const fixedT = bc.kind === "fixed" ? bc.T_C(tNew) : 0;
    for (; iter < 60; iter++) {
      evalMaterial(mat, T, 0, n, Hnow, cN, kNode, 1);
      for (let i = 0; i < n - 1; i++) {
        const k1 = kNode[i];
        const k2 = kNode[i + 1];
        G[i] = ((2 * k1 * k2) / (k1 + k2)) * (area[i] / dr);
      }
      // Residuals R (W) and Jacobian rows.
      let maxRel = 0;
      for (let i = 0; i < n; i++) {
        const Hi = Hnow[i];
        // Tangent slope of the tabulated H (piecewise linear) as heat capacity: full Newton.
        const cap = (rho * vol[i] * cN[i]) / hE;
        let R = (rho * vol[i] * (Hi - Hold[i])) / hE;
        let diag = cap;
        a[i] = 0;
        cc[i] = 0;
        if (i > 0) {
          R -= G[i - 1] * (T[i - 1] - T[i]);
          diag += G[i - 1];
          a[i] = -G[i - 1];
        }
        if (i < n - 1) {
          R -= G[i] * (T[i + 1] - T[i]);
          diag += G[i];
          cc[i] = -G[i];
        }
        b[i] = diag;
        Rr[i] = R;
        const scale = (rho * vol[i] * Math.max(Math.abs(Hi), 1e4)) / dtStep;
        maxRel = Math.max(maxRel, Math.abs(R) / scale);
      }
      const s = n - 1;
      if (ib) {
        innerFlow(tNew, T[0]);
        Rr[0] -= flowQ;
        b[0] -= flowDQ;
      }
      if (bc.kind === "convective") {
        surfaceFlow(tNew, T[s]);
        Rr[s] -= flowQ;
        b[s] -= flowDQ;
      } else if (bc.kind === "fixed") {
        // Surface node pinned: replace its equation by T_s = T_fixed.
        Rr[s] = T[s] - fixedT;
        a[s] = 0;
        b[s] = 1;
        cc[s] = 0;
      } else {
        surfaceFlow(tNew, T[s]);
        Rr[s] -= flowQ;
        b[s] -= flowDQ;
        const U = bc.contact_W_m2K * Asurf;
        const Ue = bc.exchange_W_m2K(tNew, Tn) * Asurf;
        Rr[s] -= U * (Tn - T[s]);
        b[s] += U;
        cc[s] = -U;
        // node equation, index n
        Rr[n] = (Cnode * (Tn - TnStar)) / hE - U * (T[s] - Tn) - Ue * (bc.fluid_C(tNew) - Tn);
        a[n] = -U;
        b[n] = Cnode / hE + U + Ue;
        cc[n] = 0;
        maxRel = Math.max(maxRel, Math.abs(Rr[n]) / Math.max((Cnode * 100) / dtStep, 1e-9));
      }
      const size = hasNode ? n + 1 : n;
      let rmax = 0;
      for (let i = 0; i < size; i++) rmax = Math.max(rmax, Math.abs(Rr[i]));
      if (iter > 0 && (maxRel < 1e-11 || rmax < 1e-13)) {
        converged = true;
        Hcur.set(Hnow);
        break;
      }
      // Solve J δ = −R (Thomas algorithm).
      for (let i = 0; i < size; i++) d[i] = -Rr[i];
      for (let i = 1; i < size; i++) {
        const w = a[i] / b[i - 1];
        b[i] -= w * cc[i - 1];
        d[i] -= w * d[i - 1];
      }
      d[size - 1] /= b[size - 1];
      for (let i = size - 2; i >= 0; i--) d[i] = (d[i] - cc[i] * d[i + 1]) / b[i];
      let maxStep = 0;
      for (let i = 0; i < n; i++) {
        T[i] += d[i];
        maxStep = Math.max(maxStep, Math.abs(d[i]));
      }
      if (hasNode) Tn += d[n];
      // Converged once the error left after this update is below the tolerance: the update itself, or,
      // while the updates shrink at a rate θ = |δ_k|/|δ_k−1| < 1/2, the next one, bounded by θ/(1 − θ)·|δ_k|
      // (the contraction estimate [hairerWanner1996]).
      const theta = maxStep / lastStep;
      lastStep = maxStep;
      if (iter > 0 && (maxStep < NEWTON_TOL_K || (theta < 0.5 && (theta / (1 - theta)) * maxStep < NEWTON_TOL_K))) {
        converged = true;
        evalMaterialH(mat, T, 0, n, Hcur);
        iter++;
        break;
      }
    }
    if (!converged) {
      // Retry this step with half the time step.
      T.set(Told);
      Hcur.set(Hs);
      Tn = TnOld;
      dtPrev = 0;
      if (dt < inp.dt_s * 1e-4) throw new PhysicsInputError("dt_s", "the solver could not converge even with a much smaller time step");
      dt = dt / 2;
      continue;
    }
    out.newtonIterations += iter;
    // Step control: with two steps of history, the local error of BDF2 from the distance to the quadratic
    // extrapolation of the last three states (≈ 11/2 of the error at constant steps), in kelvin of a
    // 3 kJ/(kg·K) material; before that, the largest enthalpy change of a node.
    const haveEst = hist >= 2;
    let maxChange = 0;
    if (haveEst) {
      const h1 = hPrev1;
      const h2 = hPrev2;
      const L0 = ((dtStep + h1) * (dtStep + h1 + h2)) / (h1 * (h1 + h2));
      const L1 = -(dtStep * (dtStep + h1 + h2)) / (h1 * h2);
      const L2 = (dtStep * (dtStep + h1)) / ((h1 + h2) * h2);
      for (let i = 0; i < n; i++) {
        const d = Math.abs(Hcur[i] - (L0 * Hs[i] + L1 * Hm1[i] + L2 * Hm2[i]));
        if (d > maxChange) maxChange = d;
      }
      maxChange *= 2 / 11;
    } else {
      for (let i = 0; i < n; i++) {
        const dH = Math.abs(Hcur[i] - Hs[i]);
        if (dH > maxChange) maxChange = dH;
      }
    }
    maxChange /= 3000;
    Tprev.set(Told);
    dtPrev = dtStep;
    // Boundary heat flow with the converged temperatures, W.
    let Fb = 0;
    if (ib) {
      innerFlow(tNew, T[0]);
      Fb += flowQ;
    }
    if (bc.kind === "convective") {
      surfaceFlow(tNew, T[n - 1]);
      Fb += flowQ;
    } else if (bc.kind === "fixed") {
      // Heat entering through the pinned surface: what its half cell stores plus what it passes inward.
      const s = n - 1;
      const k1 = kOf(T[s - 1]);
      const k2 = kOf(T[s]);
      const Gs = ((2 * k1 * k2) / (k1 + k2)) * (area[s - 1] / dr);
      Fb += (rho * vol[s] * (Hcur[s] - Hold[s])) / hE - Gs * (T[s - 1] - T[s]);
    } else {
      surfaceFlow(tNew, T[n - 1]);
      Fb += bc.exchange_W_m2K(tNew, Tn) * Asurf * (bc.fluid_C(tNew) - Tn) + flowQ;
    }
    // The stored energy moves by (h·F + α2·ΔE_prev)/α0 per BDF2 step: booked the same way, the balance closes to round-off.
    const qStep = (dtStep * Fb + a2 * qPrev) / a0;
    qPrev = qStep;
    Qin += qStep;
    Hm2.set(Hm1);
    Hm1.set(Hs);
    TnM1 = TnOld;
    hPrev2 = hPrev1;
    hPrev1 = dtStep;
    hist++;
    t = tNew;
    step++;
    if (inp.adaptive) {
      const scale = maxChange > 0 ? (haveEst ? 0.9 * Math.cbrt((inp.adaptive.target_K * LTE_PER_TARGET) / maxChange) : inp.adaptive.target_K / maxChange) : 2;
      dt = Math.min(inp.adaptive.dtMax_s, Math.max(inp.dt_s * 1e-3, dtStep * Math.min(2, Math.max(0.5, scale))));
    } else if (dt < inp.dt_s) dt = Math.min(inp.dt_s, dt * 2);
    for (let i = 0; i < n; i++) {
      if (T[i] < out.minT_C) out.minT_C = T[i];
      if (T[i] > out.maxT_C) out.maxT_C = T[i];
    }
    state.t_s = t;
    state.center_C = T[0];
    state.surface_C = T[n - 1];
    state.mean_C = meanT();
    state.node_C = hasNode ? Tn : null;
    state.max_C = maxT();
    const stop = inp.stopWhen ? inp.stopWhen(state) : false;
    const last = stop || t >= inp.tEnd_s - 1e-9;
    if (step % rec === 0 || last) {
      out.t_s.push(t);
      out.center_C.push(state.center_C);
      out.surface_C.push(state.surface_C);
      out.mean_C.push(state.mean_C);
      if (out.node_C) out.node_C.push(Tn);
      out.max_C!.push(state.max_C);
    }
    if (stop) {
      out.stoppedEarly = true;
      break;
    }
  }
  out.steps = step;
  out.storedChange_J = energy() - E0;
  out.boundaryHeat_J = Qin;
  out.energyError_J = out.storedChange_J - Qin;
  out.profile_C = Array.from(T);
  return out;
}

/** Area measure of the unit used by the solver: slab per m² face, cylinder per radian per m, sphere per steradian. */
export function solverScale(shape: Shape1D, surfaceArea_m2: number, halfSize_m: number): number {
  // The solver's surface has measure L^m; scaling by A_real / L^m converts to the real item.
  return surfaceArea_m2 / Math.pow(halfSize_m, M_OF[shape]);
}
