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
 */
import { requirePositive, requireTemperature, type Warned } from "./validation";

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
  const t = ((p.rho_kg_m3 * p.latent_J_kg) / dT) * ((P * p.a_m) / p.h_W_m2K + (R * p.a_m * p.a_m) / p.k_W_mK);
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
