import { describe, it, expect } from "vitest";
import { plankTime, phamTime, equivalentDimensionality } from "../../lib/physics/phase-change";
import {
  airProps,
  waterProps,
  naturalVerticalPlate,
  naturalHorizontalCylinder,
  radiationCoefficient,
  forcedFlatPlate,
  solAirTemperature,
  itemSurfaceCoefficient,
} from "../../lib/physics/surfaces";
import { runWarmup } from "../../lib/physics/warmup";
import { itemShape } from "../../lib/physics/geometry";
import { foodThermal } from "../../lib/physics/properties";
import { seriesTheta } from "../../lib/physics/conduction";
import { DEMO_SCENARIO } from "../../lib/db/demo-scenario";

describe("Plank's equation vs published worked examples", () => {
  it("sphere D = 7 cm, ρ = 1000 kg/m³, L = 250 kJ/kg, Tf = −1.25 °C, Ta = −15 °C, h = 50, k = 1.2 → 2.04 h", () => {
    // Textbook-type freezing example (believed Singh & Heldman, Introduction to Food Engineering, Ch. 7;
    // attribution from memory; arithmetic 7336 s recomputed in shared/reference/published-values.md §2.1).
    const t = plankTime({ shape: "sphere", a_m: 0.07, rho_kg_m3: 1000, latent_J_kg: 250_000, h_W_m2K: 50, k_W_mK: 1.2, Tf_C: -1.25, medium_C: -15 });
    expect(t.value).toBeCloseTo(7336, 0);
  });

  it("slab 0.10 m, ρL = 2.5×10⁸ J/m³, ΔT = 10 K, h = 20, k = 1.5 → 23.1 h, and Pham (1986) with ΔH1 = 0 gives the same", () => {
    // published-values.md §8 "quick analytic sanity case" (COMPUTED from the defining equations).
    const pl = plankTime({ shape: "slab", a_m: 0.1, rho_kg_m3: 1000, latent_J_kg: 250_000, h_W_m2K: 20, k_W_mK: 1.5, Tf_C: 0, medium_C: -10 });
    expect(pl.value / 3600).toBeCloseTo(23.15, 1);
    // Pham: choose T_c and T_a so that T_fm = 1.8 + 0.263 T_c + 0.105 T_a equals 0 °C, and zero sensible heats.
    const Ta = -10;
    const Tc = -(1.8 + 0.105 * Ta) / 0.263;
    const ph = phamTime({
      E: 1,
      halfSize_m: 0.05,
      h_W_m2K: 20,
      rhoUnfrozen_kg_m3: 1000,
      rhoFrozen_kg_m3: 1000,
      cUnfrozen_J_kgK: 0,
      cFrozen_J_kgK: 0,
      kUnfrozen_W_mK: 1.5,
      kFrozen_W_mK: 1.5,
      latent_J_kg: 250_000,
      Tf_C: 0,
      initial_C: 5,
      finalCenter_C: Tc,
      medium_C: Ta,
    });
    expect(ph.value / pl.value).toBeCloseTo(1, 9);
  });

  it("equivalent heat-transfer dimensionality E0 = 1 + 1/β1 + 1/β2 (ASHRAE Refrigeration 2010, Ch. 20, Eq. 20)", () => {
    expect(equivalentDimensionality([0.1, Infinity, Infinity]).E).toBe(1);
    expect(equivalentDimensionality([0.1, 0.1, Infinity]).E).toBe(2);
    expect(equivalentDimensionality([0.1, 0.1, 0.1]).E).toBe(3);
    expect(equivalentDimensionality([0.05, 0.25, 0.4]).E).toBeCloseTo(1 + 0.2 + 0.125, 12);
  });
});

describe("fluid properties vs tables", () => {
  it("air at 300 K: k = 0.0263 W/(m·K), ν = 15.89×10⁻⁶ m²/s, Pr = 0.707 (Incropera 6th ed., Table A.4; from memory) within 3 %", () => {
    const a = airProps(26.85);
    expect(Math.abs(a.k_W_mK / 0.0263 - 1)).toBeLessThan(0.03);
    expect(Math.abs(a.nu_m2_s / 15.89e-6 - 1)).toBeLessThan(0.03);
    expect(Math.abs(a.Pr / 0.707 - 1)).toBeLessThan(0.03);
  });
  it("water at 20 °C: ρ = 998.2 kg/m³, μ = 1.002 mPa·s, k = 0.598 W/(m·K) (IAPWS values; from memory) within 1 %", () => {
    const w = waterProps(20);
    expect(Math.abs(w.rho_kg_m3 / 998.2 - 1)).toBeLessThan(0.01);
    expect(Math.abs(w.mu_Pa_s / 1.002e-3 - 1)).toBeLessThan(0.01);
    expect(Math.abs(w.k_W_mK / 0.598 - 1)).toBeLessThan(0.01);
  });
});

describe("rules of thumb of the trade (common practice; loose bands)", () => {
  const material = (name: string) => DEMO_SCENARIO.materials.find((m) => m.name === name)!;
  it("copper conducts about 400 W/(m·K) (±5 %)", () => {
    expect(Math.abs(material("Copper (pure)").conductivity_W_mK / 400 - 1)).toBeLessThan(0.05);
  });
  it("common plastics conduct about 0.2 W/(m·K) (polypropylene within ±30 %)", () => {
    expect(Math.abs(material("Polypropylene board").conductivity_W_mK / 0.2 - 1)).toBeLessThan(0.3);
  });
  it("still air conducts about 0.025 W/(m·K) (±5 % at 20 °C)", () => {
    expect(Math.abs(airProps(20).k_W_mK / 0.025 - 1)).toBeLessThan(0.05);
  });
  it("a person in still room air: combined coefficient about 7 W/(m²·K) (±30 %)", () => {
    // 1.7 m vertical surface at 28 °C in 22 °C air and surroundings, ε = 0.95.
    const h = naturalVerticalPlate("air", 28, 22, 1.7).h_W_m2K + radiationCoefficient(0.95, 28, 22);
    expect(Math.abs(h / 7 - 1)).toBeLessThan(0.3);
  });
  it("a bare warm pipe in still air: about 9.5 W/(m²·K) (±30 %)", () => {
    // 50 mm pipe at 50 °C in 20 °C air, ε = 0.8.
    const h = naturalHorizontalCylinder("air", 50, 20, 0.05).h_W_m2K + radiationCoefficient(0.8, 50, 20);
    expect(Math.abs(h / 9.5 - 1)).toBeLessThan(0.3);
  });
  it("forced air over food at 1–5 m/s stays below 50 W/(m²·K) (meat-freezing review excerpt, published-values.md §6.1)", () => {
    for (const U of [1, 3, 5]) expect(forcedFlatPlate("air", 0, -20, 0.3, U).h_W_m2K).toBeLessThan(50);
  });
});

describe("sol-air temperature (ASHRAE Handbook — Fundamentals, sol-air section)", () => {
  it("t_e = t_o + αI/h_o − εΔR/h_o with ΔR = 63 W/m² on a horizontal roof, 0 on a wall", () => {
    // ASHRAE's h_o = 17 W/(m²·K); dark roof α/h_o = 0.052 m²·K/W (0.30 h·ft²·°F/Btu).
    const roof = solAirTemperature({ airTemp_C: 30, solarAbsorptivity: 0.9, irradiance_W_m2: 800, hOuter_W_m2K: 17, emissivity: 1, facingSky: true });
    expect(roof).toBeCloseTo(30 + (0.9 * 800) / 17 - 63 / 17, 9);
    expect(63 / 17).toBeCloseTo(3.7, 1); // the ≈ 3.9 K (7 °F) long-wave correction of the handbook, within its rounding
    const wall = solAirTemperature({ airTemp_C: 30, solarAbsorptivity: 0.9, irradiance_W_m2: 800, hOuter_W_m2K: 17, emissivity: 1, facingSky: false });
    expect(wall).toBeCloseTo(30 + (0.9 * 800) / 17, 9);
  });
});

describe("warm-up check: the surface coefficient follows the surface temperature (lumped capacitance with h(T))", () => {
  // Lumped capacitance with a coefficient that depends on the temperature difference (Bejan & Kraus, Heat
  // Transfer Handbook, Wiley 2003, Eqs. 3.284–3.288; published-values.md §1.1 CONFIRMED): ρ c (V/A) dT/dt =
  // h(T)(T∞ − T), integrated here by RK4 with h re-evaluated from the same natural-convection correlations at
  // every step. A 10 mm tray of food made conductive (k = 5 W/(m·K), Bi ≈ 0.01) cooling from 90 °C in still 20 °C
  // air without radiation: the numerical solver must give the same time to the 57 °C hot-holding limit within 2 %.
  // Before, the coefficient stayed at its value for the mid temperature (55 °C) for the whole run.
  it("time to the hot-holding limit within 2 % of the lumped h(T) integration", () => {
    const rs = DEMO_SCENARIO.rulesets.find((r) => r.name.startsWith("US"))!;
    const base = DEMO_SCENARIO.products.find((p) => p.name.startsWith("Roast chicken"))!;
    const product = { ...base, dimA_m: 0.01, mass_kg: 0.01 * 0.265 * 0.325 * 1100, kUnfrozen_W_mK: 5 };
    const r = runWarmup({ product, start_C: 90, surroundings: { medium: "air", T_C: 20, speed_m_s: 0, emissivity: 0 }, ruleSet: rs, limit: "hotHoldMin", horizon_s: 12 * 3600, method: "numerical" });
    const shape = itemShape(product);
    const food = foodThermal({ composition: product.composition, overrides: { kUnfrozen_W_mK: 5 }, mass_kg: product.mass_kg, volume_m3: shape.volume_m3 });
    const L = shape.oneD.halfSize_m; // the solver's slab: V/A = half-thickness
    const dTdt = (T: number) => (itemSurfaceCoefficient(shape.convection, T, { fluid: "air", T_C: 20, speed_m_s: 0 }, 0).hConvective_W_m2K * (20 - T)) / (food.rho_kg_m3 * food.c_J_kgK(T) * L);
    let T = 90;
    let t = 0;
    const dt = 5;
    while (T > 57) {
      const k1 = dTdt(T);
      const k2 = dTdt(T + (dt / 2) * k1);
      const k3 = dTdt(T + (dt / 2) * k2);
      const k4 = dTdt(T + dt * k3);
      const Tn = T + (dt / 6) * (k1 + 2 * k2 + 2 * k3 + k4);
      if (Tn <= 57) {
        t += (dt * (T - 57)) / (T - Tn);
        break;
      }
      T = Tn;
      t += dt;
    }
    console.log(`h(T) check: numerical ${(r.timeToLimit_s.mean! / 60).toFixed(1)} min, lumped h(T) ${(t / 60).toFixed(1)} min`);
    expect(r.method).toBe("numerical");
    expect(Math.abs(r.timeToLimit_s.mean! / t - 1)).toBeLessThan(0.02);
  });
});

describe("warm-up check: a block's corner is the warmest point (product solution, Incropera & DeWitt 6th ed., §5.8; from memory)", () => {
  // The demo chicken thighs (40 × 265 × 325 mm) warming from 2 °C in 25 °C air: in the product solution a corner
  // takes the surface value of all three slab factors, an edge of two, the middle of the largest face of one.
  it("reports corner, edge and mid-face, judges the limit by the corner, and the corner equals the product of three surface factors", () => {
    const rs = DEMO_SCENARIO.rulesets.find((r) => r.name.startsWith("US"))!;
    const product = DEMO_SCENARIO.products.find((p) => p.name.startsWith("Roast chicken"))!;
    const r = runWarmup({ product, start_C: 2, surroundings: { medium: "air", T_C: 25, speed_m_s: 0.2 }, ruleSet: rs, limit: "chilledMax", horizon_s: 6 * 3600 });
    expect(r.method).toBe("series");
    expect(r.surfacePoint).toBe("corner");
    const { corner, edge, midFace, surface, center } = r.timeToLimit_s;
    console.log(`corner ${(corner! / 60).toFixed(1)} min, edge ${(edge! / 60).toFixed(1)} min, mid-face ${(midFace! / 60).toFixed(1)} min, centre ${(center! / 60).toFixed(0)} min`);
    expect(surface).toBe(corner);
    expect(corner!).toBeLessThan(edge!);
    expect(edge!).toBeLessThan(midFace!);
    expect(midFace!).toBeLessThan(center!);
    // Hand check at the last sample: θ_corner = Π θ_slab(Bi_i, Fo_i, x* = 1).
    const last = r.series.at(-1)!;
    const { k_W_mK: k, alpha_m2_s: a } = r.properties;
    let th = 1;
    for (const d of [product.dimA_m, product.dimB_m!, product.dimC_m!]) th *= seriesTheta("slab", (r.h_W_m2K * d) / 2 / k, (a * last.t_s) / (d / 2) ** 2, 1);
    expect(last.surface_C).toBeCloseTo(25 + (2 - 25) * th, 2);
    expect(last.midFace_C).toBeLessThan(last.surface_C);
  });
});
