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
 * index per node. No allocation; the solvers call it once per Newton iteration.
 */
export function evalTable(t: PropertyTable, T: Float64Array, from: number, to: number, Hout: Float64Array, cOut: Float64Array, kOut: Float64Array, cMin: number): void {
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
