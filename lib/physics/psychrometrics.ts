/**
 * Moist air and the evaporation of water from a wet food surface. SI units, temperatures in °C.
 *
 * - Saturation pressure of water vapour: Hyland & Wexler (1983) as given by ASHRAE, over ice from
 *   −100 to 0 °C and over liquid water from 0 to 200 °C [hylandWexler1983].
 * - Latent heat of vaporisation: the straight line h_fg = 2501 − 2.361·T kJ/kg (T in °C), within
 *   0.4 % of the steam tables from 0 to 100 °C [steamTables].
 * - Diffusion of water vapour in air: D = 0.26×10⁻⁴ m²/s at 298 K, scaled with T^(3/2) [incroperaDiffusion].
 * - Evaporation by the heat and mass transfer analogy (Chilton–Colburn): h_m = h/(ρ c_p Le^(2/3)),
 *   n'' = h_m (ρ_v,s − ρ_v,∞), the vapour densities from the ideal gas law [chiltonColburn]. This is the
 *   low mass-transfer-rate form; at a surface near boiling, where the vapour fraction is large, it
 *   underestimates the evaporation (Stefan flow), which errs on the slow side for cooling.
 */
import { airProps } from "./surfaces";
import { KELVIN_OFFSET, requireFraction, requireNonNegative, requireTemperature, warnRange } from "./validation";

/** Molar gas constant, J/(mol·K) (CODATA 2018, exact) [stefanBoltzmann]. */
const R_J_MOLK = 8.314462618;
/** Molar mass of water, kg/mol (IUPAC standard atomic weights; from memory). */
const M_WATER_KG_MOL = 0.018015;
/** Specific gas constant of water vapour, ≈ 461.5 J/(kg·K). */
export const R_VAPOUR_J_KGK = R_J_MOLK / M_WATER_KG_MOL;

const HW_ICE = [-5.6745359e3, 6.3925247, -9.677843e-3, 6.2215701e-7, 2.0747825e-9, -9.484024e-13, 4.1635019] as const;
const HW_WATER = [-5.8002206e3, 1.3914993, -4.8640239e-2, 4.1764768e-5, -1.4452093e-8, 6.5459673] as const;

/**
 * Saturation pressure of water vapour, Pa: over ice below 0 °C, over liquid water at or above
 * [hylandWexler1983]. Valid −100…200 °C; outside, the formula's value with a warning.
 */
export function saturationPressure_Pa(T_C: number, warnings: string[] = []): number {
  requireTemperature("temperature", T_C);
  warnRange(warnings, "Temperature for the saturation pressure", T_C, -100, 200, "°C", "the Hyland–Wexler formulation");
  const T = T_C + KELVIN_OFFSET;
  if (T_C < 0) {
    const c = HW_ICE;
    return Math.exp(c[0] / T + c[1] + c[2] * T + c[3] * T ** 2 + c[4] * T ** 3 + c[5] * T ** 4 + c[6] * Math.log(T));
  }
  const c = HW_WATER;
  return Math.exp(c[0] / T + c[1] + c[2] * T + c[3] * T ** 2 + c[4] * T ** 3 + c[5] * Math.log(T));
}

/** Latent heat of vaporisation of water, J/kg: 2501 − 2.361 T kJ/kg, within 0.4 % of the steam tables 0…100 °C [steamTables]. */
export function latentVaporisation_J_kg(T_C: number): number {
  return (2501 - 2.361 * T_C) * 1000;
}

/** Binary diffusion coefficient of water vapour in air at 1 atm, m²/s: 0.26×10⁻⁴ (T/298 K)^(3/2) [incroperaDiffusion]. */
export function vapourDiffusivity_m2_s(T_C: number): number {
  return 0.26e-4 * Math.pow((T_C + KELVIN_OFFSET) / 298, 1.5);
}

/** Water-vapour density, kg/m³, at partial pressure p and temperature T (ideal gas). */
export function vapourDensity_kg_m3(p_Pa: number, T_C: number): number {
  return p_Pa / (R_VAPOUR_J_KGK * (T_C + KELVIN_OFFSET));
}

export interface Evaporation {
  /** Mass of water leaving the surface, kg/(m²·s) (negative: condensation). */
  flux_kg_m2s: number;
  /** Heat the surface loses by it, W/m². */
  heat_W_m2: number;
  /** d heat / d Ts, W/(m²·K). */
  slope_W_m2K: number;
  /** Lewis number and mass-transfer coefficient used. */
  Le: number;
  hm_m_s: number;
}

/**
 * Evaporation from a wet surface at Ts into air at T∞ with relative humidity φ, given the convective
 * heat-transfer coefficient h of that surface: the Chilton–Colburn analogy [chiltonColburn] with the
 * surface vapour pressure a_w·p_sat(Ts) [hylandWexler1983] and the latent heat at Ts [steamTables].
 * Air properties at the film temperature. Range of the analogy: 0.6 < Sc < 3000 (here Sc ≈ 0.6).
 */
export function evaporation(h_W_m2K: number, Ts_C: number, air_C: number, relativeHumidity: number, waterActivity = 1, warnings: string[] = []): Evaporation {
  requireNonNegative("convective coefficient", h_W_m2K);
  requireFraction("relative humidity", relativeHumidity);
  requireFraction("water activity", waterActivity);
  const film = (Ts_C + air_C) / 2;
  const air = airProps(film, warnings);
  const Le = air.alpha_m2_s / vapourDiffusivity_m2_s(film);
  const hm = h_W_m2K / (air.rho_kg_m3 * air.cp_J_kgK * Math.pow(Le, 2 / 3));
  const rhoInf = vapourDensity_kg_m3(relativeHumidity * saturationPressure_Pa(air_C, warnings), air_C);
  const heat = (T: number) => hm * (vapourDensity_kg_m3(waterActivity * saturationPressure_Pa(T), T) - rhoInf) * latentVaporisation_J_kg(T);
  const flux = hm * (vapourDensity_kg_m3(waterActivity * saturationPressure_Pa(Ts_C, warnings), Ts_C) - rhoInf);
  const d = 0.01;
  return { flux_kg_m2s: flux, heat_W_m2: flux * latentVaporisation_J_kg(Ts_C), slope_W_m2K: (heat(Ts_C + d) - heat(Ts_C - d)) / (2 * d), Le, hm_m_s: hm };
}
