/**
 * Thermal properties of a food from its composition.
 *
 * - Component properties: Choi & Okos (1986) polynomials in T (°C), valid −40…150 °C [choiOkos1986].
 * - Mixture: c = Σ xᵢ cᵢ (mass fractions); 1/ρ = Σ xᵢ/ρᵢ; unfrozen k by the parallel model on
 *   volume fractions; frozen k by Maxwell–Eucken with ice as the continuous phase and the parallel
 *   matrix of everything else dispersed in it [ashraeFoodProps, maxwellEucken]. Ice-continuous tends
 *   to the unfrozen value as the ice fraction goes to zero (no jump at t_f) and gives about
 *   1.3 W/(m·K) for frozen lean beef at −20 °C, where ice-dispersed gives about 1.0.
 * - Ice fraction below the initial freezing point t_f: x_ice = (x_wo − x_b)(1 − t_f/t), bound water
 *   x_b = 0.4 x_protein [ashraeFoodProps, schwartzberg1976]. A food without solutes (t_f at or above
 *   −0.05 °C, pure water) melts at a sharp front: all its freezable water melts over the 0.1 K just
 *   below t_f, as for a pure substance [carslawJaeger].
 * - Latent heat of the food: L = x_wo × 333.6 kJ/kg [latentWater].
 * - Enthalpy H(T) = ∫ c_sens dT − L0 x_ice(T): the sensible part integrated (Simpson) and the latent
 *   part exact, tabulated on a 0.1 K grid; the apparent specific heat c_app = dH/dT is the slope of the
 *   same table, so H and c are consistent by construction (test/unit/physics.test.ts).
 * - Missing initial freezing point: Pham (1996) for meat, θ_F = −4.66 x_o/x_w − 46.4 x_a/x_w [pham1996Tf],
 *   bounded to TF_ESTIMATE_FLOOR_C…0 °C, with a warning outside the water contents it suits.
 * - Porosity: an item whose density (the override, or mass ÷ volume) is well below the composition
 *   density holds air; the air is kept in the conductivity (Maxwell–Eucken, air dispersed) [maxwellEucken].
 *
 * Explicit overrides from the product template always win.
 */
import { makeTable, tableC, tableH, tableK, type PropertyTable } from "./table";
import { PhysicsInputError, requireFraction, requirePositive, requireTemperature, warnRange } from "./validation";
import type { Product } from "../schemas/templates";
import type { ItemShape } from "./geometry";

export interface Composition {
  water: number;
  protein: number;
  fat: number;
  carbohydrate: number;
  fibre: number;
  ash: number;
}

export interface PropertyOverrides {
  density_kg_m3?: number | null;
  cpUnfrozen_J_kgK?: number | null;
  cpFrozen_J_kgK?: number | null;
  kUnfrozen_W_mK?: number | null;
  kFrozen_W_mK?: number | null;
  latentHeat_J_kg?: number | null;
}

type Poly = readonly [number, number, number];
const ev = (p: Poly, T: number) => p[0] + p[1] * T + p[2] * T * T;

/** Choi & Okos (1986) coefficients, T in °C [choiOkos1986]. k in W/(m·K), ρ in kg/m³, c in kJ/(kg·K). */
export const CHOI_OKOS = {
  k: {
    protein: [1.7881e-1, 1.1958e-3, -2.7178e-6],
    fat: [1.8071e-1, -2.7604e-4, -1.7749e-7],
    carbohydrate: [2.0141e-1, 1.3874e-3, -4.3312e-6],
    fibre: [1.8331e-1, 1.2497e-3, -3.1683e-6],
    ash: [3.2962e-1, 1.4011e-3, -2.9069e-6],
    water: [5.7109e-1, 1.7625e-3, -6.7036e-6],
    ice: [2.2196, -6.2489e-3, 1.0154e-4],
  },
  rho: {
    protein: [1.3299e3, -5.184e-1, 0],
    fat: [9.2559e2, -4.1757e-1, 0],
    carbohydrate: [1.5991e3, -3.1046e-1, 0],
    fibre: [1.3115e3, -3.6589e-1, 0],
    ash: [2.4238e3, -2.8063e-1, 0],
    water: [9.9718e2, 3.1439e-3, -3.7574e-3],
    ice: [9.1689e2, -1.3071e-1, 0],
  },
  c: {
    protein: [2.0082, 1.2089e-3, -1.3129e-6],
    fat: [1.9842, 1.4733e-3, -4.8008e-6],
    carbohydrate: [1.5488, 1.9625e-3, -5.9399e-6],
    fibre: [1.8459, 1.8306e-3, -4.6509e-6],
    ash: [1.0926, 1.8896e-3, -3.6817e-6],
    water: [4.1289, -9.0864e-5, 5.4731e-6],
    ice: [2.0623, 6.0769e-3, 0],
  },
} as const satisfies Record<string, Record<string, Poly>>;

/** Published validity of the Choi–Okos fits [choiOkos1986]. */
export const CHOI_OKOS_RANGE_C = [-40, 150] as const;
/** Latent heat of fusion of water, L0 = 333.6 kJ/kg [latentWater]. */
export const L0_J_KG = 333_600;
/** Bound (non-freezable) water per unit protein mass, 0.4 [schwartzberg1976]. */
export const BOUND_WATER_PER_PROTEIN = 0.4;
/** Conductivity of still air at 20 °C, 0.0257 W/(m·K) (Incropera 6th ed., Table A.4, from memory) — used for pores. */
export const AIR_K_W_MK = 0.0257;

const SOLIDS = ["protein", "fat", "carbohydrate", "fibre", "ash"] as const;

export function validateComposition(c: Composition): void {
  for (const key of ["water", ...SOLIDS] as const) requireFraction(`composition.${key}`, c[key]);
  const sum = c.water + c.protein + c.fat + c.carbohydrate + c.fibre + c.ash;
  if (Math.abs(sum - 1) > 0.01) throw new PhysicsInputError("composition", `mass fractions add up to ${sum.toFixed(3)}, not 1 (±0.01)`);
}

/** Initial freezing point estimate, Pham (1996) for meat [pham1996Tf]. T in °C. */
export function estimateInitialFreezing_C(c: Composition): number {
  return initialFreezingEstimate(c).Tf_C;
}

/**
 * Lowest initial freezing point the estimate may return, −20 °C. The lowest initial freezing points in the
 * ASHRAE table of foods are about −16 °C (dried dates; ASHRAE Refrigeration Handbook 2006, Ch. 9, Table 3,
 * from memory), and NaCl brine, the strongest common food solute, freezes no lower than its eutectic,
 * −21.1 °C (published-values.md §5.3, from memory). Pham's formula, linear in solids ÷ water, runs far
 * below this for dry foods (below −800 °C at 1 % water), where a food barely freezes at all.
 */
export const TF_ESTIMATE_FLOOR_C = -20;
/**
 * Water contents Pham's (1996) meat formula suits: about 55–82 % (lean and fatty meats, poultry and fish;
 * our reading of the fitted data, from memory). Outside it the estimate carries a warning.
 */
export const PHAM_TF_WATER_RANGE = [0.55, 0.82] as const;

/** Pham (1996) estimate bounded to [TF_ESTIMATE_FLOOR_C, 0] °C, with the raw value and warnings [pham1996Tf]. */
export function initialFreezingEstimate(c: Composition): { Tf_C: number; raw_C: number; warnings: string[] } {
  const warnings: string[] = [];
  const other = c.protein + c.fat + c.carbohydrate + c.fibre;
  const raw = c.water > 0 ? -4.66 * (other / c.water) - 46.4 * (c.ash / c.water) : -Infinity;
  let Tf = Math.min(0, raw);
  const [lo, hi] = PHAM_TF_WATER_RANGE;
  if (c.water < lo || c.water > hi) {
    warnings.push(
      `The composition has ${(c.water * 100).toFixed(0)} % water, outside the ${Math.round(lo * 100)}–${Math.round(hi * 100)} % that Pham's (1996) freezing-point formula was fitted to: the estimate is rough, give the measured initial freezing point if you have it`,
    );
  }
  if (!(Tf >= TF_ESTIMATE_FLOOR_C)) {
    warnings.push(
      `The formula gives ${Number.isFinite(raw) ? raw.toFixed(0) + " °C" : "no value"} for so little water, which is not physical; bounded at ${TF_ESTIMATE_FLOOR_C} °C (no food in the published tables starts freezing below about −16 °C). A food this dry may hardly freeze: treat every freezing or thawing figure for it as uncertain`,
    );
    Tf = TF_ESTIMATE_FLOOR_C;
  }
  return { Tf_C: Tf, raw_C: raw, warnings };
}

/** Initial freezing points at or above this (°C) mean a food without solutes, which melts at a sharp front. */
export const SHARP_FRONT_TF_C = -0.05;
/** Width of the melting band of a food without solutes, 0.1 K (a numerical stand-in for a sharp front, as for packs). */
export const SHARP_MELT_BAND_K = 0.1;

/** Ice mass fraction at T (°C) for a food with initial freezing point Tf (°C) [ashraeFoodProps]. */
export function iceFraction(c: Composition, Tf_C: number, T_C: number): number {
  if (T_C >= Tf_C) return 0;
  const freezable = Math.max(0, c.water - BOUND_WATER_PER_PROTEIN * c.protein);
  if (Tf_C >= SHARP_FRONT_TF_C) return freezable * Math.min(1, (Tf_C - T_C) / SHARP_MELT_BAND_K);
  return Math.min(freezable, Math.max(0, freezable * (1 - Tf_C / T_C)));
}

/** d(x_ice)/dT, per K. */
function iceFractionSlope(c: Composition, Tf_C: number, T_C: number): number {
  if (T_C >= Tf_C) return 0;
  const freezable = Math.max(0, c.water - BOUND_WATER_PER_PROTEIN * c.protein);
  if (Tf_C >= SHARP_FRONT_TF_C) return T_C > Tf_C - SHARP_MELT_BAND_K ? -freezable / SHARP_MELT_BAND_K : 0;
  return (freezable * Tf_C) / (T_C * T_C); // negative: ice grows as T falls
}

/** Mixture density (kg/m³) at T with the given ice fraction: 1/ρ = Σ xᵢ/ρᵢ [ashraeFoodProps]. */
export function mixtureDensity(c: Composition, xIce: number, T_C: number): number {
  let inv = (c.water - xIce) / ev(CHOI_OKOS.rho.water, T_C) + xIce / ev(CHOI_OKOS.rho.ice, T_C);
  for (const s of SOLIDS) inv += c[s] / ev(CHOI_OKOS.rho[s], T_C);
  return 1 / inv;
}

/** Maxwell–Eucken: continuous phase k_c, dispersed phase k_d at volume fraction v_d [maxwellEucken]. */
export function maxwellEucken(k_c: number, k_d: number, v_d: number): number {
  return (k_c * (2 * k_c + k_d - 2 * v_d * (k_c - k_d))) / (2 * k_c + k_d + v_d * (k_c - k_d));
}

/** Conductivity from composition (W/(m·K)): parallel matrix dispersed in continuous ice (Maxwell–Eucken). */
export function mixtureConductivity(c: Composition, xIce: number, T_C: number): number {
  const parts: [number, number, number][] = [[c.water - xIce, ev(CHOI_OKOS.rho.water, T_C), ev(CHOI_OKOS.k.water, T_C)]];
  for (const s of SOLIDS) parts.push([c[s], ev(CHOI_OKOS.rho[s], T_C), ev(CHOI_OKOS.k[s], T_C)]);
  const vIceRaw = xIce / ev(CHOI_OKOS.rho.ice, T_C);
  let vMatrix = 0;
  let kv = 0;
  for (const [x, rho, k] of parts) {
    vMatrix += x / rho;
    kv += (x / rho) * k;
  }
  const kMatrix = vMatrix > 0 ? kv / vMatrix : ev(CHOI_OKOS.k.ice, T_C);
  const vIce = vIceRaw / (vIceRaw + vMatrix);
  // Ice continuous, the rest dispersed: at the onset of freezing (v_ice → 0) this tends to the matrix value.
  return vIce > 0 ? maxwellEucken(ev(CHOI_OKOS.k.ice, T_C), kMatrix, 1 - vIce) : kMatrix;
}

/** Sensible specific heat (J/(kg·K)) of the mixture at T with ice fraction xIce: c = Σ xᵢ cᵢ [ashraeFoodProps]. */
export function sensibleSpecificHeat(c: Composition, xIce: number, T_C: number): number {
  let cp = (c.water - xIce) * ev(CHOI_OKOS.c.water, T_C) + xIce * ev(CHOI_OKOS.c.ice, T_C);
  for (const s of SOLIDS) cp += c[s] * ev(CHOI_OKOS.c[s], T_C);
  return cp * 1000;
}

export interface FoodInput {
  composition: Composition;
  initialFreezing_C?: number | null;
  overrides?: PropertyOverrides;
  /** Mass and volume of the item: if mass/volume is well below the solid density, the item is porous (loose leaves, whipped foods). */
  mass_kg?: number;
  volume_m3?: number;
  /** Whether Pham's meat formula suits this product when no freezing point is given. */
  isMeatLike?: boolean;
  /** A hollow item (shell around a cavity): its volume is the shell's, so a mismatch is a size error, not air. */
  hollow?: boolean;
}

/** Everything the solvers need, tabulated for speed. Temperatures in °C; H relative to −40 °C. */
export interface FoodThermal {
  Tf_C: number;
  rho_kg_m3: number;
  latent_J_kg: number;
  porosity: number;
  warnings: string[];
  /** Specific enthalpy, J/kg, relative to −40 °C. */
  H_J_kg(T_C: number): number;
  /** Apparent specific heat dH/dT, J/(kg·K), consistent with H_J_kg (slope of the same table). */
  c_J_kgK(T_C: number): number;
  /** Conductivity, W/(m·K). */
  k_W_mK(T_C: number): number;
  /** The table H, c and k are read from (the solvers' fused look-up). */
  table: PropertyTable;
  /** Ice mass fraction. */
  ice(T_C: number): number;
  /** The analytic apparent specific heat whose integral the enthalpy table holds (for checks). */
  cAnalytic_J_kgK(T_C: number): number;
  /** Sensible specific heat without latent heat, J/(kg·K) (overrides applied): what Plank and Pham need. */
  cSensible_J_kgK(T_C: number): number;
  /** Latent heat still held as ice at T, J/kg: what the enthalpy model releases warming from T to above t_f. */
  latentHeld_J_kg(T_C: number): number;
}

const T_MIN = -100;
const T_MAX = 200;
const DT = 0.1;
const N = Math.round((T_MAX - T_MIN) / DT) + 1;
export const H_REFERENCE_C = -40;

const CACHE = new Map<string, FoodThermal>();
const CACHE_SIZE = 64;

/** Properties of a food, tabulated once per distinct input (the tables are reused across runs). */
export function foodThermal(input: FoodInput): FoodThermal {
  const key = JSON.stringify([input.composition, input.initialFreezing_C ?? null, input.overrides ?? {}, input.mass_kg ?? null, input.volume_m3 ?? null, input.isMeatLike ?? null, input.hollow ?? false]);
  const hit = CACHE.get(key);
  if (hit) return { ...hit, warnings: [...hit.warnings] };
  const made = buildFoodThermal(input);
  if (CACHE.size >= CACHE_SIZE) CACHE.delete(CACHE.keys().next().value as string);
  CACHE.set(key, made);
  return { ...made, warnings: [...made.warnings] };
}

function buildFoodThermal(input: FoodInput): FoodThermal {
  const c = input.composition;
  validateComposition(c);
  const o = input.overrides ?? {};
  const warnings: string[] = [];
  let Tf = input.initialFreezing_C ?? null;
  if (Tf === null || Tf === undefined) {
    const est = initialFreezingEstimate(c);
    Tf = est.Tf_C;
    warnings.push(
      `Initial freezing point not given; estimated ${Tf.toFixed(1)} °C from composition by Pham (1996)${input.isMeatLike === false ? ", a formula fitted to meats: give the measured value if you have it" : ""}`,
      ...est.warnings,
    );
  } else requireTemperature("initialFreezing_C", Tf);
  if (Tf > 0) Tf = 0;
  if (Tf >= SHARP_FRONT_TF_C) {
    warnings.push(`Initial freezing point ${Tf.toFixed(2)} °C: treated as a food without solutes, which melts at a sharp front (within ${SHARP_MELT_BAND_K} K below it)`);
  }
  for (const [k, v] of Object.entries(o)) if (v !== null && v !== undefined) requirePositive(`overrides.${k}`, v as number);

  const freezable = Math.max(0, c.water - BOUND_WATER_PER_PROTEIN * c.protein);
  const latentModel = L0_J_KG * c.water;
  const latent = o.latentHeat_J_kg ?? latentModel;
  const latentScale = latentModel > 0 ? latent / latentModel : 0;

  // Density: composition, or override; porous if the override or the item's own mass/volume is well below it.
  const rhoSolid = mixtureDensity(c, 0, Math.max(Tf, 0) + 1);
  let rho = o.density_kg_m3 ?? rhoSolid;
  let porosity = 0;
  if (o.density_kg_m3) {
    if (input.mass_kg && input.volume_m3) {
      const rhoBulk = input.mass_kg / input.volume_m3;
      if (Math.abs(rhoBulk / rho - 1) > 0.15) {
        warnings.push(`Mass ÷ volume is ${rhoBulk.toFixed(0)} kg/m³ but the density override is ${rho.toFixed(0)} kg/m³; the override is used`);
      }
    }
    if (rho < 0.9 * rhoSolid) {
      // The same air as without the override: the override sets how much of the item is air.
      porosity = 1 - rho / rhoSolid;
      warnings.push(
        `The density override (${rho.toFixed(0)} kg/m³) is below the composition density (${rhoSolid.toFixed(0)} kg/m³): treated as porous with ${(porosity * 100).toFixed(0)} % air, conductivity by Maxwell–Eucken with air pores. Airy items are the least certain case`,
      );
    }
  } else if (input.mass_kg && input.volume_m3) {
    const rhoBulk = input.mass_kg / input.volume_m3;
    if (input.hollow && Math.abs(rhoBulk / rhoSolid - 1) > 0.1) {
      warnings.push(
        `The hollow item's shell holds ${((rhoSolid * input.volume_m3)).toFixed(2)} kg at the composition density (${rhoSolid.toFixed(0)} kg/m³), not the stated ${input.mass_kg} kg: check the outer size and the wall thickness. The stated mass is used`,
      );
      rho = rhoBulk;
    } else if (input.hollow) {
      // Consistent within 10 %: keep the composition density.
    } else if (rhoBulk < 0.9 * rhoSolid) {
      porosity = 1 - rhoBulk / rhoSolid;
      rho = rhoBulk;
      warnings.push(
        `Mass ÷ volume (${rhoBulk.toFixed(0)} kg/m³) is below the composition density (${rhoSolid.toFixed(0)} kg/m³): treated as porous with ${(porosity * 100).toFixed(0)} % air, conductivity by Maxwell–Eucken with air pores. Loose, airy items are the least certain case`,
      );
    } else if (rhoBulk > 1.1 * rhoSolid) {
      warnings.push(`Mass ÷ volume (${rhoBulk.toFixed(0)} kg/m³) exceeds the composition density (${rhoSolid.toFixed(0)} kg/m³); check the dimensions. The stated mass is used`);
      rho = rhoBulk;
    }
  }

  const cSens = (T: number): number => {
    const frozen = T < Tf!;
    const x = iceFraction(c, Tf!, T);
    return frozen ? o.cpFrozen_J_kgK ?? sensibleSpecificHeat(c, x, T) : o.cpUnfrozen_J_kgK ?? sensibleSpecificHeat(c, 0, T);
  };
  const cAnalytic = (T: number): number => cSens(T) - latentScale * L0_J_KG * iceFractionSlope(c, Tf!, T);
  const latentHeld = (T: number): number => latentScale * L0_J_KG * iceFraction(c, Tf!, T);
  const xIceRef = iceFraction(c, Tf, -40) || 1;
  const kAt = (T: number): number => {
    const x = iceFraction(c, Tf!, T);
    let k: number;
    if (T >= Tf!) k = o.kUnfrozen_W_mK ?? mixtureConductivity(c, 0, T);
    else if (o.kFrozen_W_mK) {
      const kU = o.kUnfrozen_W_mK ?? mixtureConductivity(c, 0, Tf!);
      k = kU + (o.kFrozen_W_mK - kU) * Math.min(1, x / xIceRef);
    } else k = o.kUnfrozen_W_mK ? o.kUnfrozen_W_mK * (mixtureConductivity(c, x, T) / mixtureConductivity(c, 0, Tf!)) : mixtureConductivity(c, x, T);
    return porosity > 0 ? maxwellEucken(k, AIR_K_W_MK, porosity) : k;
  };

  // Tabulate H: the sensible part by integrating c_sens cell by cell (Simpson, split at Tf; the steep
  // stretch just below Tf gets four sub-intervals), minus the latent heat still held as ice, exactly.
  const H = new Float64Array(N);
  const K = new Float64Array(N);
  for (let i = 0; i < N; i++) K[i] = kAt(T_MIN + i * DT);
  const simpson = (a: number, b: number, ca: number, cb: number) => ((b - a) / 6) * (ca + 4 * cSens((a + b) / 2) + cb);
  let cPrev = cSens(T_MIN);
  let Hs = 0;
  H[0] = -latentHeld(T_MIN);
  for (let i = 1; i < N; i++) {
    const a = T_MIN + (i - 1) * DT;
    const b = T_MIN + i * DT;
    const cb = cSens(b);
    let dH: number;
    if (a < Tf && b > Tf) dH = simpson(a, Tf - 1e-9, cPrev, cSens(Tf - 1e-9)) + simpson(Tf, b, cSens(Tf), cb);
    else if (a > Tf - 5 && a < Tf) {
      dH = 0;
      const q = DT / 4;
      for (let j = 0; j < 4; j++) dH += simpson(a + j * q, a + (j + 1) * q, cSens(a + j * q), cSens(a + (j + 1) * q));
    } else dH = simpson(a, b, cPrev, cb);
    Hs += dH;
    H[i] = Hs - latentHeld(b);
    cPrev = cb;
  }
  const iRef = Math.round((H_REFERENCE_C - T_MIN) / DT);
  const Href = H[iRef];
  for (let i = 0; i < N; i++) H[i] -= Href;

  // One table for H and k, shared with packs; the solvers read it with one fused look-up.
  const table = makeTable(T_MIN, DT, H, K);
  return {
    Tf_C: Tf,
    rho_kg_m3: rho,
    latent_J_kg: latent,
    porosity,
    warnings,
    table,
    H_J_kg: (T) => tableH(table, T),
    c_J_kgK: (T) => tableC(table, T),
    k_W_mK: (T) => tableK(table, T),
    ice: (T) => iceFraction(c, Tf!, T) * (freezable > 0 ? 1 : 0),
    cAnalytic_J_kgK: cAnalytic,
    cSensible_J_kgK: cSens,
    latentHeld_J_kg: latentHeld,
  };
}

/** Warns when a simulated temperature range left the Choi–Okos fits' range. */
export function warnPropertyRange(warnings: string[], Tlow_C: number, Thigh_C: number): void {
  warnRange(warnings, "Lowest food temperature", Tlow_C, CHOI_OKOS_RANGE_C[0], CHOI_OKOS_RANGE_C[1], "°C", "the Choi–Okos (1986) property fits");
  warnRange(warnings, "Highest food temperature", Thigh_C, CHOI_OKOS_RANGE_C[0], CHOI_OKOS_RANGE_C[1], "°C", "the Choi–Okos (1986) property fits");
}

/** A simple material with constant properties and an optional sharp phase change smeared over `mushy_K` (for packs, Neumann checks). */
export function simpleMaterial(p: {
  rho_kg_m3: number;
  cSolid_J_kgK: number;
  cLiquid_J_kgK: number;
  kSolid_W_mK: number;
  kLiquid_W_mK: number;
  melt_C: number;
  latent_J_kg: number;
  mushy_K?: number;
}): Pick<FoodThermal, "rho_kg_m3" | "H_J_kg" | "c_J_kgK" | "k_W_mK" | "table"> & { Tf_C: number } {
  const w = p.mushy_K ?? 0.1;
  const T1 = p.melt_C - w / 2;
  const T2 = p.melt_C + w / 2;
  const Hsolid = (T: number) => p.cSolid_J_kgK * (T - T1);
  const H2 = Hsolid(T1) + ((p.cSolid_J_kgK + p.cLiquid_J_kgK) / 2) * w + p.latent_J_kg;
  const Hof = (T: number) => {
    if (T <= T1) return Hsolid(T);
    if (T >= T2) return H2 + p.cLiquid_J_kgK * (T - T2);
    const f = (T - T1) / w;
    return f * (p.latent_J_kg + ((p.cSolid_J_kgK + p.cLiquid_J_kgK) / 2) * w);
  };
  const kOf = (T: number) => {
    if (T <= T1) return p.kSolid_W_mK;
    if (T >= T2) return p.kLiquid_W_mK;
    return p.kSolid_W_mK + ((T - T1) / w) * (p.kLiquid_W_mK - p.kSolid_W_mK);
  };
  // The same table form as a food's, with the band's edges on grid points so H and k are exact.
  const cells = Math.max(1, Math.ceil(w / SIMPLE_DT_K - 1e-9));
  const dT = w / cells;
  const below = Math.max(1, Math.ceil((T1 - T_MIN) / dT) + 1);
  const above = Math.max(1, Math.ceil((T_MAX - T2) / dT) + 1);
  const n = below + cells + above + 1;
  const Ht = new Float64Array(n);
  const Kt = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const i = j - below;
    const T = i <= 0 ? T1 + i * dT : i >= cells ? T2 + (i - cells) * dT : T1 + i * dT;
    Ht[j] = Hof(T);
    Kt[j] = kOf(T);
  }
  const table = makeTable(T1 - below * dT, dT, Ht, Kt);
  return {
    Tf_C: p.melt_C,
    rho_kg_m3: p.rho_kg_m3,
    table,
    H_J_kg: (T) => tableH(table, T),
    c_J_kgK: (T) => tableC(table, T),
    k_W_mK: (T) => tableK(table, T),
  };
}

/** Grid spacing of a simple material's table (at most; the melting band is a whole number of cells), K. */
const SIMPLE_DT_K = 0.1;

/** Names and categories for which Pham's meat formula for the initial freezing point suits (meat, poultry, fish). */
export const MEAT_LIKE = /meat|poultry|fish|beef|pork|lamb|chicken|turkey|cod|salmon/i;

/**
 * A product template's thermal properties: its composition and overrides, its bulk density from the
 * template's mass over its shape's volume (porosity), and whether Pham's meat formula suits it. The one
 * place a planner turns a product into a `FoodThermal` (hold, thaw, warm-up, cooling and calibration).
 */
export function productThermal(
  p: Pick<Product, "name" | "category" | "composition" | "initialFreezing_C" | "density_kg_m3" | "cpUnfrozen_J_kgK" | "cpFrozen_J_kgK" | "kUnfrozen_W_mK" | "kFrozen_W_mK" | "latentHeat_J_kg" | "mass_kg">,
  shape: Pick<ItemShape, "volume_m3" | "hollow">,
): FoodThermal {
  return foodThermal({
    composition: p.composition,
    initialFreezing_C: p.initialFreezing_C,
    overrides: {
      density_kg_m3: p.density_kg_m3,
      cpUnfrozen_J_kgK: p.cpUnfrozen_J_kgK,
      cpFrozen_J_kgK: p.cpFrozen_J_kgK,
      kUnfrozen_W_mK: p.kUnfrozen_W_mK,
      kFrozen_W_mK: p.kFrozen_W_mK,
      latentHeat_J_kg: p.latentHeat_J_kg,
    },
    mass_kg: p.mass_kg,
    volume_m3: shape.volume_m3,
    isMeatLike: MEAT_LIKE.test(p.category + " " + p.name),
    hollow: shape.hollow !== null,
  });
}
