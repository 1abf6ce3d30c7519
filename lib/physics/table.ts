/**
 * The one tabulated form of an enthalpy material, shared by foods and coolant packs, and the fused
 * look-up the solvers use: one index gives H, its slope (the apparent specific heat) and k.
 *
 * H(T) is piecewise linear between the grid points T0 + i·dT and extends linearly beyond the ends with
 * the end cells' slopes; c = dH/dT is the slope of the cell T falls in; k is linear between grid
 * points and held constant beyond the ends. A material with kinks on grid points (a pack's melting band
 * whose edges are grid points) is represented exactly.
 */

export interface PropertyTable {
  T0_C: number;
  dT_K: number;
  /** 1/dT_K. */
  invDT: number;
  /** Specific enthalpy at the grid points, J/kg. */
  H: Float64Array;
  /** Conductivity at the grid points, W/(m·K). */
  k: Float64Array;
}

export function makeTable(T0_C: number, dT_K: number, H: Float64Array, k: Float64Array): PropertyTable {
  return { T0_C, dT_K, invDT: 1 / dT_K, H, k };
}

/** H at T from the table, J/kg. */
export function tableH(t: PropertyTable, T_C: number): number {
  const u = (T_C - t.T0_C) * t.invDT;
  const last = t.H.length - 2;
  let i = Math.floor(u);
  if (i < 0) i = 0;
  else if (i > last) i = last;
  return t.H[i] + (u - i) * (t.H[i + 1] - t.H[i]);
}

/** dH/dT at T (slope of the cell), J/(kg·K). */
export function tableC(t: PropertyTable, T_C: number): number {
  const last = t.H.length - 2;
  let i = Math.floor((T_C - t.T0_C) * t.invDT);
  if (i < 0) i = 0;
  else if (i > last) i = last;
  return (t.H[i + 1] - t.H[i]) * t.invDT;
}

/** k at T, W/(m·K). */
export function tableK(t: PropertyTable, T_C: number): number {
  const u = (T_C - t.T0_C) * t.invDT;
  const last = t.k.length - 2;
  const i = Math.floor(u);
  if (i < 0) return t.k[0];
  if (i > last) return t.k[last + 1];
  return t.k[i] + (u - i) * (t.k[i + 1] - t.k[i]);
}

/**
 * The fused kernel: for nodes `from` … `to − 1` of T, writes H, dH/dT (at least `cMin`) and k from one
 * index per node, and that index (the node's cell, as tableCell; 0 for a NaN T) into `cellOut` when given. No
 * allocation; the solvers call it once per Newton iteration.
 */
export function evalTable(t: PropertyTable, T: Float64Array, from: number, to: number, Hout: Float64Array, cOut: Float64Array, kOut: Float64Array, cMin: number, cellOut?: Int32Array): void {
  const Ht = t.H;
  const Kt = t.k;
  const T0 = t.T0_C;
  const inv = t.invDT;
  const last = Ht.length - 2;
  for (let j = from; j < to; j++) {
    const u = (T[j] - T0) * inv;
    let i = Math.floor(u);
    if (i < 0) i = 0;
    else if (i > last) i = last;
    if (cellOut !== undefined) cellOut[j] = i;
    const f = u - i;
    const H0 = Ht[i];
    const dH = Ht[i + 1] - H0;
    Hout[j] = H0 + f * dH;
    const c = dH * inv;
    cOut[j] = c > cMin ? c : cMin;
    const fk = f < 0 ? 0 : f > 1 ? 1 : f;
    kOut[j] = Kt[i] + fk * (Kt[i + 1] - Kt[i]);
  }
}

/** H only, for nodes `from` … `to − 1` (after a converged step). */
export function evalTableH(t: PropertyTable, T: Float64Array, from: number, to: number, Hout: Float64Array): void {
  const Ht = t.H;
  const T0 = t.T0_C;
  const inv = t.invDT;
  const last = Ht.length - 2;
  for (let j = from; j < to; j++) {
    const u = (T[j] - T0) * inv;
    let i = Math.floor(u);
    if (i < 0) i = 0;
    else if (i > last) i = last;
    Hout[j] = Ht[i] + (u - i) * (Ht[i + 1] - Ht[i]);
  }
}

/** The cell T falls in (clamped to the table, as the look-ups use it). */
export function tableCell(t: PropertyTable, T_C: number): number {
  const last = t.H.length - 2;
  const i = Math.floor((T_C - t.T0_C) * t.invDT);
  return i < 0 ? 0 : i > last ? last : i;
}

/** Cells tableT walks from a hint before it falls back to the binary search. */
const HINT_WALK = 8;

/**
 * The inverse of tableH: the temperature at which the table's H equals `H_J_kg`, °C. H rises through the
 * grid (foods and packs: c ≥ 0), so one binary search finds the cell; beyond the ends the end cells'
 * slopes extend it linearly, as tableH does. Where H is flat over a range of T (c = 0), the top of that
 * range. The solvers use it to place a node from the enthalpy its Newton update reached when that update
 * leaves the node's cell (the enthalpy-update form of Swaminathan & Voller [swaminathanVoller1992]).
 * `hint`, a cell near the answer (the cell of T + δ), replaces the binary search by a short walk; the cell
 * found is the same (H must not fall anywhere along the grid, as for every enthalpy table here).
 */
export function tableT(t: PropertyTable, H_J_kg: number, hint = -1): number {
  const Ht = t.H;
  const last = Ht.length - 2;
  let lo = 0;
  let hi = last;
  if (H_J_kg <= Ht[0]) hi = 0;
  else if (H_J_kg >= Ht[last + 1]) lo = last;
  else {
    // From a nearby cell (a node's update leaves its cell by a few cells at most): walk to the same cell
    // within HINT_WALK steps, else (or without a hint, or for NaN) the binary search.
    let found = false;
    if (hint >= 0 && H_J_kg === H_J_kg) {
      let i = Math.min(last, Math.floor(hint));
      for (let s = 0; s < HINT_WALK && i > 0 && Ht[i] > H_J_kg; s++) i--;
      for (let s = 0; s < HINT_WALK && i < last && Ht[i + 1] <= H_J_kg; s++) i++;
      if (Ht[i] <= H_J_kg && (i === last || Ht[i + 1] > H_J_kg)) {
        lo = i;
        found = true;
      }
    }
    // Largest i with Ht[i] <= H, in 0 … last.
    if (!found)
      while (lo < hi) {
        const mid = (lo + hi + 1) >> 1;
        if (Ht[mid] <= H_J_kg) lo = mid;
        else hi = mid - 1;
      }
  }
  const i = lo;
  const dH = Ht[i + 1] - Ht[i];
  if (!(dH > 0)) return t.T0_C + i * t.dT_K;
  return t.T0_C + (i + (H_J_kg - Ht[i]) / dH) * t.dT_K;
}
