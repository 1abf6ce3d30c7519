/**
 * The insulated-box network model, solved implicitly (backward Euler) by Newton iterations.
 *
 * Nodes: wall and lid layer nodes (constant properties), one inside-air node, each coolant pack
 * (enthalpy, distributed across its half-thickness, or one node for dry ice) and each product
 * (enthalpy, distributed, its own shape). Chains couple to the air node at one end only, so each
 * Newton step is solved exactly by eliminating every chain's tridiagonal system towards the air node
 * and solving a scalar equation for the air (a Schur complement on an "arrow" matrix).
 *
 * - Outer faces: combined film h_o (convection by the core's correlations + radiation), driven by the
 *   sol-air temperature t_e = t_o + αI/h_o − εΔR/h_o [ashraeSolAir]: the lid sees all the sun and the sky
 *   correction (outdoors only, when sun > 0), the sides a share of the sun, the base none.
 * - Walls: layers in series, at least one node per layer with its heat capacity; areas are the inner
 *   faces. Edges and corners add conduction shape factors S = 0.54 D per edge and S = 0.15 L per corner,
 *   with the wall's overall thickness L and effective conductivity [incropera6, Table 4.1, cases 8–9,
 *   from memory], acting between outside air and inside air.
 * - Inside: every inner surface exchanges with the air node through a combined coefficient h_i
 *   (natural convection ≈ 2–5 W/(m²·K) in closed coolers, from memory, plus linearised radiation),
 *   so the air node stands for the mixed air-and-radiant inside temperature.
 * - Lid openings: during each opening the inside air exchanges with outside air at a set number of
 *   air changes per minute; moisture and condensation are ignored.
 * - Dry ice: one node at the sublimation point while solid remains; sublimated CO₂ leaves the box.
 */
import { SIGMA_W_M2K4, itemSurfaceCoefficient, CP_AIR_J_KGK, P_ATM_PA, R_AIR_J_KGK } from "./surfaces";
import { KELVIN_OFFSET, PhysicsInputError } from "./validation";
import type { EnthalpyMaterial } from "./solver1d";

export interface WallLayerSpec {
  thickness_m: number;
  k_W_mK: number;
  rho_kg_m3: number;
  c_J_kgK: number;
  insulation: boolean;
}

export interface BodySpec {
  label: string;
  material: EnthalpyMaterial;
  shapeM: 0 | 1 | 2;
  halfSize_m: number;
  volume_m3: number; // of one item
  area_m2: number; // of one item
  count: number;
  nodes: number;
  start_C: number;
}

export interface NetworkSpec {
  innerArea: { walls_m2: number; lid_m2: number };
  wallLayers: WallLayerSpec[]; // outside first
  lidLayers: WallLayerSpec[];
  edgeConductance_W_K: number;
  airVolume_m3: number;
  bodies: BodySpec[]; // packs then products (any order)
  contacts: { a: number; b: number; conductance_W_K: number }[]; // body indices, surfaces in contact
  innerH_W_m2K: number;
  boxStart_C: number;
  /** Ambient conditions as step functions of time. */
  ambient: (t_s: number) => { air_C: number; wallSolAir_C: number; lidSolAir_C: number; outerH_W_m2K: number; openExchange_W_K: number };
  breakpoints_s: number[];
  tEnd_s: number;
  /** Largest step, s (default 1800), and the enthalpy change per step the step control aims at, in kelvin of a 3 kJ/(kg·K) body (default 2). */
  dtMax_s?: number;
  targetChange_K?: number;
  /** Mesh refinement factor for wall nodes (bodies set their own node counts). */
  refine?: number;
  /** Called after every accepted step; return true to stop. */
  onStep?: (t_s: number, net: NetworkState) => boolean | void;
}

export interface NetworkState {
  air_C: number;
  /** Heat in by path so far, J (cumulative). */
  gains: { walls: number; lid: number; edges: number; sun: number; openings: number };
  /** For each body: centre (node 0) and surface (last node) temperatures, and the mean specific enthalpy. */
  bodyCenter_C: Float64Array;
  bodySurface_C: Float64Array;
  bodyMeanH_J_kg: Float64Array;
}

export interface NetworkResult {
  steps: number;
  newtonIterations: number;
  gains_J: { walls: number; lid: number; edges: number; sun: number; openings: number; contactsCheck: number };
  storedChange_J: number;
  energyError_J: number;
  t_end_s: number;
}

interface Chain {
  n: number;
  T: Float64Array;
  Told: Float64Array;
  Hold: Float64Array;
  mass: Float64Array; // kg per node (enthalpy chains) or heat capacity J/K (linear chains)
  Gfac: Float64Array; // n-1 link factors: W/K per (W/(m·K)) for enthalpy chains, or W/K for linear chains
  kLin: Float64Array | null; // per-node k for linear chains (unused: G precomputed)
  mat: EnthalpyMaterial | null;
  Gend: number; // coupling of the last node to air, W/K
  Gout: number; // coupling of node 0 to the outside (walls only), W/K
  isWall: "walls" | "lid" | null;
  // Newton work arrays
  a: Float64Array;
  b: Float64Array;
  c: Float64Array;
  d: Float64Array;
  R: Float64Array;
  bp: Float64Array;
  dp: Float64Array;
  extra: Float64Array; // explicit-in-iteration contact flux into the last node, W
  extraDiag: Float64Array;
  k: Float64Array; // node conductivities of this iteration (enthalpy chains)
}

function newChain(n: number): Chain {
  const f = () => new Float64Array(n);
  return {
    n,
    T: f(),
    Told: f(),
    Hold: f(),
    mass: f(),
    Gfac: new Float64Array(Math.max(0, n - 1)),
    kLin: null,
    mat: null,
    Gend: 0,
    Gout: 0,
    isWall: null,
    a: f(),
    b: f(),
    c: f(),
    d: f(),
    R: f(),
    bp: f(),
    dp: f(),
    extra: f(),
    extraDiag: f(),
    k: f(),
  };
}

/** Builds a wall chain: nodes outside → inside; first node couples to the outer film, last to the inner film. */
function wallChain(layers: WallLayerSpec[], area: number, kind: "walls" | "lid", refine: number): { chain: Chain; halfOuter_K_W: number; halfInner_K_W: number } {
  const cells: { dx: number; k: number; cap: number }[] = [];
  for (const L of layers) {
    const m = (L.insulation && L.thickness_m > 0.01 ? 2 : 1) * refine;
    for (let j = 0; j < m; j++) cells.push({ dx: L.thickness_m / m, k: L.k_W_mK, cap: L.rho_kg_m3 * L.c_J_kgK * area * (L.thickness_m / m) });
  }
  const ch = newChain(cells.length);
  ch.isWall = kind;
  for (let i = 0; i < cells.length; i++) ch.mass[i] = cells[i].cap;
  for (let i = 0; i < cells.length - 1; i++) {
    const r = cells[i].dx / 2 / (cells[i].k * area) + cells[i + 1].dx / 2 / (cells[i + 1].k * area);
    ch.Gfac[i] = 1 / r;
  }
  const halfOuter = cells[0].dx / 2 / (cells[0].k * area);
  const halfInner = cells[cells.length - 1].dx / 2 / (cells[cells.length - 1].k * area);
  return { chain: ch, halfOuter_K_W: halfOuter, halfInner_K_W: halfInner };
}

/** ∫ r^m dr from a to b. */
function shellVolume(m: number, a: number, b: number): number {
  return (Math.pow(b, m + 1) - Math.pow(a, m + 1)) / (m + 1);
}

/** A body chain: nodes centre → surface (vertex-centred, half cells at both ends), scaled to the real volume and area × count. */
function bodyChain(b: BodySpec): Chain {
  const n = Math.max(1, b.nodes);
  const ch = newChain(n);
  ch.mat = b.material;
  const totalMass = b.material.rho_kg_m3 * b.volume_m3 * b.count;
  if (n === 1) {
    ch.mass[0] = totalMass;
  } else {
    const R = b.halfSize_m;
    const dr = R / (n - 1);
    const vols: number[] = [];
    for (let i = 0; i < n; i++) vols.push(shellVolume(b.shapeM, Math.max(0, i * dr - dr / 2), Math.min(R, i * dr + dr / 2)));
    const vSum = vols.reduce((s, v) => s + v, 0);
    for (let i = 0; i < n; i++) ch.mass[i] = (totalMass * vols[i]) / vSum;
    // Link areas scale with the real surface: the model's surface measure R^m corresponds to area × count.
    const areaScale = (b.area_m2 * b.count) / Math.pow(R, b.shapeM);
    for (let i = 0; i < n - 1; i++) ch.Gfac[i] = (Math.pow(i * dr + dr / 2, b.shapeM) * areaScale) / dr;
  }
  ch.T.fill(b.start_C);
  return ch;
}

export function runNetwork(spec: NetworkSpec): NetworkResult {
  if (!(spec.tEnd_s > 0)) throw new PhysicsInputError("route", "the route has no length");
  const chains: Chain[] = [];
  const hi = spec.innerH_W_m2K;
  // Walls and lid.
  const amb0 = spec.ambient(0);
  const wallParts: { chain: Chain; halfOuter: number; halfInner: number; area: number }[] = [];
  for (const [kind, layers, area] of [
    ["walls", spec.wallLayers, spec.innerArea.walls_m2],
    ["lid", spec.lidLayers, spec.innerArea.lid_m2],
  ] as const) {
    const w = wallChain(layers, area, kind, Math.max(1, Math.round(spec.refine ?? 1)));
    w.chain.T.fill(spec.boxStart_C);
    w.chain.Gend = 1 / (w.halfInner_K_W + 1 / (hi * area));
    chains.push(w.chain);
    wallParts.push({ chain: w.chain, halfOuter: w.halfOuter_K_W, halfInner: w.halfInner_K_W, area });
  }
  const nWallChains = chains.length;
  // Bodies.
  const bodyStart = chains.length;
  for (const b of spec.bodies) {
    const ch = bodyChain(b);
    ch.Gend = hi * b.area_m2 * b.count;
    chains.push(ch);
  }
  const airRho = P_ATM_PA / (R_AIR_J_KGK * (spec.boxStart_C + KELVIN_OFFSET));
  const Cair = Math.max(airRho * CP_AIR_J_KGK * Math.max(spec.airVolume_m3, 1e-4), 1);
  let Tair = spec.boxStart_C;
  let TairOld = Tair;

  const energy = () => {
    let e = Cair * Tair;
    for (let ci = 0; ci < chains.length; ci++) {
      const ch = chains[ci];
      for (let i = 0; i < ch.n; i++) e += ch.mat ? ch.mass[i] * ch.mat.H_J_kg(ch.T[i]) : ch.mass[i] * ch.T[i];
    }
    return e;
  };
  const E0 = energy();
  const gains = { walls: 0, lid: 0, edges: 0, sun: 0, openings: 0, contactsCheck: 0 };
  const state: NetworkState = {
    air_C: Tair,
    gains,
    bodyCenter_C: new Float64Array(spec.bodies.length),
    bodySurface_C: new Float64Array(spec.bodies.length),
    bodyMeanH_J_kg: new Float64Array(spec.bodies.length),
  };
  const fillState = () => {
    state.air_C = Tair;
    for (let j = 0; j < spec.bodies.length; j++) {
      const ch = chains[bodyStart + j];
      state.bodyCenter_C[j] = ch.T[0];
      state.bodySurface_C[j] = ch.T[ch.n - 1];
      let hm = 0;
      let m = 0;
      for (let i = 0; i < ch.n; i++) {
        hm += ch.mass[i] * ch.mat!.H_J_kg(ch.T[i]);
        m += ch.mass[i];
      }
      state.bodyMeanH_J_kg[j] = hm / m;
    }
  };
  fillState();
  if (spec.onStep && spec.onStep(0, state)) {
    return { steps: 0, newtonIterations: 0, gains_J: gains, storedChange_J: 0, energyError_J: 0, t_end_s: 0 };
  }

  const breaks = [...spec.breakpoints_s.filter((b) => b > 0 && b < spec.tEnd_s), spec.tEnd_s].sort((x, y) => x - y);
  let nextBreak = 0;
  let t = 0;
  let dt = 60;
  const dtMax = spec.dtMax_s ?? 1800;
  const target = spec.targetChange_K ?? 2;
  let steps = 0;
  let newton = 0;
  let wallOuterG = [0, 0];

  while (t < spec.tEnd_s - 1e-9) {
    while (nextBreak < breaks.length && breaks[nextBreak] <= t + 1e-9) nextBreak++;
    const limit = nextBreak < breaks.length ? breaks[nextBreak] : spec.tEnd_s;
    const h = Math.min(dt, limit - t);
    const tNew = t + h;
    // Guard: a step too small to change t (below its rounding) would repeat for ever; t is then at the end.
    if (!(tNew > t)) break;
    // Conditions hold piecewise-constant over the step: take them at its middle.
    const amb = spec.ambient(t + h / 2);
    wallOuterG = wallParts.map((w) => 1 / (w.halfOuter + 1 / (amb.outerH_W_m2K * w.area)));
    const Te = [amb.wallSolAir_C, amb.lidSolAir_C];
    const Gedge = spec.edgeConductance_W_K;
    const Gopen = amb.openExchange_W_K;
    for (const ch of chains) {
      ch.Told.set(ch.T);
      for (let i = 0; i < ch.n; i++) ch.Hold[i] = ch.mat ? ch.mat.H_J_kg(ch.T[i]) : ch.T[i];
    }
    TairOld = Tair;
    let converged = false;
    let it = 0;
    for (; it < 40; it++) {
      // Contacts: explicit within the iteration (partner temperature as known), exact at convergence.
      for (const ch of chains) {
        ch.extra.fill(0);
        ch.extraDiag.fill(0);
      }
      for (const c of spec.contacts) {
        const A = chains[bodyStart + c.a];
        const B = chains[bodyStart + c.b];
        const q = c.conductance_W_K * (B.T[B.n - 1] - A.T[A.n - 1]);
        A.extra[A.n - 1] += q;
        B.extra[B.n - 1] -= q;
        A.extraDiag[A.n - 1] += c.conductance_W_K;
        B.extraDiag[B.n - 1] += c.conductance_W_K;
      }
      // Build and forward-eliminate each chain.
      let airDiag = Cair / h + Gedge + Gopen;
      let airRes = (Cair * (Tair - TairOld)) / h - Gedge * (amb.air_C - Tair) - Gopen * (amb.air_C - Tair);
      let airRhs = 0;
      for (let ci = 0; ci < chains.length; ci++) {
        const ch = chains[ci];
        const n = ch.n;
        const mat = ch.mat;
        for (let i = 0; i < n; i++) {
          const Ti = ch.T[i];
          let cap: number;
          let R: number;
          if (mat) {
            if (n > 1) ch.k[i] = mat.k_W_mK(Ti);
            const Hi = mat.H_J_kg(Ti);
            cap = (ch.mass[i] * Math.max(mat.c_J_kgK(Ti), 1)) / h;
            R = (ch.mass[i] * (Hi - ch.Hold[i])) / h;
          } else {
            cap = ch.mass[i] / h;
            R = (ch.mass[i] * (Ti - ch.Hold[i])) / h;
          }
          ch.a[i] = 0;
          ch.c[i] = 0;
          ch.b[i] = cap;
          ch.R[i] = R;
        }
        for (let i = 0; i < n - 1; i++) {
          const G = mat ? ch.Gfac[i] * harmonic(ch.k[i], ch.k[i + 1]) : ch.Gfac[i];
          const q = G * (ch.T[i + 1] - ch.T[i]);
          ch.R[i] -= q;
          ch.R[i + 1] += q;
          ch.b[i] += G;
          ch.b[i + 1] += G;
          ch.c[i] = -G;
          ch.a[i + 1] = -G;
        }
        if (ci < nWallChains) {
          const G = wallOuterG[ci];
          ch.R[0] -= G * (Te[ci] - ch.T[0]);
          ch.b[0] += G;
        }
        ch.R[n - 1] -= ch.extra[n - 1];
        ch.b[n - 1] += ch.extraDiag[n - 1];
        // Coupling to air at the last node.
        const U = ch.Gend;
        ch.R[n - 1] -= U * (Tair - ch.T[n - 1]);
        ch.b[n - 1] += U;
        airRes -= U * (ch.T[n - 1] - Tair);
        airDiag += U;
        // Forward elimination towards the air-coupled end.
        ch.bp[0] = ch.b[0];
        ch.dp[0] = -ch.R[0];
        for (let i = 1; i < n; i++) {
          const w = ch.a[i] / ch.bp[i - 1];
          ch.bp[i] = ch.b[i] - w * ch.c[i - 1];
          ch.dp[i] = -ch.R[i] - w * ch.dp[i - 1];
        }
        // δ_end = (dp + U δ_air)/bp
        airDiag -= (U * U) / ch.bp[n - 1];
        airRhs += (U * ch.dp[n - 1]) / ch.bp[n - 1];
      }
      const dAir = (-airRes + airRhs) / airDiag;
      Tair += dAir;
      let maxStep = Math.abs(dAir);
      for (const ch of chains) {
        const n = ch.n;
        let next = (ch.dp[n - 1] + ch.Gend * dAir) / ch.bp[n - 1];
        ch.T[n - 1] += next;
        maxStep = Math.max(maxStep, Math.abs(next));
        for (let i = n - 2; i >= 0; i--) {
          next = (ch.dp[i] - ch.c[i] * next) / ch.bp[i];
          ch.T[i] += next;
          if (Math.abs(next) > maxStep) maxStep = Math.abs(next);
        }
      }
      if (it > 0 && maxStep < 1e-7) {
        converged = true;
        it++;
        break;
      }
    }
    if (!converged) {
      for (const ch of chains) ch.T.set(ch.Told);
      Tair = TairOld;
      if (h < 1e-3) throw new PhysicsInputError("route", "the box model could not converge");
      dt = h / 4;
      continue;
    }
    newton += it;
    // Book the heat that came in, by path, with the converged temperatures.
    for (let ci = 0; ci < nWallChains; ci++) {
      const ch = chains[ci];
      const G = wallOuterG[ci];
      const airPart = G * (amb.air_C - ch.T[0]) * h;
      const sunPart = G * (Te[ci] - amb.air_C) * h;
      if (ci === 0) gains.walls += airPart;
      else gains.lid += airPart;
      gains.sun += sunPart;
    }
    gains.edges += Gedge * (amb.air_C - Tair) * h;
    gains.openings += Gopen * (amb.air_C - Tair) * h;
    // Adapt the step to the largest enthalpy change of any node.
    let maxChange = 0;
    for (const ch of chains) {
      for (let i = 0; i < ch.n; i++) {
        const d = ch.mat ? Math.abs(ch.mat.H_J_kg(ch.T[i]) - ch.Hold[i]) / 3000 : Math.abs(ch.T[i] - ch.Told[i]);
        if (d > maxChange) maxChange = d;
      }
    }
    maxChange = Math.max(maxChange, Math.abs(Tair - TairOld) * 0.2);
    t = tNew;
    steps++;
    const scale = maxChange > 0 ? target / maxChange : 2;
    dt = Math.min(dtMax, Math.max(1, h * Math.min(2, Math.max(0.5, scale))));
    fillState();
    if (spec.onStep && spec.onStep(t, state)) break;
  }
  const stored = energy() - E0;
  const totalIn = gains.walls + gains.lid + gains.edges + gains.sun + gains.openings;
  return { steps, newtonIterations: newton, gains_J: gains, storedChange_J: stored, energyError_J: stored - totalIn, t_end_s: t };
}

function harmonic(a: number, b: number): number {
  return (2 * a * b) / (a + b);
}

/** Outer combined coefficient of a box in given air, from the core's correlations plus radiation. */
export function boxOuterCoefficient(outer: { length_m: number; width_m: number; height_m: number }, air_C: number, speed_m_s: number, emissivity: number, surfaceMinusAir_K: number): number {
  const g = { shape: "block" as const, height_m: outer.height_m, width_m: outer.width_m, length_m: outer.length_m };
  return itemSurfaceCoefficient(g, air_C + surfaceMinusAir_K, { fluid: "air", T_C: air_C, speed_m_s }, emissivity, []).h_W_m2K;
}

/** Linearised radiation coefficient at a mean temperature, εσ·4T³ (for the inside exchange). */
export function radiationAt(emissivity: number, T_C: number): number {
  const T = T_C + KELVIN_OFFSET;
  return 4 * emissivity * SIGMA_W_M2K4 * T * T * T;
}
