/**
 * Heat transfer at surfaces: fluid properties, natural and forced convection correlations,
 * linearised radiation and the sol-air temperature. SI units; temperatures in °C unless named _K.
 * Outside a correlation's published range the value is still returned, with a warning.
 */
import { KELVIN_OFFSET, requirePositive, requireTemperature, requireFraction, requireNonNegative, warnRange } from "./validation";

/** Stefan–Boltzmann constant, W/(m²·K⁴) [stefanBoltzmann]. */
export const SIGMA_W_M2K4 = 5.670374419e-8;
/** Standard gravity, m/s² [gravity]. */
export const G_M_S2 = 9.80665;
/** Standard atmosphere, Pa (ISO 2533). */
export const P_ATM_PA = 101_325;
/** Specific gas constant of dry air, J/(kg·K) (ISO 2533, from memory). */
export const R_AIR_J_KGK = 287.05;
/** Specific heat of air, ≈ 1006 J/(kg·K) near room temperature (Incropera 6th ed., Table A.4, 1007 at 300 K; from memory). */
export const CP_AIR_J_KGK = 1006;

export interface FluidProps {
  rho_kg_m3: number;
  mu_Pa_s: number;
  k_W_mK: number;
  cp_J_kgK: number;
  beta_1_K: number;
  nu_m2_s: number;
  alpha_m2_s: number;
  Pr: number;
}

export type Fluid = "air" | "water";

function finish(rho: number, mu: number, k: number, cp: number, beta: number): FluidProps {
  const nu = mu / rho;
  const alpha = k / (rho * cp);
  return { rho_kg_m3: rho, mu_Pa_s: mu, k_W_mK: k, cp_J_kgK: cp, beta_1_K: beta, nu_m2_s: nu, alpha_m2_s: alpha, Pr: nu / alpha };
}

/**
 * Dry air at 1 atm. ρ ideal gas; μ and k by Sutherland's laws (μ0 = 1.716e-5 Pa·s, S = 110.4 K;
 * k0 = 0.0241 W/(m·K), S = 194 K, T0 = 273.15 K) [sutherland]; β = 1/T. Range −50…150 °C.
 */
export function airProps(T_C: number, warnings: string[] = []): FluidProps {
  requireTemperature("air temperature", T_C);
  warnRange(warnings, "Air film temperature", T_C, -50, 150, "°C", "the air property fits (Sutherland)");
  const T = T_C + KELVIN_OFFSET;
  const T0 = 273.15;
  const mu = 1.716e-5 * Math.pow(T / T0, 1.5) * ((T0 + 110.4) / (T + 110.4));
  const k = 0.0241 * Math.pow(T / T0, 1.5) * ((T0 + 194) / (T + 194));
  return finish(P_ATM_PA / (R_AIR_J_KGK * T), mu, k, CP_AIR_J_KGK, 1 / T);
}

/** Kell (1975) density of air-free water at 1 atm, kg/m³, t in °C [kellWater]. */
export function waterDensity(t_C: number): number {
  const t = t_C;
  return (
    (999.83952 + 16.945176 * t - 7.9870401e-3 * t ** 2 - 46.170461e-6 * t ** 3 + 105.56302e-9 * t ** 4 - 280.54253e-12 * t ** 5) /
    (1 + 16.87985e-3 * t)
  );
}

/**
 * Liquid water at 1 atm, 0…100 °C. ρ by Kell (1975) [kellWater], β = −(1/ρ)dρ/dT from it;
 * μ by the Vogel fit [vogelWater]; k by Ramires et al. (1995) [ramiresWater];
 * c from Choi & Okos (1986) [choiOkos1986].
 */
export function waterProps(T_C: number, warnings: string[] = []): FluidProps {
  requireTemperature("water temperature", T_C);
  warnRange(warnings, "Water film temperature", T_C, 0, 100, "°C", "the water property fits");
  const t = Math.min(100, Math.max(0, T_C));
  const T = t + KELVIN_OFFSET;
  const rho = waterDensity(t);
  const d = 0.01;
  const beta = -(waterDensity(t + d) - waterDensity(t - d)) / (2 * d) / rho;
  const mu = 2.414e-5 * Math.pow(10, 247.8 / (T - 140));
  const Ts = T / 298.15;
  const k = 0.6065 * (-1.48445 + 4.12292 * Ts - 1.63866 * Ts * Ts);
  const cp = (4.1289 - 9.0864e-5 * t + 5.4731e-6 * t * t) * 1000;
  return finish(rho, mu, k, cp, beta);
}

export function fluidProps(fluid: Fluid, T_C: number, warnings: string[] = []): FluidProps {
  return fluid === "air" ? airProps(T_C, warnings) : waterProps(T_C, warnings);
}

export interface ConvectionResult {
  h_W_m2K: number;
  Nu: number;
  /** Rayleigh number (natural) or Reynolds number (forced). */
  Ra?: number;
  Re?: number;
  correlation: string;
  source: string;
}

/** Rayleigh number Ra_L = gβ|ΔT|L³/(να), properties at the film temperature. */
export function rayleigh(p: FluidProps, dT_K: number, L_m: number): number {
  return (G_M_S2 * Math.abs(p.beta_1_K) * Math.abs(dT_K) * L_m ** 3) / (p.nu_m2_s * p.alpha_m2_s);
}

function natural(fluid: Fluid, Ts_C: number, Tinf_C: number, L_m: number, warnings: string[]) {
  requireTemperature("surface temperature", Ts_C);
  requireTemperature("fluid temperature", Tinf_C);
  requirePositive("length", L_m);
  const p = fluidProps(fluid, (Ts_C + Tinf_C) / 2, warnings);
  const Ra = rayleigh(p, Ts_C - Tinf_C, L_m);
  return { p, Ra };
}

/**
 * Vertical plate of height L, all Ra: Nu = {0.825 + 0.387 Ra^(1/6) / [1 + (0.492/Pr)^(9/16)]^(8/27)}²
 * [churchillChu1975, incroperaFreeConv Eq. 9.26].
 */
export function naturalVerticalPlate(fluid: Fluid, Ts_C: number, Tinf_C: number, L_m: number, warnings: string[] = []): ConvectionResult {
  const { p, Ra } = natural(fluid, Ts_C, Tinf_C, L_m, warnings);
  warnRange(warnings, "Ra (vertical plate)", Ra, 0.1, 1e12, "", "Churchill–Chu");
  const Nu = (0.825 + (0.387 * Math.pow(Ra, 1 / 6)) / Math.pow(1 + Math.pow(0.492 / p.Pr, 9 / 16), 8 / 27)) ** 2;
  return { h_W_m2K: (Nu * p.k_W_mK) / L_m, Nu, Ra, correlation: "Churchill–Chu, vertical plate", source: "churchillChu1975" };
}

/**
 * Horizontal plate, characteristic length L = A/P [incroperaFreeConv Eqs. 9.30–9.32]:
 * upper face of a hot plate or lower face of a cold one: Nu = 0.54 Ra^(1/4) (10⁴–10⁷), 0.15 Ra^(1/3) (10⁷–10¹¹);
 * lower face of a hot plate or upper face of a cold one: Nu = 0.52 Ra^(1/5) (10⁴–10⁹).
 */
export function naturalHorizontalPlate(
  fluid: Fluid,
  Ts_C: number,
  Tinf_C: number,
  Lc_m: number,
  facing: "up" | "down",
  warnings: string[] = [],
): ConvectionResult {
  const { p, Ra } = natural(fluid, Ts_C, Tinf_C, Lc_m, warnings);
  const hot = Ts_C >= Tinf_C;
  const unstable = (hot && facing === "up") || (!hot && facing === "down");
  let Nu: number;
  let correlation: string;
  if (unstable) {
    if (Ra <= 1e7) {
      warnRange(warnings, "Ra (horizontal plate, rising flow)", Ra, 1e4, 1e7, "", "Nu = 0.54 Ra^¼");
      Nu = 0.54 * Math.pow(Ra, 0.25);
    } else {
      warnRange(warnings, "Ra (horizontal plate, rising flow)", Ra, 1e7, 1e11, "", "Nu = 0.15 Ra^⅓");
      Nu = 0.15 * Math.pow(Ra, 1 / 3);
    }
    correlation = "horizontal plate, unstable side";
  } else {
    warnRange(warnings, "Ra (horizontal plate, stable side)", Ra, 1e4, 1e9, "", "Nu = 0.52 Ra^⅕");
    Nu = 0.52 * Math.pow(Ra, 0.2);
    correlation = "horizontal plate, stable side";
  }
  // Below the range the power laws fall to zero; keep conduction-like floor Nu ≥ 1 so h never vanishes.
  Nu = Math.max(Nu, 1);
  return { h_W_m2K: (Nu * p.k_W_mK) / Lc_m, Nu, Ra, correlation, source: "incroperaFreeConv" };
}

/** Horizontal cylinder of diameter D: Nu = {0.60 + 0.387 Ra^(1/6)/[1 + (0.559/Pr)^(9/16)]^(8/27)}², Ra ≤ 10¹² [churchillChu1975, Eq. 9.34]. */
export function naturalHorizontalCylinder(fluid: Fluid, Ts_C: number, Tinf_C: number, D_m: number, warnings: string[] = []): ConvectionResult {
  const { p, Ra } = natural(fluid, Ts_C, Tinf_C, D_m, warnings);
  warnRange(warnings, "Ra (horizontal cylinder)", Ra, 1e-5, 1e12, "", "Churchill–Chu, cylinder");
  const Nu = (0.6 + (0.387 * Math.pow(Ra, 1 / 6)) / Math.pow(1 + Math.pow(0.559 / p.Pr, 9 / 16), 8 / 27)) ** 2;
  return { h_W_m2K: (Nu * p.k_W_mK) / D_m, Nu, Ra, correlation: "Churchill–Chu, horizontal cylinder", source: "churchillChu1975" };
}

/** Sphere of diameter D: Nu = 2 + 0.589 Ra^(1/4)/[1 + (0.469/Pr)^(9/16)]^(4/9), Ra ≤ 10¹¹, Pr ≥ 0.7 [churchill1983, Eq. 9.35]. */
export function naturalSphere(fluid: Fluid, Ts_C: number, Tinf_C: number, D_m: number, warnings: string[] = []): ConvectionResult {
  const { p, Ra } = natural(fluid, Ts_C, Tinf_C, D_m, warnings);
  warnRange(warnings, "Ra (sphere)", Ra, 0, 1e11, "", "Churchill, sphere");
  warnRange(warnings, "Pr (sphere)", p.Pr, 0.7, 1e5, "", "Churchill, sphere");
  const Nu = 2 + (0.589 * Math.pow(Ra, 0.25)) / Math.pow(1 + Math.pow(0.469 / p.Pr, 9 / 16), 4 / 9);
  return { h_W_m2K: (Nu * p.k_W_mK) / D_m, Nu, Ra, correlation: "Churchill, sphere", source: "churchill1983" };
}

/**
 * Flow parallel to a flat plate of length L [incroperaForced]: laminar Nu = 0.664 Re^½ Pr^⅓ (Re ≤ 5×10⁵);
 * mixed laminar–turbulent Nu = (0.037 Re^0.8 − 871) Pr^⅓ (5×10⁵ < Re ≤ 10⁸, 0.6 ≤ Pr ≤ 60).
 */
export function forcedFlatPlate(fluid: Fluid, Ts_C: number, Tinf_C: number, L_m: number, U_m_s: number, warnings: string[] = []): ConvectionResult {
  requirePositive("length", L_m);
  requireNonNegative("flow speed", U_m_s);
  const p = fluidProps(fluid, (Ts_C + Tinf_C) / 2, warnings);
  const Re = (U_m_s * L_m) / p.nu_m2_s;
  warnRange(warnings, "Pr (flat plate)", p.Pr, 0.6, 60, "", "flat-plate correlations");
  warnRange(warnings, "Re (flat plate)", Re, 0, 1e8, "", "flat-plate correlations");
  const lam = 0.664 * Math.sqrt(Re) * Math.cbrt(p.Pr);
  const Nu = Re <= 5e5 ? lam : Math.max(lam, (0.037 * Math.pow(Re, 0.8) - 871) * Math.cbrt(p.Pr));
  return { h_W_m2K: (Nu * p.k_W_mK) / L_m, Nu, Re, correlation: Re <= 5e5 ? "flat plate, laminar" : "flat plate, mixed laminar–turbulent", source: "incroperaForced" };
}

/** Cylinder in cross-flow, Churchill–Bernstein: Nu = 0.3 + 0.62Re^½Pr^⅓/[1+(0.4/Pr)^⅔]^¼ [1+(Re/282000)^⅝]^⅘, Re·Pr > 0.2 [incroperaForced]. */
export function forcedCylinder(fluid: Fluid, Ts_C: number, Tinf_C: number, D_m: number, U_m_s: number, warnings: string[] = []): ConvectionResult {
  requirePositive("diameter", D_m);
  requireNonNegative("flow speed", U_m_s);
  const p = fluidProps(fluid, (Ts_C + Tinf_C) / 2, warnings);
  const Re = (U_m_s * D_m) / p.nu_m2_s;
  warnRange(warnings, "Re·Pr (cylinder)", Re * p.Pr, 0.2, 1e9, "", "Churchill–Bernstein");
  const Nu =
    0.3 +
    ((0.62 * Math.sqrt(Re) * Math.cbrt(p.Pr)) / Math.pow(1 + Math.pow(0.4 / p.Pr, 2 / 3), 0.25)) * Math.pow(1 + Math.pow(Re / 282000, 5 / 8), 4 / 5);
  return { h_W_m2K: (Nu * p.k_W_mK) / D_m, Nu, Re, correlation: "Churchill–Bernstein, cylinder in cross-flow", source: "incroperaForced" };
}

/** Sphere, Whitaker: Nu = 2 + (0.4Re^½ + 0.06Re^⅔)Pr^0.4, 3.5 ≤ Re ≤ 7.6×10⁴, 0.71 ≤ Pr ≤ 380 (viscosity ratio taken as 1) [incroperaForced]. */
export function forcedSphere(fluid: Fluid, Ts_C: number, Tinf_C: number, D_m: number, U_m_s: number, warnings: string[] = []): ConvectionResult {
  requirePositive("diameter", D_m);
  requireNonNegative("flow speed", U_m_s);
  const p = fluidProps(fluid, (Ts_C + Tinf_C) / 2, warnings);
  const Re = (U_m_s * D_m) / p.nu_m2_s;
  warnRange(warnings, "Re (sphere)", Re, 3.5, 7.6e4, "", "Whitaker");
  const Nu = 2 + (0.4 * Math.sqrt(Re) + 0.06 * Math.pow(Re, 2 / 3)) * Math.pow(p.Pr, 0.4);
  return { h_W_m2K: (Nu * p.k_W_mK) / D_m, Nu, Re, correlation: "Whitaker, sphere", source: "incroperaForced" };
}

/** Mixed convection: Nu = (Nu_F³ + Nu_N³)^(1/3), the assisting/transverse form [incroperaMixed]. Applied to h at equal length scale. */
export function mixedConvection(h_forced: number, h_natural: number): number {
  return Math.cbrt(h_forced ** 3 + h_natural ** 3);
}

/** Linearised radiation coefficient h_r = εσ(Ts + Tsur)(Ts² + Tsur²), kelvin inside [incroperaRadiation]. */
export function radiationCoefficient(emissivity: number, Ts_C: number, Tsur_C: number): number {
  requireFraction("emissivity", emissivity);
  requireTemperature("surface temperature", Ts_C);
  requireTemperature("surroundings temperature", Tsur_C);
  const a = Ts_C + KELVIN_OFFSET;
  const b = Tsur_C + KELVIN_OFFSET;
  return emissivity * SIGMA_W_M2K4 * (a + b) * (a * a + b * b);
}

/** Long-wave sky correction ΔR for a horizontal surface facing up, 63 W/m² [ashraeSolAir]. */
export const SKY_DELTA_R_W_M2 = 63;

/**
 * Sol-air temperature t_e = t_o + α I / h_o − ε ΔR / h_o, with ΔR = 63 W/m² for an upward-facing
 * horizontal surface and 0 for vertical ones [ashraeSolAir]. h_o is the combined outer coefficient.
 */
export function solAirTemperature(p: { airTemp_C: number; solarAbsorptivity: number; irradiance_W_m2: number; hOuter_W_m2K: number; emissivity: number; facingSky: boolean }): number {
  requireTemperature("air temperature", p.airTemp_C);
  requireFraction("solar absorptivity", p.solarAbsorptivity);
  requireNonNegative("irradiance", p.irradiance_W_m2);
  requirePositive("outer coefficient", p.hOuter_W_m2K);
  const dR = p.facingSky ? SKY_DELTA_R_W_M2 : 0;
  return p.airTemp_C + (p.solarAbsorptivity * p.irradiance_W_m2) / p.hOuter_W_m2K - (p.emissivity * dR) / p.hOuter_W_m2K;
}

/** A still-air or moving-fluid surrounding of an item. */
export interface Surroundings {
  fluid: Fluid;
  T_C: number;
  speed_m_s: number;
  /** Radiant surroundings temperature; defaults to the fluid temperature. Ignored in water. */
  radiant_C?: number;
}

export type ItemGeometry =
  | { shape: "slab" | "block"; height_m: number; width_m: number; length_m: number }
  | { shape: "cylinder"; diameter_m: number; length_m: number; upright: boolean }
  | { shape: "sphere"; diameter_m: number };

export interface CombinedCoefficient {
  h_W_m2K: number;
  hConvective_W_m2K: number;
  hRadiative_W_m2K: number;
  regime: "natural" | "forced" | "mixed";
  correlations: string[];
}

/**
 * Area-weighted mean coefficient over an item's outer faces: natural convection by face
 * orientation, forced flow over the item, blended by the mixed-convection rule, plus radiation
 * in air. Below 0.05 m/s the flow is taken as still air.
 */
export function itemSurfaceCoefficient(g: ItemGeometry, Ts_C: number, s: Surroundings, emissivity: number, warnings: string[] = []): CombinedCoefficient {
  const faces: { area: number; hN: number; name: string }[] = [];
  let hF = 0;
  const correlations = new Set<string>();
  const add = (r: ConvectionResult) => correlations.add(r.correlation);
  const dT = Math.abs(Ts_C - s.T_C) < 0.05 ? 0.05 * (Ts_C >= s.T_C ? 1 : -1) : Ts_C - s.T_C;
  const Ts = s.T_C + dT;
  if (g.shape === "sphere") {
    const r = naturalSphere(s.fluid, Ts, s.T_C, g.diameter_m, warnings);
    add(r);
    faces.push({ area: Math.PI * g.diameter_m ** 2, hN: r.h_W_m2K, name: "sphere" });
    if (s.speed_m_s >= 0.05) {
      const f = forcedSphere(s.fluid, Ts, s.T_C, g.diameter_m, s.speed_m_s, warnings);
      add(f);
      hF = f.h_W_m2K;
    }
  } else if (g.shape === "cylinder") {
    const D = g.diameter_m;
    const L = g.length_m;
    const end = (Math.PI * D * D) / 4;
    if (g.upright) {
      const side = naturalVerticalPlate(s.fluid, Ts, s.T_C, L, warnings);
      const top = naturalHorizontalPlate(s.fluid, Ts, s.T_C, D / 4, "up", warnings);
      const bottom = naturalHorizontalPlate(s.fluid, Ts, s.T_C, D / 4, "down", warnings);
      [side, top, bottom].forEach(add);
      faces.push({ area: Math.PI * D * L, hN: side.h_W_m2K, name: "side" }, { area: end, hN: top.h_W_m2K, name: "top" }, { area: end, hN: bottom.h_W_m2K, name: "bottom" });
    } else {
      const side = naturalHorizontalCylinder(s.fluid, Ts, s.T_C, D, warnings);
      const ends = naturalVerticalPlate(s.fluid, Ts, s.T_C, D, warnings);
      [side, ends].forEach(add);
      faces.push({ area: Math.PI * D * L, hN: side.h_W_m2K, name: "side" }, { area: 2 * end, hN: ends.h_W_m2K, name: "ends" });
    }
    if (s.speed_m_s >= 0.05) {
      const f = forcedCylinder(s.fluid, Ts, s.T_C, D, s.speed_m_s, warnings);
      add(f);
      hF = f.h_W_m2K;
    }
  } else {
    const { height_m: H, width_m: W, length_m: L } = g;
    const Lc = (W * L) / (2 * (W + L));
    const top = naturalHorizontalPlate(s.fluid, Ts, s.T_C, Lc, "up", warnings);
    const bottom = naturalHorizontalPlate(s.fluid, Ts, s.T_C, Lc, "down", warnings);
    const side = naturalVerticalPlate(s.fluid, Ts, s.T_C, H, warnings);
    [top, bottom, side].forEach(add);
    faces.push(
      { area: W * L, hN: top.h_W_m2K, name: "top" },
      { area: W * L, hN: bottom.h_W_m2K, name: "bottom" },
      { area: 2 * H * (W + L), hN: side.h_W_m2K, name: "sides" },
    );
    if (s.speed_m_s >= 0.05) {
      const f = forcedFlatPlate(s.fluid, Ts, s.T_C, Math.max(W, L), s.speed_m_s, warnings);
      add(f);
      hF = f.h_W_m2K;
    }
  }
  const area = faces.reduce((a, f) => a + f.area, 0);
  const hN = faces.reduce((a, f) => a + f.area * f.hN, 0) / area;
  const hC = hF > 0 ? mixedConvection(hF, hN) : hN;
  const regime = hF === 0 ? "natural" : hF > 3 * hN ? "forced" : "mixed";
  const hR = s.fluid === "air" ? radiationCoefficient(emissivity, Ts_C, s.radiant_C ?? s.T_C) : 0;
  return { h_W_m2K: hC + hR, hConvective_W_m2K: hC, hRadiative_W_m2K: hR, regime, correlations: [...correlations] };
}

/**
 * A surface coefficient that follows the surface temperature: re-evaluates `hAt(Ts)` only when the surface
 * has moved more than `step_K` (0.25 K) since the last evaluation, so a convection correlation is not
 * recomputed at every solver step, while its dependence on ΔT (natural convection goes as ΔT^¼–⅓) is kept.
 * The returned function has the solver's boundary signature (t, Ts).
 */
export function followingSurface(hAt: (Ts_C: number) => number, step_K = 0.25): (t_s: number, Ts_C: number) => number {
  let lastTs = NaN;
  let lastH = 0;
  return (_t, Ts) => {
    if (!(Math.abs(Ts - lastTs) <= step_K)) {
      lastTs = Ts;
      lastH = hAt(Ts);
    }
    return lastH;
  };
}
