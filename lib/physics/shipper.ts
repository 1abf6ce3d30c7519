/**
 * The insulated-box network model, solved implicitly (variable-step BDF2 on the stored enthalpy, backward
 * Euler for the first step after every change of conditions) by Newton iterations, the step chosen from an
 * estimate of the local error.
 *
 * Nodes: wall and lid layer nodes (constant properties) for each face part, one or two inside-air zones
 * (lower and upper half), each coolant pack group (enthalpy, distributed across its half-thickness, or one
 * node for dry ice) and each product (enthalpy, distributed, its own shape). Chains couple to the zones at
 * their end node; the end nodes of chains in surface contact (pack–load, pack–face, load–base) join the
 * zones in a small dense system, and every other chain is eliminated onto the zones (a Schur complement
 * on an "arrow" matrix), so each Newton step is solved exactly and contacts are implicit.
 *
 * - Outer faces: combined film h_o (convection by the core's correlations + radiation), driven by the
 *   sol-air temperature t_e = t_o + αI/h_o − εΔR/h_o [ashraeSolAir]: the lid sees all the sun and the sky
 *   correction (outdoors only, when sun > 0), the sides a share of the sun, the base none. The heat booked
 *   per face is the net heat through its outer film (air, sun and sky together).
 * - Walls: layers in series, at least one node per layer with its heat capacity; areas are the inner
 *   faces. Edges and corners add conduction shape factors S = 0.54 D per edge and S = 0.15 L per corner,
 *   with the wall's overall thickness L and effective conductivity [incropera6, Table 4.1, cases 8–9,
 *   from memory], acting between outside air and the inside zones.
 * - Inside: an open inner surface exchanges with its zone through a combined coefficient h_i (natural
 *   convection ≈ 2–5 W/(m²·K) in closed coolers, from memory, plus linearised radiation), so a zone node
 *   stands for the mixed air-and-radiant temperature of its half; a covered part of a face exchanges with
 *   the body lying on it through a contact coefficient instead. The zones exchange through a conductance
 *   the caller gives (hold.ts: natural convection when colder above, conduction when stable, plus radiation).
 * - Lid openings: during each opening the inside air exchanges with outside air at a set number of
 *   air changes per minute; moisture and condensation are ignored.
 * - Dry ice: one node at the sublimation point while solid remains; sublimated CO₂ leaves the box.
 */
import { SIGMA_W_M2K4, itemSurfaceCoefficient, CP_AIR_J_KGK, P_ATM_PA, R_AIR_J_KGK } from "./surfaces";
import { KELVIN_OFFSET, PhysicsInputError } from "./validation";
import { bdf2Alpha0, bdf2Alpha2 } from "./numerics";
import { evalMaterial, evalMaterialH, type EnthalpyMaterial } from "./solver1d";
import { evalTable, tableCell, tableT, type PropertyTable } from "./table";

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
  /** The surface interval over the uniform one (1, the default: uniform nodes; below 1: finer at the surface). */
  surfaceRatio?: number;
  start_C: number;
  /** Film conductance of the exposed surface to each air zone, W/K (all items together). */
  zoneG_W_K: number[];
}

/** The parts of the box a face belongs to: sun and reporting follow the kind. */
export type FaceKind = "base" | "sidesLower" | "sidesUpper" | "lid";

/**
 * One part of a box face: its layers (outside first) over `area_m2`, outside exchanging with the ambient
 * through the outer film and the face kind's sol-air temperature, inside either exchanging with an air zone
 * through the inner film or touching a body (a pack lying on it, the load resting on it) through a contact
 * coefficient.
 */
export interface FaceSpec {
  kind: FaceKind;
  layers: WallLayerSpec[];
  area_m2: number;
  inner: { zone: number; h_W_m2K: number } | { body: number; h_W_m2K: number };
}

export interface NetworkSpec {
  faces: FaceSpec[];
  /** Inside air zones (one well-mixed zone, or lower and upper halves). */
  zones: { volume_m3: number }[];
  /** Conductance between zone 0 (lower) and zone 1 (upper), W/K, from the zone temperatures at the start of each step. */
  zoneExchange?: (zone_C: ArrayLike<number>) => number;
  edgeConductance_W_K: number;
  /** Share of the edge conductance and of the lid-opening exchange that reaches each zone (sums to 1). */
  edgeZoneShare: number[];
  openZoneShare: number[];
  bodies: BodySpec[]; // packs then products (any order)
  contacts: { a: number; b: number; conductance_W_K: number }[]; // body indices, surfaces in contact
  boxStart_C: number;
  /** Ambient conditions as step functions of time (read at once each step: the same object may be returned each time, updated). */
  ambient: (t_s: number) => { air_C: number; solAir_C: Record<FaceKind, number>; outerH_W_m2K: number; openExchange_W_K: number };
  breakpoints_s: number[];
  tEnd_s: number;
  /** Largest step, s (default 1800), and the enthalpy change per step the step control aims at, in kelvin of a 3 kJ/(kg·K) body (default 2). */
  dtMax_s?: number;
  targetChange_K?: number;
  /**
   * Scales the local error aimed at per step (default 1). A fit that differentiates the model's output
   * numerically asks for less (1/8): the step sequence then moves less with the factors, so the output is
   * smooth in them.
   */
  errorScale?: number;
  /** Mesh refinement factor for wall nodes (bodies set their own node counts). */
  refine?: number;
  /** Called once with the assembled network (benchmarks export it to solve the same equations elsewhere). */
  onAssembled?: (net: AssembledNetwork) => void;
  /** Called after every accepted step; return true to stop. */
  onStep?: (t_s: number, net: NetworkState) => boolean | void;
}

/**
 * The network as assembled, for an outside solver of the same equations: chains (faces first, nodes outside →
 * inside; then bodies, centre → surface) with their node capacities (J/K, or kg for enthalpy chains with
 * `table`) and link factors (W/K, or W/K per W/(m·K) of the harmonic-mean k for enthalpy chains), each last
 * node's coupling to the zones, the contact links between last nodes, the faces' outer half-layer
 * resistances, and the zones' capacities. The outer film of a face is 1/(halfOuter + 1/(h_o·area)).
 */
export interface AssembledNetwork {
  zones: { C_J_K: number; T0_C: number; edgeShare: number; openShare: number }[];
  edgeConductance_W_K: number;
  chains: { capacity: number[]; link: number[]; table: { T0_C: number; dT_K: number; H: number[]; k: number[] } | null; T0_C: number[]; U_W_K: number[]; face: { kind: FaceKind; halfOuter_K_W: number; area_m2: number } | null }[];
  links: { a: number; b: number; G_W_K: number }[];
}

export interface Gains {
  /** Net heat in through each kind of face (outer film, sun and sky together), J. */
  faces: Record<FaceKind, number>;
  edges: number;
  openings: number;
}

export interface NetworkState {
  /** Volume-weighted inside air, and each zone. */
  air_C: number;
  zone_C: number[];
  /** Heat in by path so far, J (cumulative). */
  gains: Gains;
  /** For each body: centre (node 0), surface (last node) and the mean specific enthalpy. */
  bodyCenter_C: Float64Array;
  bodySurface_C: Float64Array;
  bodyMeanH_J_kg: Float64Array;
}

export interface NetworkResult {
  steps: number;
  newtonIterations: number;
  /** Steps taken again: Newton did not converge (the step is quartered), or the error estimate was too large (see runNetwork). */
  newtonFailures: number;
  rejectedSteps: number;
  gains_J: Gains;
  storedChange_J: number;
  energyError_J: number;
  t_end_s: number;
  /** Heat capacity of everything in the model at the start, J/K (to judge whether a balance error means anything). */
  heatCapacity_J_K: number;
}

const FACE_KINDS: FaceKind[] = ["base", "sidesLower", "sidesUpper", "lid"];
const FACE_INDEX: Record<FaceKind, number> = { base: 0, sidesLower: 1, sidesUpper: 2, lid: 3 };
/**
 * Local error aimed at per step, K, for each kelvin of `targetChange_K`. Chosen by measured accuracy, not
 * habit: on a frozen 48 h route, a chilled overnight route and a sunny thin-walled one, the hold times of
 * the band (low, central, high) at 0.4 (and the hold planner's 1 h largest step) stay within about 0.1 %
 * (0.11 % at most) of a run with 4× the nodes and 1/4 of the steps, against 0.03 % at 0.05 with 30 min
 * steps, with 45 % fewer steps (test/reference/hold.ref.test.ts checks it at 0.2 %; npm run bench:peer
 * gives the time error against SciPy's solver).
 */
const LTE_PER_TARGET = 0.4;
/**
 * Newton stops once the error left in the step's temperatures is estimated below this, K: the last update
 * itself, or the next one from the rate θ at which the updates shrink (newtonStep). Set by the accuracy
 * needed, not by the energy balance: bodies carry the enthalpy their last linearised update stored, so
 * energy closes to round-off at any tolerance. 1e-3 K is about 1/800 of the step error aimed at (0.8 K at
 * the hold planner's 2 K target). Measured with the first-iteration test of newtonStep, against the 1e-5 K
 * used before: on the 48 h bench plan 186 Newton iterations instead of 326 for the same 142 steps, the
 * band's hold times moved by under 0.05 % (low −0.061 % → −0.107 % from the 4×-refined run, central and
 * high unchanged to 0.001 %); on the demo's summer lunch run (salad and chicken, gel packs), cod with dry
 * ice overnight and hot rice on the lunch run, each with a ±30 % / ±10 % / ±2 K band, 150, 107 and 168
 * iterations instead of 281, 220 and 302 for the central run, every hold of the band unchanged to 0.005 %;
 * energy still closes to 1e-15 of the heat moved.
 */
const NEWTON_TOL_K = 1e-3;
/**
 * A node's Newton update that takes it into a table cell whose slope (its apparent specific heat) differs
 * from the slope it was linearised with by more than this share makes the step strongly nonlinear: its
 * first iteration is never taken as converged (newtonStep), whatever the last step's contraction rate.
 * Entering or leaving a pack's melting band changes the slope many times over. (At 0.3 instead of 0.1 the
 * bench plan took the same 186 iterations: the test costs nothing where it does not matter.)
 */
const SLOPE_JUMP = 0.1;
/**
 * First step tried at the start of a run and after every change of conditions, as a share of the largest
 * step (60 s at the hold planner's 1 h; refined runs shrink it with their largest step): backward Euler,
 * taken again shorter when its own error estimate (eulerStepError) is over about 3× the aim (the estimate
 * would halve the next step). That check matters where something moves fast within the first minute: a
 * chilled load packed near its limit into a box at room temperature (a salad tub at 7.5 °C against 8 °C in
 * the thin cooler at 24 °C: its surface leaves the band within seconds; with the 60 s step always kept,
 * the model said after 2,299 s against 6 s refined 8×, now 7 s against 1 s), or a lid opening of 20–45 s
 * on a chilled load (with the graded product grid of hold.ts; test/reference/hold.ref.test.ts). It costs
 * 129 → 142 steps on the 48 h bench plan. The same at every restart rather than carried over from before
 * the change, so that the answer moves smoothly with the inputs (calibration fits it by finite
 * differences): a carried-over step (up to minutes) put up to 0.3 K of first-order error into the inside
 * air right after a change, and a 0.1 % change of an input moved the air by 0.22 K (now 0.006 K).
 * Measured on the reference checks: at 1/60 the ice-only melt is 1.2 % from the hand formula and a
 * calibration recovers its factors to 0.2 %; at 1/12 (5 min) 1.9 % and 2.5 %, for 18 % fewer steps per
 * sizing candidate; at 1/6 the calibration check fails.
 */
const RESTART_FRACTION = 1 / 60;
/**
 * The specific heat that turns an enthalpy error into kelvin for the step control, J/(kg·K): a scale, not a
 * property (unfrozen foods lie near 3–4 kJ/(kg·K), Choi–Okos [choiOkos1986], from memory), so that walls,
 * air and bodies share one error aim.
 */
const ERROR_C_J_KGK = 3000;

/**
 * A chain as built: its node count, the builders' starting temperatures, node capacities (kg for enthalpy
 * chains, J/K for walls) and link factors (W/K per W/(m·K) for enthalpy chains, W/K for walls), its
 * material, and its last node's couplings. Once the chains are laid end to end (flattenChains), T, mass
 * and Gfac are views into the network's node arrays, where every other per-node quantity lives.
 */
interface Chain {
  n: number;
  T: Float64Array;
  mass: Float64Array;
  /** n − 1 link factors. */
  Gfac: Float64Array;
  mat: EnthalpyMaterial | null;
  /** The material's table when it has one (foods and packs): read directly, so one monomorphic look-up serves every chain. */
  table: PropertyTable | null;
  /** Coupling of the last node to each air zone, W/K. */
  U: Float64Array;
  /** Sum of the last node's contact conductances, W/K. */
  linkDiag: number;
}

function newChain(n: number, zones: number): Chain {
  return { n, T: new Float64Array(n), mass: new Float64Array(n), Gfac: new Float64Array(Math.max(0, n - 1)), mat: null, table: null, U: new Float64Array(zones), linkDiag: 0 };
}

/** Builds a wall chain: nodes outside → inside; first node couples to the outer film, last to the inner side. */
function wallChain(layers: WallLayerSpec[], area: number, refine: number, zones: number): { chain: Chain; halfOuter_K_W: number; halfInner_K_W: number } {
  const cells: { dx: number; k: number; cap: number }[] = [];
  for (const L of layers) {
    const m = (L.insulation && L.thickness_m > 0.01 ? 2 : 1) * refine;
    for (let j = 0; j < m; j++) cells.push({ dx: L.thickness_m / m, k: L.k_W_mK, cap: L.rho_kg_m3 * L.c_J_kgK * area * (L.thickness_m / m) });
  }
  const ch = newChain(cells.length, zones);
  for (let i = 0; i < cells.length; i++) ch.mass[i] = cells[i].cap;
  for (let i = 0; i < cells.length - 1; i++) {
    const r = cells[i].dx / 2 / (cells[i].k * area) + cells[i + 1].dx / 2 / (cells[i + 1].k * area);
    ch.Gfac[i] = 1 / r;
  }
  const halfOuter = cells[0].dx / 2 / (cells[0].k * area);
  const halfInner = cells[cells.length - 1].dx / 2 / (cells[cells.length - 1].k * area);
  return { chain: ch, halfOuter_K_W: halfOuter, halfInner_K_W: halfInner };
}

/**
 * Node positions from the centre (0) to the surface (R), m; the centre and the surface are nodes. The n − 1
 * intervals grow or shrink in geometric progression d_j = d₀·q^j so that the surface interval is
 * `surfaceRatio` times the uniform one, R/(n − 1): 1 gives uniform nodes, below 1 finer ones at the
 * surface (a non-uniform finite-volume grid, fine where temperatures change steeply [patankar1980], ch. 4,
 * from memory).
 * q solves q^(n−2)(q − 1)/(q^(n−1) − 1) = surfaceRatio/(n − 1) by bisection; valid for surfaceRatio in
 * (0, n − 1); n = 2 is always uniform, and one node is the centre alone.
 */
export function nodePositions(R: number, n: number, surfaceRatio: number): Float64Array {
  const r = new Float64Array(Math.max(1, n));
  if (n < 2) return r;
  const m = n - 1;
  const q = m > 1 && surfaceRatio !== 1 ? gradingRatio(m, surfaceRatio) : 1;
  let d = q === 1 ? R / m : (R * (q - 1)) / (Math.pow(q, m) - 1);
  for (let i = 1; i < n; i++) {
    r[i] = r[i - 1] + d;
    d *= q;
  }
  r[n - 1] = R;
  return r;
}

/** The grid ratios found so far, by interval count and surface ratio (every corner of a plan asks for the same few). */
const GRADING_RATIOS = new Map<string, number>();

/** Ratio q between neighbouring intervals (centre → surface) with the last interval surfaceRatio · R/m (nodePositions). */
function gradingRatio(m: number, surfaceRatio: number): number {
  const key = `${m}:${surfaceRatio}`;
  const known = GRADING_RATIOS.get(key);
  if (known !== undefined) return known;
  // Solve q^(m−1)·(q − 1)/(q^m − 1) = surfaceRatio/m for q by bisection on log q.
  const target = surfaceRatio / m;
  const share = (x: number) => (Math.abs(x - 1) < 1e-12 ? 1 / m : (Math.pow(x, m - 1) * (x - 1)) / (Math.pow(x, m) - 1));
  let lo = surfaceRatio < 1 ? 1e-3 : 1;
  let hi = surfaceRatio < 1 ? 1 : 1e3;
  for (let k = 0; k < 100; k++) {
    const mid = Math.sqrt(lo * hi);
    if (share(mid) > target) hi = mid;
    else lo = mid;
  }
  const q = Math.sqrt(lo * hi);
  if (GRADING_RATIOS.size > 256) GRADING_RATIOS.clear();
  GRADING_RATIOS.set(key, q);
  return q;
}

/** ∫ r^m dr from a to b. */
function shellVolume(m: number, a: number, b: number): number {
  return (Math.pow(b, m + 1) - Math.pow(a, m + 1)) / (m + 1);
}

/** A body chain: nodes centre → surface (vertex-centred, half cells at both ends), scaled to the real volume and area × count. */
function bodyChain(b: BodySpec, zones: number): Chain {
  const n = Math.max(1, b.nodes);
  const ch = newChain(n, zones);
  ch.mat = b.material;
  ch.table = b.material.table ?? null;
  const totalMass = b.material.rho_kg_m3 * b.volume_m3 * b.count;
  if (n === 1) {
    ch.mass[0] = totalMass;
  } else {
    const R = b.halfSize_m;
    const r = nodePositions(R, n, b.surfaceRatio ?? 1);
    const face = (i: number) => (i <= 0 ? 0 : i >= n ? R : (r[i - 1] + r[i]) / 2);
    const vols: number[] = [];
    for (let i = 0; i < n; i++) vols.push(shellVolume(b.shapeM, face(i), face(i + 1)));
    const vSum = vols.reduce((s, v) => s + v, 0);
    for (let i = 0; i < n; i++) ch.mass[i] = (totalMass * vols[i]) / vSum;
    // Link areas scale with the real surface: the model's surface measure R^m corresponds to area × count.
    const areaScale = (b.area_m2 * b.count) / Math.pow(R, b.shapeM);
    for (let i = 0; i < n - 1; i++) ch.Gfac[i] = (Math.pow(face(i + 1), b.shapeM) * areaScale) / (r[i + 1] - r[i]);
  }
  ch.T.fill(b.start_C);
  for (let z = 0; z < zones; z++) ch.U[z] = b.zoneG_W_K[z] ?? 0;
  return ch;
}

/**
 * The fill-in pattern of Gaussian elimination in row order on a symmetric pattern (entries listed as
 * pairs, the diagonal implied): for each pivot i, the columns right of it with an entry in row i (`right`,
 * ascending; by symmetry also the rows below it with an entry in column i), as offsets into a flat list.
 * Worked out once per network; the numbers are eliminated over it on every Newton iteration.
 */
interface Elimination {
  n: number;
  rightStart: Int32Array;
  right: Int32Array;
}

function eliminationPattern(n: number, pairs: [number, number][]): Elimination {
  const P = new Uint8Array(n * n);
  for (const [i, j] of pairs) {
    P[i * n + j] = 1;
    P[j * n + i] = 1;
  }
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      if (!P[j * n + i]) continue;
      for (let k = i + 1; k < n; k++) if (P[i * n + k]) P[j * n + k] = 1;
    }
  }
  const rightStart = new Int32Array(n + 1);
  const right: number[] = [];
  for (let i = 0; i < n; i++) {
    rightStart[i] = right.length;
    for (let j = i + 1; j < n; j++) if (P[i * n + j]) right.push(j);
  }
  rightStart[n] = right.length;
  return { n, rightStart, right: Int32Array.from(right) };
}

/**
 * Solves A x = r for a symmetric A (row-major n×n with the sparsity of `E`; its upper triangle is
 * overwritten, r too) into x by symmetric Gaussian elimination without pivoting (A is diagonally dominant):
 * each pivot row updates only the upper triangle of the rows below it (the lower one stays the transpose
 * and is never read), touching only the entries of the fill-in pattern (the LDLᵀ form of Gaussian
 * elimination [golubVanLoan2013], from memory).
 */
function solveSparse(E: Elimination, A: Float64Array, r: Float64Array, x: Float64Array): void {
  const n = E.n;
  const right = E.right;
  const rightStart = E.rightStart;
  for (let i = 0; i < n; i++) {
    const ii = i * n;
    const piv = A[ii + i];
    const r1 = rightStart[i + 1];
    const ri = r[i];
    for (let q = rightStart[i]; q < r1; q++) {
      const j = right[q];
      const aij = A[ii + j];
      if (aij === 0) continue;
      const f = aij / piv;
      const jj = j * n;
      for (let p = q; p < r1; p++) {
        const k = right[p];
        A[jj + k] -= f * A[ii + k];
      }
      r[j] -= f * ri;
    }
  }
  for (let i = n - 1; i >= 0; i--) {
    const ii = i * n;
    let s = r[i];
    for (let p = rightStart[i]; p < rightStart[i + 1]; p++) {
      const k = right[p];
      s -= A[ii + k] * x[k];
    }
    x[i] = s / A[ii + i];
  }
}

/** The network's per-node arrays (Nodes). */
type NodeField = "T" | "Told" | "Hold" | "Hcur" | "Hs" | "Hm1" | "Hm2" | "Hn" | "cn" | "mass" | "a" | "b" | "c" | "R" | "bp" | "dp" | "w" | "bpInv" | "Tp" | "k" | "rate0";

/**
 * Every chain's nodes laid end to end (faces first, nodes outside → inside; then bodies, centre → surface),
 * so that the Newton kernels sweep all the walls, and all the bodies, each in one loop instead of one
 * call per chain. A chain's last link factor is zero, and so
 * are its first sub-diagonal and last super-diagonal entries: the sweeps pass from one chain to the next
 * without coupling them (each chain's end node takes its update from the dense system).
 */
interface Nodes extends Record<NodeField, Float64Array> {
  // T and Told: temperatures now and at the step's start; Hold: the history term H* the step starts from;
  // Hcur: H carried from the last Newton iteration (bodies); Hs, Hm1, Hm2: the stored quantity (H, or T for
  // walls) at the step's start and the two accepted steps before (BDF2); Hn, cn, k: this iteration's H,
  // dH/dT and conductivity (bodies); mass: kg (bodies) or J/K (walls); a, b, c, R: the tridiagonal rows and
  // residual; bp, dp, w, bpInv: forward elimination (pivots, right-hand side, multipliers (walls only: the
  // bodies' are formed as they go), 1/pivot); Tp: the
  // predictor's history; rate0: the stored quantity's rate at a restart's first step.
  /** All nodes; the walls' (faces first) are 0 … nW − 1. */
  nT: number;
  nW: number;
  /** First and last node of each chain. */
  start: Int32Array;
  end: Int32Array;
  /** Link factors and (bodies) this iteration's conductances from node j to j + 1; zero at a chain's end. */
  Gfac: Float64Array;
  Gk: Float64Array;
  /** Contact flux into each chain's last node at this iterate, W (by chain). */
  extra: Float64Array;
  /** 1 at each chain's last node. */
  isEnd: Uint8Array;
  /** The update of each chain's last node, at that node (back substitution). */
  endDelta: Float64Array;
  /** Each node's property table (tabulated bodies), else null, and the cell its T was in at this iteration's look-up. */
  table: (PropertyTable | null)[];
  cell: Int32Array;
}

/** Lays the chains' nodes end to end (Nodes); each chain's T, mass and Gfac become views into them. */
function flattenChains(chains: Chain[], nFaces: number): Nodes {
  const start = new Int32Array(chains.length);
  const end = new Int32Array(chains.length);
  let nT = 0;
  for (let ci = 0; ci < chains.length; ci++) {
    start[ci] = nT;
    nT += chains[ci].n;
    end[ci] = nT - 1;
  }
  const f = () => new Float64Array(nT);
  const F: Nodes = {
    nT,
    nW: nFaces > 0 ? end[nFaces - 1] + 1 : 0,
    start,
    end,
    T: f(), Told: f(), Hold: f(), Hcur: f(), Hs: f(), Hm1: f(), Hm2: f(), Hn: f(), cn: f(), mass: f(), a: f(), b: f(), c: f(), R: f(), bp: f(), dp: f(), w: f(), bpInv: f(), Tp: f(), k: f(), rate0: f(),
    Gfac: f(),
    Gk: f(),
    extra: new Float64Array(chains.length),
    isEnd: new Uint8Array(nT),
    endDelta: f(),
    table: new Array<PropertyTable | null>(nT).fill(null),
    cell: new Int32Array(nT),
  };
  for (let ci = 0; ci < chains.length; ci++) {
    const ch = chains[ci];
    const s0 = start[ci];
    F.T.set(ch.T, s0);
    ch.T = F.T.subarray(s0, s0 + ch.n);
    F.mass.set(ch.mass, s0);
    ch.mass = F.mass.subarray(s0, s0 + ch.n);
    F.Gfac.set(ch.Gfac, s0);
    ch.Gfac = F.Gfac.subarray(s0, s0 + ch.n - 1);
    F.isEnd[end[ci]] = 1;
    for (let i = 0; i < ch.n; i++) F.table[s0 + i] = ch.table;
  }
  return F;
}

/**
 * The assembled network and its work arrays, built once per run (buildNetwork) and then stepped in
 * place by small functions: one huge function is optimised late by the JIT (hundreds of milliseconds of
 * compilation in every worker) and de-optimised often, small ones early and cheaply.
 */
interface Net extends NewtonSystem {
  spec: NetworkSpec;
  bodyStart: number;
  nBodies: number;
  /** Per face chain: the outer half-layer resistance, K/W, its area, m², and its kind's index in FACE_KINDS. */
  halfOuter: Float64Array;
  area: Float64Array;
  faceKind: Int32Array;
  /** The four kinds' sol-air temperatures of the current step. */
  solAir: Float64Array;
  TairOld: Float64Array;
  TairP: Float64Array;
  TairM1: Float64Array;
  TairM2: Float64Array;
  /** Heat booked per path (faces by kind, edges, openings) in this step and the last. */
  pathFlow: Float64Array;
  pathPrev: Float64Array;
  gains: Gains;
  state: NetworkState;
  heatCapacity: number;
  airCapacity: number;
}

type FacePart = { halfOuter: number; area: number; kind: FaceKind; contact: { body: number; G: number } | null };
type Link = { a: number; b: number; G: number };

/** The face chains (outside → inside), each coupled at its inner end to its zone or to the body lying on it. */
function faceChains(spec: NetworkSpec, nZ: number): { chains: Chain[]; faceParts: FacePart[] } {
  const refine = Math.max(1, Math.round(spec.refine ?? 1));
  const chains: Chain[] = [];
  const faceParts: FacePart[] = [];
  for (const f of spec.faces) {
    const w = wallChain(f.layers, f.area_m2, refine, nZ);
    w.chain.T.fill(spec.boxStart_C);
    const G = 1 / (w.halfInner_K_W + 1 / (f.inner.h_W_m2K * f.area_m2));
    let contact: { body: number; G: number } | null = null;
    if ("zone" in f.inner) w.chain.U[f.inner.zone] = G;
    else contact = { body: f.inner.body, G };
    chains.push(w.chain);
    faceParts.push({ halfOuter: w.halfOuter_K_W, area: f.area_m2, kind: f.kind, contact });
  }
  return { chains, faceParts };
}

/**
 * The dense system's rows: chains with a surface contact keep their end node in it with the zones, so
 * contacts are solved implicitly (Newton stays quadratic). Rows: the contact end nodes in chain order,
 * then the zones last, so that elimination (zones coupled to almost everything) creates fill-in only
 * among a contact node's few partners.
 */
function denseLayout(chains: Chain[], links: Link[], nZ: number): { keyRow: Int32Array; zoneRow: Int32Array; nK: number; elim: Elimination } {
  const keyRow = new Int32Array(chains.length).fill(-1);
  const inContact = new Uint8Array(chains.length);
  for (const c of links) inContact[c.a] = inContact[c.b] = 1;
  let nK = 0;
  for (let ci = 0; ci < chains.length; ci++) if (inContact[ci]) keyRow[ci] = nK++;
  const zoneRow = new Int32Array(nZ);
  for (let z = 0; z < nZ; z++) zoneRow[z] = nK++;
  // Where the dense system has entries: contacts, contact nodes to the zones they touch, the zones among themselves.
  const pattern: [number, number][] = [];
  for (const l of links) pattern.push([keyRow[l.a], keyRow[l.b]]);
  for (let ci = 0; ci < chains.length; ci++) if (keyRow[ci] >= 0) for (let z = 0; z < nZ; z++) if (chains[ci].U[z] !== 0) pattern.push([keyRow[ci], zoneRow[z]]);
  for (let z = 0; z < nZ; z++) for (let y = z + 1; y < nZ; y++) pattern.push([zoneRow[z], zoneRow[y]]);
  return { keyRow, zoneRow, nK, elim: eliminationPattern(nK, pattern) };
}

/** The network as assembled, for an outside solver of the same equations (only when asked for). */
function describeNetwork(chains: Chain[], faceParts: FacePart[], links: Link[], Cair: Float64Array, Tair: Float64Array, edgeShare: Float64Array, openShare: Float64Array, edge_W_K: number): AssembledNetwork {
  const nFaces = faceParts.length;
  return {
    zones: Array.from(Cair, (C, z) => ({ C_J_K: C, T0_C: Tair[z], edgeShare: edgeShare[z], openShare: openShare[z] })),
    edgeConductance_W_K: edge_W_K,
    chains: chains.map((ch, ci) => {
      const t = ch.mat?.table;
      return {
        capacity: Array.from(ch.mass),
        link: Array.from(ch.Gfac),
        table: ch.mat ? (t ? { T0_C: t.T0_C, dT_K: t.dT_K, H: Array.from(t.H), k: Array.from(t.k) } : null) : null,
        T0_C: Array.from(ch.T),
        U_W_K: Array.from(ch.U),
        face: ci < nFaces ? { kind: faceParts[ci].kind, halfOuter_K_W: faceParts[ci].halfOuter, area_m2: faceParts[ci].area } : null,
      };
    }),
    links: links.map((l) => ({ a: l.a, b: l.b, G_W_K: l.G })),
  };
}

function buildNetwork(spec: NetworkSpec): Net {
  const nZ = Math.max(1, spec.zones.length);
  const { chains, faceParts } = faceChains(spec, nZ);
  const nFaces = chains.length;
  // Bodies.
  const bodyStart = chains.length;
  for (const b of spec.bodies) chains.push(bodyChain(b, nZ));
  const F = flattenChains(chains, nFaces);
  // Every surface contact, as pairs of chain indices (last node to last node).
  const links: Link[] = [];
  for (const c of spec.contacts) links.push({ a: bodyStart + c.a, b: bodyStart + c.b, G: c.conductance_W_K });
  for (let i = 0; i < nFaces; i++) {
    const c = faceParts[i].contact;
    if (c) links.push({ a: i, b: bodyStart + c.body, G: c.G });
  }
  const { keyRow, zoneRow, nK, elim } = denseLayout(chains, links, nZ);
  const airRho = P_ATM_PA / (R_AIR_J_KGK * (spec.boxStart_C + KELVIN_OFFSET));
  let totalVol = 0;
  for (const z of spec.zones) totalVol += z.volume_m3;
  const Cair = new Float64Array(nZ);
  const edgeShare = new Float64Array(nZ);
  const openShare = new Float64Array(nZ);
  for (let z = 0; z < nZ; z++) {
    Cair[z] = Math.max(airRho * CP_AIR_J_KGK * Math.max(spec.zones[z]?.volume_m3 ?? totalVol, 1e-4 / nZ), 1 / nZ);
    edgeShare[z] = spec.edgeZoneShare[z] ?? (z === 0 ? 1 : 0);
    openShare[z] = spec.openZoneShare[z] ?? (z === 0 ? 1 : 0);
  }
  const Tair = new Float64Array(nZ).fill(spec.boxStart_C);
  if (spec.onAssembled) spec.onAssembled(describeNetwork(chains, faceParts, links, Cair, Tair, edgeShare, openShare, spec.edgeConductance_W_K));
  // Each zone's total coupling to chain ends, and each chain end's total contact conductance (both fixed).
  const sumU = new Float64Array(nZ);
  for (const ch of chains) for (let z = 0; z < nZ; z++) sumU[z] += ch.U[z];
  for (const l of links) {
    chains[l.a].linkDiag += l.G;
    chains[l.b].linkDiag += l.G;
  }
  // The stored energy: zones and walls from their temperatures, bodies from their carried enthalpy
  // (evaluated from the starting temperatures once, then carried step to step: see backSubstituteAll and finishStep).
  for (let ci = 0; ci < chains.length; ci++) {
    const ch = chains[ci];
    if (ch.mat) evalMaterialH(ch.mat, F.T, F.start[ci], F.start[ci] + ch.n, F.Hcur);
  }
  let airCapacity = 0;
  for (let z = 0; z < nZ; z++) airCapacity += Cair[z];
  let heatCapacity = airCapacity;
  for (const ch of chains) for (let i = 0; i < ch.n; i++) heatCapacity += ch.mat ? ch.mass[i] * ch.mat.c_J_kgK(ch.T[i]) : ch.mass[i];
  const gains: Gains = { faces: { base: 0, sidesLower: 0, sidesUpper: 0, lid: 0 }, edges: 0, openings: 0 };
  const nB = spec.bodies.length;
  const state: NetworkState = {
    air_C: Tair[0],
    zone_C: Array.from(Tair),
    gains,
    bodyCenter_C: new Float64Array(nB),
    bodySurface_C: new Float64Array(nB),
    bodyMeanH_J_kg: new Float64Array(nB),
  };
  return {
    spec,
    chains,
    F,
    nFaces,
    nZ,
    nK,
    keyRow,
    zoneRow,
    elim,
    linkA: Int32Array.from(links.map((l) => l.a)),
    linkB: Int32Array.from(links.map((l) => l.b)),
    linkG: Float64Array.from(links.map((l) => l.G)),
    // Work arrays, allocated once: the dense system (row-major) and its fixed part, its right-hand side and
    // solution, the zone residuals, the outer film conductances and driving temperatures.
    A: new Float64Array(nK * nK),
    A0: new Float64Array(nK * nK),
    rhs: new Float64Array(nK),
    dAir: new Float64Array(nK),
    res: new Float64Array(nZ),
    outerG: new Float64Array(nFaces),
    outerT: new Float64Array(nFaces),
    Cair,
    edgeShare,
    openShare,
    sumU,
    Tair,
    TairStar: new Float64Array(nZ),
    rate0Air: new Float64Array(nZ),
    firstIterationFactor: Infinity,
    slopeJump: true,
    wallFixedDiag: wallFixedRows(F, chains, nFaces, nZ),
    wallsInvH: NaN,
    wallsOuterH: NaN,
    bodyStart,
    nBodies: nB,
    halfOuter: Float64Array.from(faceParts.map((f) => f.halfOuter)),
    area: Float64Array.from(faceParts.map((f) => f.area)),
    faceKind: Int32Array.from(faceParts.map((f) => FACE_INDEX[f.kind])),
    solAir: new Float64Array(4),
    TairOld: Tair.slice(),
    TairP: Tair.slice(),
    TairM1: new Float64Array(nZ),
    TairM2: new Float64Array(nZ),
    pathFlow: new Float64Array(6),
    pathPrev: new Float64Array(6),
    gains,
    state,
    heatCapacity,
    airCapacity,
  };
}

/** The energy stored in the network, J (zones and walls from temperatures, bodies from their carried enthalpy). */
function storedEnergy(S: Net): number {
  let e = 0;
  for (let z = 0; z < S.nZ; z++) e += S.Cair[z] * S.Tair[z];
  const { T, Hcur, mass, nW, nT } = S.F;
  for (let j = 0; j < nW; j++) e += mass[j] * T[j];
  for (let j = nW; j < nT; j++) e += mass[j] * Hcur[j];
  return e;
}

/** What the caller sees after a step: zones, and each body's centre, surface and mean H. */
function fillState(S: Net): void {
  const st = S.state;
  let s = 0;
  for (let z = 0; z < S.nZ; z++) {
    st.zone_C[z] = S.Tair[z];
    s += S.Cair[z] * S.Tair[z];
  }
  st.air_C = s / S.airCapacity;
  const { T, Hcur, mass, start, end } = S.F;
  for (let j = 0; j < S.nBodies; j++) {
    const s0 = start[S.bodyStart + j];
    const e = end[S.bodyStart + j];
    st.bodyCenter_C[j] = T[s0];
    st.bodySurface_C[j] = T[e];
    let hm = 0;
    let m = 0;
    for (let i = s0; i <= e; i++) {
      hm += mass[i] * Hcur[i];
      m += mass[i];
    }
    st.bodyMeanH_J_kg[j] = hm / m;
  }
}

/** The step's outside conditions on each face: outer film conductance and sol-air temperature. */
function setConditions(S: Net, amb: ReturnType<NetworkSpec["ambient"]>): void {
  const sa = S.solAir;
  sa[0] = amb.solAir_C.base;
  sa[1] = amb.solAir_C.sidesLower;
  sa[2] = amb.solAir_C.sidesUpper;
  sa[3] = amb.solAir_C.lid;
  const hA = amb.outerH_W_m2K;
  // The outer films change only with the conditions (a new segment, or past the route's end).
  if (hA !== S.wallsOuterH) {
    for (let ci = 0; ci < S.nFaces; ci++) S.outerG[ci] = 1 / (S.halfOuter[ci] + 1 / (hA * S.area[ci]));
    S.wallsOuterH = hA;
    S.wallsInvH = NaN;
  }
  for (let ci = 0; ci < S.nFaces; ci++) S.outerT[ci] = sa[S.faceKind[ci]];
}

/** Start of a step: every node's start state, BDF2 history term H* = H⁰ + star·(H⁰ − H⁻¹) (or H⁰ for backward Euler) and predictor T⁰ + f·(T⁰ − T⁻¹); the zones' likewise. */
function startStep(S: Net, bdf: boolean, star: number, fPred: number): void {
  const F = S.F;
  const { T, Told, Hs, Hcur, Hold, Hm1, Tp } = F;
  const nT = F.nT;
  const nW = F.nW;
  Told.set(T);
  // The stored quantity: T for the walls, the carried H for the bodies.
  for (let j = 0; j < nW; j++) Hs[j] = T[j];
  for (let j = nW; j < nT; j++) Hs[j] = Hcur[j];
  if (bdf) for (let j = 0; j < nT; j++) Hold[j] = Hs[j] + star * (Hs[j] - Hm1[j]);
  else Hold.set(Hs);
  if (fPred > 0) for (let j = 0; j < nT; j++) T[j] += fPred * (T[j] - Tp[j]);
  const { Tair, TairOld, TairStar, TairM1, TairP } = S;
  for (let z = 0; z < S.nZ; z++) {
    TairOld[z] = Tair[z];
    TairStar[z] = bdf ? Tair[z] + star * (Tair[z] - TairM1[z]) : Tair[z];
    if (fPred > 0) Tair[z] += fPred * (Tair[z] - TairP[z]);
  }
}

/** Back to the start of a step Newton could not finish. */
function undoStep(S: Net): void {
  const F = S.F;
  F.T.set(F.Told);
  F.Hcur.set(F.Hs.subarray(F.nW), F.nW);
  S.Tair.set(S.TairOld);
}

/**
 * After a converged step: the bodies carry the enthalpy their last Newton update reached (H + c·δ at the
 * last iterate, backSubstituteAll), which is what the implicit balance stored, so the energy closes to round-off
 * whatever the Newton tolerance; then the heat that came in is booked by path with the converged
 * temperatures (net through each face, edges, openings). With BDF2 the stored energy moves by
 * (h·F + α2·ΔE_prev)/α0 per step; booking each path by the same recursion keeps the sum of the paths equal
 * to the stored change to round-off.
 */
function finishStep(S: Net, air_C: number, Gedge: number, Gopen: number, h: number, a0: number, a2: number): void {
  const F = S.F;
  F.Hcur.set(F.Hn.subarray(F.nW), F.nW);
  const pf = S.pathFlow;
  const pp = S.pathPrev;
  pf.fill(0);
  for (let ci = 0; ci < S.nFaces; ci++) pf[S.faceKind[ci]] += S.outerG[ci] * (S.outerT[ci] - F.T[F.start[ci]]);
  for (let z = 0; z < S.nZ; z++) {
    pf[4] += Gedge * S.edgeShare[z] * (air_C - S.Tair[z]);
    pf[5] += Gopen * S.openShare[z] * (air_C - S.Tair[z]);
  }
  const g = S.gains;
  for (let p = 0; p < 6; p++) {
    const q = (h * pf[p] + a2 * pp[p]) / a0;
    pp[p] = q;
    if (p < 4) g.faces[FACE_KINDS[p]] += q;
    else if (p === 4) g.edges += q;
    else g.openings += q;
  }
}

/** The largest distance of any node (and, weighted 0.2, any zone) from the extrapolation L0·E⁰ + L1·E⁻¹ + L2·E⁻², K (bodies' H over ERROR_C_J_KGK). */
function stepDistance(S: Net, L0: number, L1: number, L2: number): number {
  const F = S.F;
  const { T, Hn, Hs, Hm1, Hm2 } = F;
  const nW = F.nW;
  let mW = 0;
  for (let j = 0; j < nW; j++) {
    const d = Math.abs(T[j] - (L0 * Hs[j] + L1 * Hm1[j] + L2 * Hm2[j]));
    if (d > mW) mW = d;
  }
  let mB = 0;
  for (let j = nW; j < F.nT; j++) {
    const d = Math.abs(Hn[j] - (L0 * Hs[j] + L1 * Hm1[j] + L2 * Hm2[j]));
    if (d > mB) mB = d;
  }
  let m = Math.max(mW, mB * (1 / ERROR_C_J_KGK));
  const { Tair, TairOld, TairM1, TairM2 } = S;
  for (let z = 0; z < S.nZ; z++) {
    const d = 0.2 * Math.abs(Tair[z] - (L0 * TairOld[z] + L1 * TairM1[z] + L2 * TairM2[z]));
    if (d > m) m = d;
  }
  return m;
}

/** Shifts the history: H⁻² takes H⁻¹, H⁻¹ the start's; the predictor's history the start temperatures. */
function shiftHistory(S: Net): void {
  const F = S.F;
  F.Hm2.set(F.Hm1);
  F.Hm1.set(F.Hs);
  F.Tp.set(F.Told);
  S.TairM2.set(S.TairM1);
  S.TairM1.set(S.TairOld);
  S.TairP.set(S.TairOld);
}

export function runNetwork(spec: NetworkSpec): NetworkResult {
  if (!(spec.tEnd_s > 0)) throw new PhysicsInputError("route", "the route has no length");
  const S = buildNetwork(spec);
  const E0 = storedEnergy(S);
  fillState(S);
  if (spec.onStep && spec.onStep(0, S.state)) {
    return { steps: 0, newtonIterations: 0, newtonFailures: 0, rejectedSteps: 0, gains_J: S.gains, storedChange_J: 0, energyError_J: 0, t_end_s: 0, heatCapacity_J_K: S.heatCapacity };
  }
  const breaks = [...spec.breakpoints_s.filter((b) => b > 0 && b < spec.tEnd_s), spec.tEnd_s].sort((x, y) => x - y);
  let nextBreak = 0;
  let t = 0;
  const dtMax = spec.dtMax_s ?? 1800;
  const restartStep = dtMax * RESTART_FRACTION;
  let dt = restartStep;
  const target = spec.targetChange_K ?? 2;
  const tolK = target * LTE_PER_TARGET * (spec.errorScale ?? 1);
  let steps = 0;
  let newton = 0;
  let rejected = 0;
  let failures = 0;
  // BDF2 history: accepted steps since the last restart (start, segment change, lid opening) and their lengths.
  let hist = 0;
  let hPrev1 = 0;
  let hPrev2 = 0;
  let lastBreak = -1;
  const nZ = S.nZ;
  while (t < spec.tEnd_s - 1e-9) {
    while (nextBreak < breaks.length && breaks[nextBreak] <= t + 1e-9) nextBreak++;
    const limit = nextBreak < breaks.length ? breaks[nextBreak] : spec.tEnd_s;
    // Conditions change at a break: start again from one backward-Euler step (events stay exact).
    // Its first step is tried at the run's first step again (RESTART_FRACTION), then judged by its own error.
    if (nextBreak !== lastBreak) {
      hist = 0;
      lastBreak = nextBreak;
      dt = restartStep;
    }
    const h = Math.min(dt, limit - t);
    const tNew = t + h;
    // Guard: a step too small to change t (below its rounding) would repeat for ever; t is then at the end.
    if (!(tNew > t)) break;
    // Variable-step BDF2 on the stored enthalpy, α0 E¹ + α1 E⁰ + α2 E⁻¹ = h·F(T¹), written as a backward-Euler
    // step of length h/α0 from E* = E⁰ + (α2/α0)(E⁰ − E⁻¹): the same Newton system, energy still exact.
    const bdf = hist >= 1;
    const w = bdf ? h / hPrev1 : 0;
    const a0 = bdf2Alpha0(w);
    const a2 = bdf2Alpha2(w);
    const hE = h / a0;
    const star = a2 / a0;
    // Conditions hold piecewise-constant over the step: take them at its middle.
    const amb = spec.ambient(t + h / 2);
    setConditions(S, amb);
    const Gedge = spec.edgeConductance_W_K;
    const Gopen = amb.openExchange_W_K;
    // Exchange between the zones, from the temperatures at the start of the step.
    const Gzz = nZ > 1 && spec.zoneExchange ? spec.zoneExchange(S.Tair) : 0;
    // Predictor: the last step's change, extrapolated (the converged answer does not depend on it; it
    // saves a Newton iteration or two).
    startStep(S, bdf, star, hist >= 1 ? Math.min(2, h / hPrev1) : 0);
    const invH = 1 / hE;
    factorWalls(S, invH);
    fixedSystem(S, invH, Gedge, Gopen, Gzz);
    const it = newtonStep(S, invH, Gedge, Gopen, Gzz, amb.air_C, !bdf);
    if (it === 0) {
      failures++;
      undoStep(S);
      if (h < 1e-3) throw new PhysicsInputError("route", "the box model could not converge");
      dt = h / 4;
      continue;
    }
    newton += it;
    // Step control. With two steps of history: the local error of BDF2, estimated from the distance to the
    // quadratic extrapolation of the last three states (E − E_pred ≈ (11/2)·LTE at constant steps), in kelvin
    // of a 3 kJ/(kg·K) body. With one (the step after a restart): the distance to the linear extrapolation
    // of the last two, ≈ h(h + h₁)/2·E'', of which the share h/(h + h₁) is a first-order local error
    // (a bound for this step's, which is second order). Right after a restart, a backward-Euler step: its own
    // local error from the rates at its start (eulerStepError).
    let grow: number;
    if (hist >= 2) {
      const h1 = hPrev1;
      const h2 = hPrev2;
      const L0 = ((h + h1) * (h + h1 + h2)) / (h1 * (h1 + h2));
      const L1 = -(h * (h + h1 + h2)) / (h1 * h2);
      const L2 = (h * (h + h1)) / ((h1 + h2) * h2);
      const err = (2 / 11) * stepDistance(S, L0, L1, L2);
      grow = err > 0 ? 0.9 * Math.cbrt(tolK / err) : 2;
    } else if (hist === 1) {
      const err = (h / (h + hPrev1)) * stepDistance(S, 1 + h / hPrev1, -h / hPrev1, 0);
      grow = err > 0 ? 0.9 * Math.sqrt(tolK / err) : 2;
    } else {
      const err = eulerStepError(S, h);
      grow = err > 0 ? 0.9 * Math.sqrt(tolK / err) : 2;
    }
    // A step whose error estimate would halve the next step (about 6× the aim for BDF2) is taken again,
    // shorter: a step that runs through a sudden change (a pack's last ice going) must not be kept just
    // because Newton converged on it; nor a restart's first step that runs through a transient faster than
    // it (a warm box just packed with a load near its limit). Steps of 1 s or less are kept (the guard
    // against endless retries).
    if (grow < 0.5 && h > 1) {
      undoStep(S);
      dt = Math.max(1, h * Math.max(0.2, grow));
      rejected++;
      continue;
    }
    finishStep(S, amb.air_C, Gedge, Gopen, h, a0, a2);
    shiftHistory(S);
    hPrev2 = hPrev1;
    hPrev1 = h;
    hist++;
    t = tNew;
    steps++;
    dt = Math.min(dtMax, Math.max(1, h * Math.min(2, Math.max(0.5, grow))));
    fillState(S);
    if (spec.onStep && spec.onStep(t, S.state)) break;
  }
  const stored = storedEnergy(S) - E0;
  const g = S.gains;
  const totalIn = g.faces.base + g.faces.sidesLower + g.faces.sidesUpper + g.faces.lid + g.edges + g.openings;
  return { steps, newtonIterations: newton, newtonFailures: failures, rejectedSteps: rejected, gains_J: g, storedChange_J: stored, energyError_J: stored - totalIn, t_end_s: t, heatCapacity_J_K: S.heatCapacity };
}

/** Everything one Newton solve of the network works on, fixed for a run (arrays are overwritten in place). */
interface NewtonSystem {
  chains: Chain[];
  F: Nodes;
  nFaces: number;
  nZ: number;
  nK: number;
  keyRow: Int32Array;
  zoneRow: Int32Array;
  elim: Elimination;
  linkA: Int32Array;
  linkB: Int32Array;
  linkG: Float64Array;
  A: Float64Array;
  A0: Float64Array;
  rhs: Float64Array;
  dAir: Float64Array;
  res: Float64Array;
  outerG: Float64Array;
  outerT: Float64Array;
  Cair: Float64Array;
  edgeShare: Float64Array;
  openShare: Float64Array;
  sumU: Float64Array;
  Tair: Float64Array;
  TairStar: Float64Array;
  /** The zones' rates at the step's start, K/s (a restart's first step). */
  rate0Air: Float64Array;
  /**
   * (θ/(1 − θ))^0.8 from the contraction rate θ of the last step that took more than one iteration, the
   * factor newtonStep's first-iteration test puts on the first update; Infinity before the first such step
   * and while θ ≥ 1/2.
   */
  firstIterationFactor: number;
  /** Whether the last back substitution moved a body node into a cell of quite another slope (SLOPE_JUMP). */
  slopeJump: boolean;
  /** The walls' diagonal without capacity and outer film (links, contacts and zones at the end node), W/K: fixed for a run. */
  wallFixedDiag: Float64Array;
  /** The 1/h and outer coefficient the walls' rows were last eliminated with (factorWalls); NaN for none. */
  wallsInvH: number;
  wallsOuterH: number;
}

/** The parts of the dense system that stay fixed over a step's Newton iterations, into A0. */
function fixedSystem(S: NewtonSystem, invH: number, Gedge: number, Gopen: number, Gzz: number): void {
  const { A0, nK, nZ, keyRow, zoneRow, linkA, linkB, linkG, chains } = S;
  A0.fill(0);
  for (let l = 0; l < linkA.length; l++) {
    const ra = keyRow[linkA[l]];
    const rb = keyRow[linkB[l]];
    A0[ra * nK + rb] -= linkG[l];
    A0[rb * nK + ra] -= linkG[l];
  }
  for (let z = 0; z < nZ; z++) {
    const zr = zoneRow[z];
    A0[zr * nK + zr] = S.Cair[z] * invH + Gedge * S.edgeShare[z] + Gopen * S.openShare[z] + S.sumU[z];
  }
  if (nZ > 1 && Gzz > 0) {
    const z0 = zoneRow[0];
    const z1 = zoneRow[1];
    A0[z0 * nK + z0] += Gzz;
    A0[z1 * nK + z1] += Gzz;
    A0[z0 * nK + z1] -= Gzz;
    A0[z1 * nK + z0] -= Gzz;
  }
  for (let ci = 0; ci < chains.length; ci++) {
    const row = keyRow[ci];
    if (row < 0) continue;
    const U = chains[ci].U;
    for (let z = 0; z < nZ; z++) {
      const zr = zoneRow[z];
      A0[row * nK + zr] -= U[z];
      A0[zr * nK + row] -= U[z];
    }
  }
  // The walls' eliminated rows are the same at every iteration of the step (factorWalls): their
  // share of the dense matrix is fixed too, the end node's pivot or the Schur complement onto the zones.
  for (let ci = 0; ci < S.nFaces; ci++) {
    const row = keyRow[ci];
    const bpn = S.F.bp[S.F.end[ci]];
    if (row >= 0) A0[row * nK + row] += bpn;
    else zoneSchurMatrix(chains[ci].U, bpn, A0, nK, nZ, zoneRow);
  }
}

/**
 * Newton iterations of one implicit step (backward Euler of length 1/invH from the stored H* and T*_air),
 * from the temperatures in the chains and zones. Returns the number of iterations, or 0 if it did not
 * converge within 40.
 */
function newtonStep(S: NewtonSystem, invH: number, Gedge: number, Gopen: number, Gzz: number, air_C: number, keepRates: boolean): number {
  const { chains, F, nFaces, nZ, nK, keyRow, zoneRow, elim, linkA, linkB, linkG, A, A0, rhs, dAir, res, Cair, edgeShare, openShare, Tair, TairStar } = S;
  const { T, end, extra } = F;
  let lastStep = Infinity;
  for (let it = 0; it < 40; it++) {
    A.set(A0);
    rhs.fill(0);
    // Contact fluxes at this iterate (their Jacobian is in the dense system).
    extra.fill(0);
    for (let l = 0; l < linkA.length; l++) {
      const a = linkA[l];
      const b = linkB[l];
      const q = linkG[l] * (T[end[b]] - T[end[a]]);
      extra[a] += q;
      extra[b] -= q;
    }
    // The zones' own residuals.
    for (let z = 0; z < nZ; z++) {
      res[z] = Cair[z] * (Tair[z] - TairStar[z]) * invH - (Gedge * edgeShare[z] + Gopen * openShare[z]) * (air_C - Tair[z]);
    }
    if (nZ > 1 && Gzz > 0) {
      res[0] -= Gzz * (Tair[1] - Tair[0]);
      res[1] -= Gzz * (Tair[0] - Tair[1]);
    }
    // Build and forward-eliminate every chain, then couple each end node to the dense system.
    if (it > 0) wallEnds(S, invH, res);
    else assembleWalls(S, invH, res);
    assembleBodies(S, invH, res);
    const { bp, dp } = F;
    for (let ci = 0; ci < chains.length; ci++) {
      const wall = ci < nFaces;
      const row = keyRow[ci];
      if (row >= 0) {
        // The end node stays an unknown: bp δ_end − Σ U_z δ_z − Σ G δ_partner = dp (a wall's bp is in A0).
        const e = end[ci];
        if (!wall) A[row * nK + row] += bp[e];
        rhs[row] += dp[e];
      } else schurOntoZones(chains[ci].U, bp[end[ci]], dp[end[ci]], A, rhs, nK, nZ, zoneRow, !wall);
    }
    for (let z = 0; z < nZ; z++) rhs[zoneRow[z]] -= res[z];
    if (it === 0 && keepRates) keepStartRates(S, invH);
    solveSparse(elim, A, rhs, dAir);
    let maxStep = 0;
    for (let z = 0; z < nZ; z++) {
      const d = dAir[zoneRow[z]];
      Tair[z] += d;
      maxStep = Math.max(maxStep, Math.abs(d));
    }
    const m = backSubstituteAll(S, dAir);
    if (!(m <= maxStep)) maxStep = m;
    // Converged once the error left after this update is below the tolerance: the update itself, or,
    // while the updates shrink at a rate θ = |δ_k|/|δ_k−1| < 1/2, the next one, bounded by θ/(1 − θ)·|δ_k|
    // (the contraction estimate of Hairer & Wanner [hairerWanner1996]).
    // The first iteration: no rate of its own yet, so the last step's stands in, η = (θ/(1 − θ))^0.8 as in
    // Hairer & Wanner's RADAU5 [hairerWanner1996], unless a node has just crossed into a cell of quite
    // another slope (the linearisation this iteration used no longer holds there).
    if (it === 0 && !S.slopeJump && S.firstIterationFactor * maxStep < NEWTON_TOL_K) return 1;
    const theta = maxStep / lastStep;
    if (maxStep < NEWTON_TOL_K || (it > 0 && theta < 0.5 && (theta / (1 - theta)) * maxStep < NEWTON_TOL_K)) {
      if (it > 0) S.firstIterationFactor = theta < 0.5 ? Math.pow(Math.max(theta / (1 - theta), 1e-16), 0.8) : Infinity;
      return it + 1;
    }
    lastStep = maxStep;
  }
  return 0;
}

/**
 * A backward-Euler step's first iteration starts at the step's start (no predictor), so its residual is
 * minus the heat flowing into each node there: the rates F(E⁰), per kg (bodies) or per J/K (walls, zones).
 */
function keepStartRates(S: NewtonSystem, invH: number): void {
  const { nZ, res, Cair, Tair, TairStar, rate0Air } = S;
  const { T, Hn, R, mass, Hold, rate0, nW, nT } = S.F;
  for (let j = 0; j < nW; j++) rate0[j] = invH * (T[j] - Hold[j]) - R[j] / mass[j];
  for (let j = nW; j < nT; j++) rate0[j] = invH * (Hn[j] - Hold[j]) - R[j] / mass[j];
  for (let z = 0; z < nZ; z++) rate0Air[z] = invH * (Tair[z] - TairStar[z]) - res[z] / Cair[z];
}

/**
 * The local error of a backward-Euler step of length h from E⁰ to E¹: about h²/2·E'' ≈ |E¹ − E⁰ − h·F(E⁰)|/2
 * per node [hairerWanner1996], in kelvin as stepDistance weighs it (H over 3 kJ/(kg·K); zones × 0.2).
 */
function eulerStepError(S: Net, h: number): number {
  let m = 0;
  const { T, Hn, Hs, rate0, nW, nT } = S.F;
  for (let j = 0; j < nW; j++) {
    const d = 0.5 * 1 * Math.abs(T[j] - Hs[j] - h * rate0[j]);
    if (d > m) m = d;
  }
  const sc = 1 / ERROR_C_J_KGK;
  for (let j = nW; j < nT; j++) {
    const d = 0.5 * sc * Math.abs(Hn[j] - Hs[j] - h * rate0[j]);
    if (d > m) m = d;
  }
  const { Tair, TairOld, rate0Air } = S;
  for (let z = 0; z < S.nZ; z++) {
    const d = 0.1 * Math.abs(Tair[z] - TairOld[z] - h * rate0Air[z]);
    if (d > m) m = d;
  }
  return m;
}

/** Each link's conductance G_j (node j to j + 1, zero at a chain's end) on both diagonals, −G_j off them, for nodes from … to − 1. */
function linkRows(from: number, to: number, G: Float64Array, a: Float64Array, b: Float64Array, c: Float64Array): void {
  for (let j = from; j < to - 1; j++) {
    const g = G[j];
    b[j] += g;
    b[j + 1] += g;
    c[j] = -g;
    a[j + 1] = -g;
  }
  a[from] = 0;
  c[to - 1] = 0;
}

/**
 * The walls' rows without capacity and outer film, fixed for a run: links on both diagonals (the
 * off-diagonals a, c, which nothing else writes for the walls, are set here once), and each end node's
 * contacts and zone couplings. Returns that diagonal.
 */
function wallFixedRows(F: Nodes, chains: Chain[], nFaces: number, nZ: number): Float64Array {
  const nW = F.nW;
  const { a, b, c, Gfac, end } = F;
  b.fill(0, 0, nW);
  if (nW > 0) linkRows(0, nW, Gfac, a, b, c);
  for (let ci = 0; ci < nFaces; ci++) {
    const ch = chains[ci];
    const e = end[ci];
    b[e] += ch.linkDiag;
    for (let z = 0; z < nZ; z++) b[e] += ch.U[z];
  }
  return b.slice(0, nW);
}

/**
 * The walls (constant properties) have the same Newton matrix at every iteration of a step, and at every
 * step of the same length within one set of conditions: their diagonal (capacity/h, the fixed part of
 * wallFixedRows, the outer film) and forward-elimination multipliers are formed here only when 1/h or the
 * outer films have changed since the last time, so that each iteration forms only the residual and sweeps
 * it without a division.
 */
function factorWalls(S: NewtonSystem, invH: number): void {
  const F = S.F;
  const nW = F.nW;
  if (nW === 0 || invH === S.wallsInvH) return;
  S.wallsInvH = invH;
  const { a, b, c, bp, w, bpInv, mass, start } = F;
  const fixed = S.wallFixedDiag;
  for (let j = 0; j < nW; j++) b[j] = mass[j] * invH + fixed[j];
  for (let ci = 0; ci < S.nFaces; ci++) {
    const Gout = S.outerG[ci];
    if (Gout > 0) b[start[ci]] += Gout;
  }
  bp[0] = b[0];
  bpInv[0] = 1 / b[0];
  // At a chain's first node (a = 0) the elimination starts afresh: written as a branch, so that the
  // processor need not wait for the last chain's pivots (each chain's sweep is serial, the chains are not).
  for (let j = 1; j < nW; j++) {
    if (a[j] === 0) {
      w[j] = 0;
      bp[j] = b[j];
    } else {
      w[j] = a[j] * bpInv[j - 1];
      bp[j] = b[j] - w[j] * c[j - 1];
    }
    bpInv[j] = 1 / bp[j];
  }
}

/** The walls' residual at the current iterate (capacity, links, the outer film, contact and zones at the end node), swept forward; adds their share to the zones' residuals. */
function assembleWalls(S: NewtonSystem, invH: number, res: Float64Array): void {
  const F = S.F;
  const nW = F.nW;
  if (nW === 0) return;
  const { T, R, mass, Hold, Gfac, dp, w, start, end, extra } = F;
  const { Tair, nZ, outerG, outerT } = S;
  for (let j = 0; j < nW; j++) R[j] = mass[j] * invH * (T[j] - Hold[j]);
  for (let j = 0; j < nW - 1; j++) {
    const q = Gfac[j] * (T[j + 1] - T[j]);
    R[j] -= q;
    R[j + 1] += q;
  }
  for (let ci = 0; ci < S.nFaces; ci++) {
    const Gout = outerG[ci];
    const s0 = start[ci];
    if (Gout > 0) R[s0] -= Gout * (outerT[ci] - T[s0]);
    const e = end[ci];
    R[e] -= extra[ci];
    const U = S.chains[ci].U;
    for (let z = 0; z < nZ; z++) {
      const Uz = U[z];
      if (Uz === 0) continue;
      R[e] -= Uz * (Tair[z] - T[e]);
      res[z] -= Uz * (T[e] - Tair[z]);
    }
  }
  dp[0] = -R[0];
  for (let j = 1; j < nW; j++) dp[j] = w[j] === 0 ? -R[j] : -R[j] - w[j] * dp[j - 1];
}

/**
 * The walls' rows after a Newton iteration: every row of a wall is linear in the wall's own temperatures,
 * and the last iteration moved them all by the exact solution of those rows (T + δ, no table), so each
 * row's residual is zero to round-off except the end node's, which also sees the zones and any body in
 * contact (whose update may have been placed through its table's inverse, backSubstituteAll). So only
 * that row is formed; the forward sweep of zeros leaves zeros (dp = 0 inside, −R at the end).
 */
function wallEnds(S: NewtonSystem, invH: number, res: Float64Array): void {
  const F = S.F;
  const { T, mass, Hold, Gfac, dp, start, end, extra } = F;
  const { Tair, nZ, outerG, outerT } = S;
  dp.fill(0, 0, F.nW);
  for (let ci = 0; ci < S.nFaces; ci++) {
    const e = end[ci];
    let Re = mass[e] * invH * (T[e] - Hold[e]) - extra[ci];
    if (e > start[ci]) Re -= Gfac[e - 1] * (T[e - 1] - T[e]);
    else if (outerG[ci] > 0) Re -= outerG[ci] * (outerT[ci] - T[e]);
    const U = S.chains[ci].U;
    for (let z = 0; z < nZ; z++) {
      const Uz = U[z];
      if (Uz === 0) continue;
      Re -= Uz * (Tair[z] - T[e]);
      res[z] -= Uz * (T[e] - Tair[z]);
    }
    dp[e] = -Re;
  }
}

/**
 * The bodies' Newton rows at the current iterate: one fused table look-up per node (H, its slope and k),
 * capacity m·c/h and residual m·(H − H*)/h, links with the harmonic-mean k, contact and zone coupling at
 * each end node; forward-eliminated towards the end nodes (bp, dp). Adds their share to the zones' residuals.
 */
function assembleBodies(S: NewtonSystem, invH: number, res: Float64Array): void {
  const F = S.F;
  const nW = F.nW;
  const nT = F.nT;
  if (nT === nW) return;
  const { T, Hn, cn, k, mass, Hold, Gfac, Gk, a, b, c, R, bp, dp, bpInv, start, end, extra, cell } = F;
  const { chains, Tair, nZ } = S;
  for (let ci = S.nFaces; ci < chains.length; ci++) {
    const ch = chains[ci];
    const s0 = start[ci];
    if (ch.table) evalTable(ch.table, T, s0, s0 + ch.n, Hn, cn, k, 1, cell);
    else if (ch.mat) evalMaterial(ch.mat, T, s0, s0 + ch.n, Hn, cn, k, 1);
  }
  for (let j = nW; j < nT; j++) {
    const m = mass[j] * invH;
    b[j] = m * cn[j];
    R[j] = m * (Hn[j] - Hold[j]);
  }
  for (let j = nW; j < nT - 1; j++) {
    const g = Gfac[j];
    if (g === 0) {
      Gk[j] = 0;
      continue;
    }
    const k1 = k[j];
    const k2 = k[j + 1];
    const G = (g * 2 * k1 * k2) / (k1 + k2);
    Gk[j] = G;
    const q = G * (T[j + 1] - T[j]);
    R[j] -= q;
    R[j + 1] += q;
  }
  linkRows(nW, nT, Gk, a, b, c);
  for (let ci = S.nFaces; ci < chains.length; ci++) {
    const ch = chains[ci];
    const e = end[ci];
    R[e] -= extra[ci];
    b[e] += ch.linkDiag;
    const U = ch.U;
    for (let z = 0; z < nZ; z++) {
      const Uz = U[z];
      if (Uz === 0) continue;
      R[e] -= Uz * (Tair[z] - T[e]);
      b[e] += Uz;
      res[z] -= Uz * (T[e] - Tair[z]);
    }
  }
  bp[nW] = b[nW];
  bpInv[nW] = 1 / b[nW];
  dp[nW] = -R[nW];
  // A chain's first node (a = 0) starts afresh, as a branch (factorWalls).
  for (let j = nW + 1; j < nT; j++) {
    if (a[j] === 0) {
      bp[j] = b[j];
      dp[j] = -R[j];
    } else {
      const w = a[j] * bpInv[j - 1];
      bp[j] = b[j] - w * c[j - 1];
      dp[j] = -R[j] - w * dp[j - 1];
    }
    bpInv[j] = 1 / bp[j];
  }
}

/** A chain whose end node only touches the zones: δ_end = (dp + Σ U_z δ_z)/bp, its Schur complement onto the zones' rows. */
function schurOntoZones(U: Float64Array, bpn: number, dpn: number, A: Float64Array, rhs: Float64Array, nK: number, nZ: number, zoneRow: Int32Array, withMatrix: boolean): void {
  for (let z = 0; z < nZ; z++) if (U[z] !== 0) rhs[zoneRow[z]] += (U[z] * dpn) / bpn;
  if (withMatrix) zoneSchurMatrix(U, bpn, A, nK, nZ, zoneRow);
}

/** The matrix part of a chain's Schur complement onto the zones' rows: −U_z·U_y/bp for each pair of zones it touches. */
function zoneSchurMatrix(U: Float64Array, bpn: number, A: Float64Array, nK: number, nZ: number, zoneRow: Int32Array): void {
  for (let z = 0; z < nZ; z++) {
    if (U[z] === 0) continue;
    const zr = zoneRow[z];
    for (let y = 0; y < nZ; y++) if (U[y] !== 0) A[zr * nK + zoneRow[y]] -= (U[z] * U[y]) / bpn;
  }
}

/**
 * Back substitution of every chain from its end node's update (a node in the dense system: its solution;
 * else derived from the zones'); returns the largest |δT|. Walls move by T + δ. Bodies also move H along the
 * same linearisation, H + c·δ, the energy the Newton rows store; for a tabulated body, while T + δ stays in
 * the node's table cell that H is the table's at T + δ, and when it leaves the cell (a node crossing a
 * melting band's edge, where the slope jumps) T is placed from that H through the table's inverse instead
 * [swaminathanVoller1992], so that a node never overshoots a band it has only begun to enter and Newton
 * does not cycle between its two sides. The largest |δ| is that of the linear update (not the placed |ΔT|:
 * a node entering a band moves little in T for a large change in H, and must not count as converged).
 */
function backSubstituteAll(S: NewtonSystem, d: Float64Array): number {
  const F = S.F;
  const { T, Hn, cn, c, dp, bpInv, isEnd, endDelta, table, end, cell } = F;
  const { chains, keyRow, zoneRow, nZ } = S;
  for (let ci = 0; ci < chains.length; ci++) {
    const row = keyRow[ci];
    const e = end[ci];
    if (row >= 0) endDelta[e] = d[row];
    else {
      let coupled = dp[e];
      const U = chains[ci].U;
      for (let z = 0; z < nZ; z++) coupled += U[z] * d[zoneRow[z]];
      endDelta[e] = coupled * bpInv[e];
    }
  }
  const nW = F.nW;
  let maxStep = 0;
  let next = 0;
  let jump = false;
  for (let j = nW - 1; j >= 0; j--) {
    next = isEnd[j] ? endDelta[j] : (dp[j] - c[j] * next) * bpInv[j];
    T[j] += next;
    const m = next < 0 ? -next : next;
    // Written so that a NaN update is never taken for a converged one.
    if (!(m <= maxStep)) maxStep = m;
  }
  for (let j = F.nT - 1; j >= nW; j--) {
    next = isEnd[j] ? endDelta[j] : (dp[j] - c[j] * next) * bpInv[j];
    const tb = table[j];
    if (tb) {
      const Tj = T[j];
      const Tlin = Tj + next;
      const H = Hn[j] + cn[j] * next;
      Hn[j] = H;
      const to = tableCell(tb, Tlin);
      if (to === cell[j]) T[j] = Tlin;
      else {
        T[j] = tableT(tb, H, to);
        const slope = (tb.H[to + 1] - tb.H[to]) * tb.invDT;
        if (Math.abs(slope - cn[j]) > SLOPE_JUMP * cn[j]) jump = true;
      }
    } else {
      T[j] += next;
      Hn[j] += cn[j] * next;
    }
    const m = next < 0 ? -next : next;
    if (!(m <= maxStep)) maxStep = m;
  }
  S.slopeJump = jump;
  return maxStep;
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
