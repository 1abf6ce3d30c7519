/**
 * Closed-form freezing and thawing time estimates, shown as a second opinion beside the
 * numerical answer.
 *
 * - Plank (1913): t = ρL/(ΔT) · (P a/h + R a²/k), a = full thickness or diameter; P, R = 1/2, 1/8 (slab),
 *   1/4, 1/16 (infinite cylinder), 1/6, 1/24 (sphere) [plank1913]. For thawing, ΔT = T_a − T_f and k is the
 *   thawed conductivity.
 * - Pham (1986): t = (R/(E h)) (ΔH1/ΔT1 + ΔH2/ΔT2)(1 + Bi/2), Bi = hR/k, R = half the smallest dimension,
 *   T_fm = 1.8 + 0.263 T_c + 0.105 T_a [pham1986]. The thawing form with the roles reversed is from memory
 *   and unverified (see Góral et al. 2016 [goral2016]); it carries a warning.
 * - Shapes other than slab, infinite cylinder and sphere: equivalent heat-transfer dimensionality at Bi → 0,
 *   E0 = 1 + 1/β1 + 1/β2, β1 = second-shortest/shortest, β2 = longest/shortest [ashraeEHTD]; t = t_slab/E.
 * - Hollow spheres and cylinders (insulated cavity face): Plank's own assumptions (quasi-steady conduction
 *   through the thawed layer, latent heat only) integrated over the shell give t = ρL/ΔT · (ℓ/h + S/k) with
 *   ℓ = V/A and S below (shellEstimateGeometry); for a solid sphere S = R²/6 and ℓ = R/3, Plank's 1/6, 1/24.
 *   Pham's form then takes the half-size 2S/ℓ and E = 2S/ℓ², which reproduce both terms.
 */
import { requirePositive, requireTemperature, type Warned } from "./validation";
import type { FoodThermal } from "./properties";
import type { ItemShape } from "./geometry";
import type { ProductShape } from "../schemas/templates";

export type EstimateShape = "slab" | "cylinder" | "sphere";

export const PLANK_FACTORS: Record<EstimateShape, { P: number; R: number }> = {
  slab: { P: 1 / 2, R: 1 / 8 },
  cylinder: { P: 1 / 4, R: 1 / 16 },
  sphere: { P: 1 / 6, R: 1 / 24 },
};

/** E0 = 1 + 1/β1 + 1/β2 from the three dimensions of an item (any order; Infinity for an unbounded one) [ashraeEHTD]. */
export function equivalentDimensionality(dims_m: number[]): { E: number; shortest_m: number } {
  const d = [...dims_m].sort((x, y) => x - y);
  while (d.length < 3) d.push(Infinity);
  const [a, b, c] = d;
  return { E: 1 + a / b + a / c, shortest_m: a };
}

/**
 * Plank-level geometry of a solid or hollow cylinder or sphere of outer radius R and insulated inner radius Ri:
 * ℓ = V/A = (R^(m+1) − Ri^(m+1))/((m+1) R^m) and
 * S = ∫_Ri^R r^(−m) ∫_Ri^r s^m ds dr /… = [ (R² − Ri²)/2 − Ri^(m+1) ∫_Ri^R r^(−m) dr ] / (m+1),
 * i.e. sphere S = [(R² − Ri²)/2 − Ri² + Ri³/R]/3, cylinder S = [(R² − Ri²)/2 − Ri² ln(R/Ri)]/2 (our derivation
 * from Plank's assumptions [plank1913]; Ri = 0 gives Plank's shape factors). Returns ℓ, S, and Pham's
 * equivalent half-size 2S/ℓ and dimensionality E = 2S/ℓ².
 */
export function shellEstimateGeometry(shape: "cylinder" | "sphere", R_m: number, Ri_m: number): { lumped_m: number; S_m2: number; halfSize_m: number; E: number } {
  const R = requirePositive("outer radius", R_m);
  const Ri = Math.min(Math.max(0, Ri_m), R * (1 - 1e-9));
  let lumped: number;
  let S: number;
  if (shape === "sphere") {
    lumped = (R ** 3 - Ri ** 3) / (3 * R * R);
    S = ((R * R - Ri * Ri) / 2 - Ri * Ri + Ri ** 3 / R) / 3;
  } else {
    lumped = (R * R - Ri * Ri) / (2 * R);
    S = ((R * R - Ri * Ri) / 2 - (Ri > 0 ? Ri * Ri * Math.log(R / Ri) : 0)) / 2;
  }
  const halfSize = (2 * S) / lumped;
  return { lumped_m: lumped, S_m2: S, halfSize_m: halfSize, E: halfSize / lumped };
}

/** Plank's estimate, seconds. `a_m` is the full thickness (slab) or diameter; E scales a slab to other shapes. */
export function plankTime(p: {
  shape: EstimateShape;
  a_m: number;
  rho_kg_m3: number;
  latent_J_kg: number;
  h_W_m2K: number;
  k_W_mK: number;
  Tf_C: number;
  medium_C: number;
  E?: number;
  /** Hollow cylinder or sphere: inner (cavity) diameter, m; `a_m` is then the outer diameter. */
  innerDiameter_m?: number;
}): Warned<number> {
  requirePositive("a_m", p.a_m);
  requirePositive("h_W_m2K", p.h_W_m2K);
  requirePositive("k_W_mK", p.k_W_mK);
  requireTemperature("Tf_C", p.Tf_C);
  requireTemperature("medium_C", p.medium_C);
  const warnings: string[] = [];
  const dT = Math.abs(p.Tf_C - p.medium_C);
  if (dT < 0.1) {
    warnings.push("The medium is at the freezing point: the phase change never completes (Plank time is unbounded); shown as the longest representable time");
    return { value: Number.MAX_VALUE, warnings };
  }
  const { P, R } = PLANK_FACTORS[p.shape];
  const E = p.E ?? 1;
  let t = ((p.rho_kg_m3 * p.latent_J_kg) / dT) * ((P * p.a_m) / p.h_W_m2K + (R * p.a_m * p.a_m) / p.k_W_mK);
  if (p.innerDiameter_m && p.shape !== "slab") {
    const g = shellEstimateGeometry(p.shape, p.a_m / 2, p.innerDiameter_m / 2);
    t = ((p.rho_kg_m3 * p.latent_J_kg) / dT) * (g.lumped_m / p.h_W_m2K + g.S_m2 / p.k_W_mK);
  }
  warnings.push("Plank counts latent heat only: no pre-cooling or warming of the solid, a single freezing temperature");
  return { value: t / E, warnings };
}

/** Pham (1986) estimate, seconds. Freezing when the medium is colder than the item, thawing otherwise. */
export function phamTime(p: {
  E: number;
  halfSize_m: number;
  h_W_m2K: number;
  rhoUnfrozen_kg_m3: number;
  rhoFrozen_kg_m3: number;
  cUnfrozen_J_kgK: number;
  cFrozen_J_kgK: number;
  kUnfrozen_W_mK: number;
  kFrozen_W_mK: number;
  latent_J_kg: number;
  Tf_C: number;
  initial_C: number;
  finalCenter_C: number;
  medium_C: number;
}): Warned<number> {
  requirePositive("halfSize_m", p.halfSize_m);
  requirePositive("h_W_m2K", p.h_W_m2K);
  requirePositive("E", p.E);
  const warnings: string[] = [];
  const freezing = p.medium_C < p.initial_C;
  let dH1: number, dH2: number, dT1: number, dT2: number, k: number;
  if (freezing) {
    const Tfm = 1.8 + 0.263 * p.finalCenter_C + 0.105 * p.medium_C;
    dH1 = p.rhoUnfrozen_kg_m3 * p.cUnfrozen_J_kgK * Math.max(0, p.initial_C - Tfm);
    dH2 = p.rhoFrozen_kg_m3 * (p.latent_J_kg + p.cFrozen_J_kgK * (Tfm - p.finalCenter_C));
    dT1 = (p.initial_C + Tfm) / 2 - p.medium_C;
    dT2 = Tfm - p.medium_C;
    k = p.kFrozen_W_mK;
  } else {
    const Tfm = p.Tf_C - 1.5;
    dH1 = p.rhoFrozen_kg_m3 * p.cFrozen_J_kgK * Math.max(0, Tfm - p.initial_C);
    dH2 = p.rhoUnfrozen_kg_m3 * (p.latent_J_kg + p.cUnfrozen_J_kgK * Math.max(0, p.finalCenter_C - Tfm));
    dT1 = p.medium_C - (p.initial_C + Tfm) / 2;
    dT2 = p.medium_C - Tfm;
    k = p.kUnfrozen_W_mK;
    warnings.push("Pham's thawing form (roles of frozen and thawed reversed, mean phase-change temperature T_f − 1.5 K) is from memory and unverified");
  }
  if (dT1 <= 0.1 || dT2 <= 0.1) {
    warnings.push("The medium is too close to the phase-change temperature for Pham's method; shown as the longest representable time");
    return { value: Number.MAX_VALUE, warnings };
  }
  const Bi = (p.h_W_m2K * p.halfSize_m) / k;
  const t = (p.halfSize_m / (p.E * p.h_W_m2K)) * (dH1 / dT1 + dH2 / dT2) * (1 + Bi / 2);
  return { value: t, warnings };
}

/** What Plank and Pham are given: the same latent heat and sensible heats as the enthalpy model. */
export interface EstimateInputs {
  /** Latent heat released between the start and the end point, J/kg: the ice present at the start. */
  latent_J_kg: number;
  /** Mean sensible specific heat (no latent part) from the start to the freezing point, and from there to the end point, J/(kg·K). */
  cFrozen_J_kgK: number;
  cUnfrozen_J_kgK: number;
  kFrozen_W_mK: number;
  kUnfrozen_W_mK: number;
}

/** Mean of f over [a, b] by Simpson's rule on 20 intervals. */
function meanOver(f: (T: number) => number, a: number, b: number): number {
  if (!(b > a)) return f(a);
  const n = 20;
  const step = (b - a) / n;
  let s = f(a) + f(b);
  for (let i = 1; i < n; i++) s += (i % 2 ? 4 : 2) * f(a + i * step);
  return (s * step) / 3 / (b - a);
}

/** The enthalpy model's latent heat and sensible heats between a frozen start and a thawed end point. */
export function estimateInputs(food: Pick<FoodThermal, "Tf_C" | "latentHeld_J_kg" | "cSensible_J_kgK" | "k_W_mK">, start_C: number, end_C: number): EstimateInputs {
  const Tf = food.Tf_C;
  return {
    latent_J_kg: Math.max(0, food.latentHeld_J_kg(start_C) - food.latentHeld_J_kg(end_C)),
    cFrozen_J_kgK: meanOver((T) => food.cSensible_J_kgK(T), Math.min(start_C, Tf - 1e-6), Tf - 1e-6),
    cUnfrozen_J_kgK: meanOver((T) => food.cSensible_J_kgK(T), Tf + 1e-6, Math.max(end_C, Tf + 1)),
    kFrozen_W_mK: food.k_W_mK(Math.min(start_C, Tf - 5)),
    kUnfrozen_W_mK: food.k_W_mK(Tf + 2),
  };
}

/**
 * Plank and Pham thawing estimates for an item (solid or hollow) with the enthalpy model's own latent and
 * sensible heats. A sphere uses Plank's sphere factors, a hollow item the shell geometry, any other shape a
 * slab on its smallest dimension divided by E [plank1913, pham1986, ashraeEHTD].
 */
export function closedFormEstimates(p: {
  food: FoodThermal;
  shape: ItemShape;
  productShape: ProductShape;
  h_W_m2K: number;
  start_C: number;
  end_C: number;
  medium_C: number;
}): { plank_s: number | null; pham_s: number | null; inputs: EstimateInputs; warnings: string[] } {
  const { food, shape } = p;
  const inputs = estimateInputs(food, p.start_C, p.end_C);
  const hollow = shape.hollow;
  const round = p.productShape === "sphere" || hollow !== null;
  const pl = plankTime({
    shape: p.productShape === "sphere" ? "sphere" : hollow ? "cylinder" : "slab",
    a_m: 2 * shape.oneD.halfSize_m,
    innerDiameter_m: hollow ? 2 * hollow.inner_m : undefined,
    rho_kg_m3: food.rho_kg_m3,
    latent_J_kg: inputs.latent_J_kg,
    h_W_m2K: p.h_W_m2K,
    k_W_mK: inputs.kUnfrozen_W_mK,
    Tf_C: food.Tf_C,
    medium_C: p.medium_C,
    E: round ? 1 : shape.oneD.E,
  });
  const g = hollow ? shellEstimateGeometry(shape.oneD.shape === "sphere" ? "sphere" : "cylinder", hollow.outer_m, hollow.inner_m) : null;
  const ph = phamTime({
    E: g ? g.E : p.productShape === "sphere" ? 3 : shape.oneD.E,
    halfSize_m: g ? g.halfSize_m : shape.oneD.halfSize_m,
    h_W_m2K: p.h_W_m2K,
    rhoUnfrozen_kg_m3: food.rho_kg_m3,
    rhoFrozen_kg_m3: food.rho_kg_m3,
    cUnfrozen_J_kgK: inputs.cUnfrozen_J_kgK,
    cFrozen_J_kgK: inputs.cFrozen_J_kgK,
    kUnfrozen_W_mK: inputs.kUnfrozen_W_mK,
    kFrozen_W_mK: inputs.kFrozen_W_mK,
    latent_J_kg: inputs.latent_J_kg,
    Tf_C: food.Tf_C,
    initial_C: p.start_C,
    finalCenter_C: p.end_C,
    medium_C: p.medium_C,
  });
  return { plank_s: pl.value < 1e300 ? pl.value : null, pham_s: ph.value < 1e300 ? ph.value : null, inputs, warnings: [...pl.warnings, ...ph.warnings] };
}
