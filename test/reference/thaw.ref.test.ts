import { describe, it, expect } from "vitest";
import { runThaw, runThawParsed, DEFAULT_TRAY } from "../../lib/physics/thaw";
import { thawInputSchema } from "../../lib/schemas/thaw";
import { annularFinEfficiency, straightFinEfficiency } from "../../lib/physics/fins";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";
import { foodThermal, simpleMaterial } from "../../lib/physics/properties";
import { solve1D } from "../../lib/physics/solver1d";
import { phamTime, plankTime, shellEstimateGeometry } from "../../lib/physics/phase-change";

const turkey = D.products.find((p) => p.name.startsWith("Whole turkey"))!;
const cod = D.products.find((p) => p.name.startsWith("Cod"))!;
const us = D.rulesets.find((r) => r.name.startsWith("US"))!;
const LB = 0.45359237;

describe("USDA FSIS consumer thawing guidance (\"The Big Thaw — Safe Defrosting Methods\"; \"Turkey Basics: Safe Thawing\")", () => {
  // Planning figures with a safety margin (published-values.md §4.2, CONFIRMED): refrigerator about 24 h per
  // 4–5 lb of a large bird; cold water about 30 min per lb, water changed every 30 min. They are plausibility
  // bounds, not measurements. The demo bird is a hollow sphere: a 50 mm wall (the deepest meat over the cavity)
  // around a closed cavity, its outer size set by mass and composition density. 4 and 9 kg birds are the same
  // bird scaled geometrically (every length × (m/6 kg)^(1/3)), so physics scales with m^(2/3) while the guidance
  // is linear in mass: the ratio falls with size by construction.
  // Bands (stated before running): cold water 0.6–1.25 × the guidance — a well-specified bird should thaw within
  // the planning figure, which has a margin, and not in much less; refrigerator 0.3–1.25 × — the guidance assumes
  // a household fridge (often 1–3 °C, a bagged bird on a tray), the model 4.4 °C air moving at 0.1 m/s on a bare
  // bird, and it sits well below the guidance; see the report for what remains.
  // Before (solid sphere of equal volume, 6 kg): refrigerator 49.4 h vs 63–79 h; cold water 13.4 h vs 6.6 h (2.03 ×).
  // After (6 kg): refrigerator 34.8 h (0.44–0.55 ×), cold water 5.5 h (0.84 ×). What remains in the refrigerator is
  // mostly the freezing point and the fridge: with chicken's measured −1.2 °C (DSC, UNCERTAIN) instead of Pham's
  // estimate −2.5 °C the 6 kg bird takes 47.5 h; in a 2 °C fridge 48.2 h; both together 73.8 h (0.93–1.16 ×);
  // cold water with −1.2 °C: 6.6 h (0.99 ×). Measured in this file's set-up when these bands were written.
  const bird = (kg: number) => {
    const s = Math.cbrt(kg / turkey.mass_kg);
    return { ...turkey, name: `Whole turkey, ${kg} kg`, mass_kg: kg, dimA_m: turkey.dimA_m * s, wallThickness_m: turkey.wallThickness_m! * s };
  };
  const fridge = { kind: "fridge_air" as const, air_C: 4.4, speed_m_s: 0.1 };
  const coldWater = { kind: "still_water" as const, water_C: 15, bath_m3: 0.03, changeEvery_s: 1800, room_C: 21, packaging: { thickness_m: 0.0001, k_W_mK: 0.33 } };

  it("the demo bird's shell holds its stated mass at the composition density (volume consistent with mass)", () => {
    const r = runThawParsed(thawInputSchema.parse({ product: turkey, start_C: -18, ruleSet: us, method: fridge }));
    expect(r.warnings.join(" ")).not.toMatch(/shell holds|porous/);
    expect(r.assumptions.join(" ")).toMatch(/hollow sphere: a 50 mm wall/);
  });

  for (const kg of [4, 6, 9]) {
    it(`${kg} kg bird from 0 °F (−18 °C): refrigerator 0.3–1.25 × and cold water 0.6–1.25 × the guidance`, () => {
      const lb = kg / LB;
      const f = runThawParsed(thawInputSchema.parse({ product: bird(kg), start_C: -18, ruleSet: us, method: fridge }));
      const w = runThawParsed(thawInputSchema.parse({ product: bird(kg), start_C: -18, ruleSet: us, method: coldWater }));
      const fridge_h = f.thawTime_s! / 3600;
      const water_h = w.thawTime_s! / 3600;
      const guideFridge = [(lb / 5) * 24, (lb / 4) * 24];
      const guideWater = lb * 0.5;
      console.log(
        `USDA ${kg} kg (${lb.toFixed(1)} lb): refrigerator ${fridge_h.toFixed(1)} h vs ${guideFridge[0].toFixed(0)}–${guideFridge[1].toFixed(0)} h (ratio ${(fridge_h / guideFridge[1]).toFixed(2)}–${(fridge_h / guideFridge[0]).toFixed(2)}); ` +
          `cold water ${water_h.toFixed(1)} h vs ${guideWater.toFixed(1)} h (ratio ${(water_h / guideWater).toFixed(2)}); ` +
          `Plank/Pham ÷ numerical: refrigerator ${(f.estimates.plank_s! / f.thawTime_s!).toFixed(2)}/${(f.estimates.pham_s! / f.thawTime_s!).toFixed(2)}, water ${(w.estimates.plank_s! / w.thawTime_s!).toFixed(2)}/${(w.estimates.pham_s! / w.thawTime_s!).toFixed(2)}`,
      );
      expect(fridge_h / guideFridge[0]).toBeGreaterThan(0.3);
      expect(fridge_h / guideFridge[1]).toBeLessThan(1.25);
      expect(water_h / guideWater).toBeGreaterThan(0.6);
      expect(water_h / guideWater).toBeLessThan(1.25);
      expect(f.energyBalanceError).toBeLessThan(1e-9);
      expect(w.energyBalanceError).toBeLessThan(1e-9);
    });
  }
});

describe("hollow shell against Plank's quasi-steady limit (hand calculation from Plank's assumptions)", () => {
  // With a negligible sensible heat (Stefan number → 0) and a sharp melting point, the numerical thaw of a shell
  // must approach Plank's integral for the shell: t = ρL/ΔT (ℓ/h + S/k), sphere S = [(R² − Ri²)/2 − Ri² + Ri³/R]/3,
  // ℓ = (R³ − Ri³)/(3R²) (derived in lib/physics/phase-change.ts). R = 0.12 m, Ri = 0.07 m, h = 50, k = 0.5,
  // ρ = 1000, L = 300 kJ/kg, ΔT = 10 K: ℓ = 1.385e-3/0.0432 = 0.03206 m, S = (0.00475 − 0.0049 + 0.002858)/3 = 9.028e-4 m²,
  // t = 3×10⁸/10 × (6.41e-4 + 1.806e-3) = 73 400 s.
  it("spherical and cylindrical shells within 3 % of the Plank integral; the solid sphere reproduces Plank's 1/6, 1/24", () => {
    const mat = simpleMaterial({ rho_kg_m3: 1000, cSolid_J_kgK: 100, cLiquid_J_kgK: 100, kSolid_W_mK: 0.5, kLiquid_W_mK: 0.5, melt_C: 0, latent_J_kg: 300_000, mushy_K: 0.2 });
    const g = shellEstimateGeometry("sphere", 0.12, 0.07);
    expect(g.lumped_m).toBeCloseTo(0.03206, 4);
    expect(g.S_m2).toBeCloseTo(9.028e-4, 6);
    expect(plankTime({ shape: "sphere", a_m: 0.24, innerDiameter_m: 0.14, rho_kg_m3: 1000, latent_J_kg: 300_000, h_W_m2K: 50, k_W_mK: 0.5, Tf_C: 0, medium_C: 10 }).value / 73_400).toBeCloseTo(1, 2);
    for (const [shape, Ri] of [["sphere", 0.07], ["cylinder", 0.07], ["sphere", 0]] as const) {
      const r = solve1D({ shape, halfSize_m: 0.12, innerRadius_m: Ri, nodes: 121, material: mat, initial_C: -0.1, boundary: { kind: "convective", h_W_m2K: () => 50, fluid_C: () => 10 }, tEnd_s: 1e7, dt_s: 20, adaptive: { target_K: 2, dtMax_s: 600 }, stopWhen: (st) => st.center_C >= 0.1 });
      const t = r.t_s.at(-1)!;
      const pl = plankTime({ shape, a_m: 0.24, innerDiameter_m: Ri ? 2 * Ri : undefined, rho_kg_m3: 1000, latent_J_kg: 300_000, h_W_m2K: 50, k_W_mK: 0.5, Tf_C: 0, medium_C: 10 }).value;
      console.log(`${shape} shell Ri = ${Ri}: numerical ${(t / 3600).toFixed(2)} h, Plank integral ${(pl / 3600).toFixed(2)} h`);
      expect(Math.abs(t / pl - 1)).toBeLessThan(0.03);
      expect(Math.abs(r.energyError_J / r.storedChange_J)).toBeLessThan(1e-9);
    }
  });
});

describe("metal against plastic (common practice: a metal tray thaws faster than a plastic board)", () => {
  it("a 6 mm aluminium tray beats a 15 mm polyethylene board for the cod block in room air and in the refrigerator", () => {
    const hdpe = D.materials.find((m) => m.name === "HDPE sheet")!;
    const al = D.materials.find((m) => m.name === "Aluminium (pure)")!;
    for (const air of [4, 21]) {
      const t = (tray: typeof al, thick: number) =>
        runThaw({ product: cod, start_C: -18, ruleSet: us, method: { kind: "tray", air_C: air, speed_m_s: 0.1, tray, trayThickness_m: thick, trayLength_m: 0.6, trayWidth_m: 0.4, undersideExposed: true, contact_W_m2K: 200 } }).thawTime_s!;
      const metal = t(al, 0.006);
      const anodised = t(DEFAULT_TRAY, 0.006);
      const board = t(hdpe, 0.015);
      console.log(`tray at ${air} °C: bare aluminium/board = ${(metal / board).toFixed(2)}, anodised aluminium/board = ${(anodised / board).toFixed(2)}`);
      expect(metal).toBeLessThan(board);
      expect(anodised).toBeLessThan(metal);
    }
  });
});

describe("agreement with the closed-form estimates (Plank 1913; Pham 1986)", () => {
  // Freezing, where Pham's method was fitted: Pham (1986), J. Food Technol. 21:209–219, reports about ±10 %
  // against experiments (from memory). Our numerical times come out 17–25 % below Pham and within 8 % of Plank
  // across these cases; the band accepted here is ±25 % for Pham and ±10 % for Plank (our choice, stated).
  it("freezing 50–100 mm slabs of cod and beef from 5 °C to a −10 °C centre", () => {
    const cases = [
      [20, 0.025, -30],
      [50, 0.05, -35],
      [10, 0.04, -25],
      [200, 0.025, -30],
    ] as const;
    for (const comp of [cod.composition, { water: 0.74, protein: 0.22, fat: 0.03, carbohydrate: 0, fibre: 0, ash: 0.01 }]) {
      const f = foodThermal({ composition: comp, initialFreezing_C: -2 });
      for (const [h, L, Ta] of cases) {
        const r = solve1D({ shape: "slab", halfSize_m: L, nodes: 101, material: f, initial_C: 5, boundary: { kind: "convective", h_W_m2K: () => h, fluid_C: () => Ta }, tEnd_s: 1e6, dt_s: 10, adaptive: { target_K: 0.5, dtMax_s: 300 }, stopWhen: (s) => s.center_C <= -10 });
        const t = r.t_s.at(-1)!;
        const ph = phamTime({ E: 1, halfSize_m: L, h_W_m2K: h, rhoUnfrozen_kg_m3: f.rho_kg_m3, rhoFrozen_kg_m3: f.rho_kg_m3, cUnfrozen_J_kgK: f.c_J_kgK(2), cFrozen_J_kgK: f.c_J_kgK(-25), kUnfrozen_W_mK: f.k_W_mK(2), kFrozen_W_mK: f.k_W_mK(-20), latent_J_kg: f.latent_J_kg, Tf_C: -2, initial_C: 5, finalCenter_C: -10, medium_C: Ta }).value;
        const pl = plankTime({ shape: "slab", a_m: 2 * L, rho_kg_m3: f.rho_kg_m3, latent_J_kg: f.latent_J_kg, h_W_m2K: h, k_W_mK: f.k_W_mK(-20), Tf_C: -2, medium_C: Ta }).value;
        expect(Math.abs(t / ph - 1)).toBeLessThan(0.25);
        expect(Math.abs(t / pl - 1)).toBeLessThan(0.1);
        expect(Math.abs(r.energyError_J / r.storedChange_J)).toBeLessThan(1e-9);
      }
    }
  });

  // The formulas get what the enthalpy model uses: the latent heat it releases between the start and the end point
  // (the ice present at the start, x_ice = (x_w − 0.4 x_p)(1 − t_f/t), ASHRAE Refrigeration Handbook 2006, Ch. 9),
  // and sensible specific heats without the latent part. Hand calculation for the demo cod block from −18 °C
  // (t_f −2.2 °C): x_ice = (0.812 − 0.0712)(1 − 2.2/18) = 0.6502, latent 0.6502 × 333.6 = 216.9 kJ/kg (before: all
  // the water, 270.9 kJ/kg, and Pham's frozen specific heat was the apparent one at −18 °C, about 3.6 kJ/(kg·K)).
  it("Plank and Pham receive the enthalpy model's latent heat and sensible specific heats (demo cod block)", () => {
    const r = runThawParsed(thawInputSchema.parse({ product: cod, start_C: -18, ruleSet: us, method: { kind: "running_water", water_C: 15, speed_m_s: 0.05, packaging: null } }));
    const inp = r.estimates.inputs;
    expect(inp.latent_J_kg / 216_900).toBeCloseTo(1, 2);
    const f = foodThermal({ composition: cod.composition, initialFreezing_C: cod.initialFreezing_C });
    // Energy: H(end) − H(start) = latent + c_frozen (t_f − start) + c_thawed (end − t_f), within 0.5 %.
    const dH = f.H_J_kg(r.endPoint_C) - f.H_J_kg(-18);
    const parts = inp.latent_J_kg + inp.cFrozen_J_kgK * (f.Tf_C + 18) + inp.cUnfrozen_J_kgK * (r.endPoint_C - f.Tf_C);
    expect(Math.abs(parts / dH - 1)).toBeLessThan(0.005);
    // Sensible, not apparent: between ASHRAE Table 3's frozen (2.14) and unfrozen (3.77) values for cod.
    expect(inp.cFrozen_J_kgK).toBeGreaterThan(2000);
    expect(inp.cFrozen_J_kgK).toBeLessThan(2800);
    expect(r.assumptions.join(" ")).toMatch(/Plank and Pham .* same latent heat .* differ from it by/);
  });

  // Thawing: Góral, Kluza, Spiess & Kozłowicz (2016), Food Technol. Biotechnol. 54(1):3–12 find no simple thawing
  // formula accurate over a wide range, and Pham's thawing form here is from memory. With the ASHRAE ice-fraction
  // model much of the ice melts well below the freezing point, where the food still conducts well, so the numerical
  // thaw is faster than both formulas. Accepted: each formula within a factor of 2 of the numerical time.
  // Before (all the water as latent heat, apparent frozen c): running water Plank 1.68 ×, Pham 1.82 × the numerical
  // 1.67 h; room air 1.28 ×, 1.43 × of 7.53 h. After: 1.34 ×, 1.43 × and 1.03 ×, 1.12 ×.
  it("thawing a 50 mm slab of cod in running water (high Bi) and in moving air (low Bi)", () => {
    const slab = { ...cod, shape: "slab" as const, dimA_m: 0.05, dimB_m: 0.6, dimC_m: 0.8, mass_kg: 0.05 * 0.6 * 0.8 * 1060 };
    for (const method of [
      { kind: "running_water" as const, water_C: 15, speed_m_s: 0.1, packaging: null },
      { kind: "room_air" as const, air_C: 20, speed_m_s: 1 },
    ]) {
      const r = runThaw({ product: slab, start_C: -18, ruleSet: us, method });
      const t = r.thawTime_s!;
      console.log(`${method.kind}: numerical ${(t / 3600).toFixed(2)} h, Plank ${(r.estimates.plank_s! / 3600).toFixed(2)} h, Pham ${(r.estimates.pham_s! / 3600).toFixed(2)} h`);
      for (const e of [r.estimates.plank_s!, r.estimates.pham_s!]) {
        expect(e / t).toBeGreaterThan(0.5);
        expect(e / t).toBeLessThan(2);
      }
    }
  });
});

describe("fin efficiency (Incropera & DeWitt 6th ed., Table 3.5 and Example 3.10; from memory)", () => {
  it("annular aluminium fins r1 = 25 mm, r2 = 45 mm, t = 1 mm, k = 186 W/(m·K), h = 25 W/(m²·K): η ≈ 0.95", () => {
    expect(annularFinEfficiency(25, 186, 0.001, 0.025, 0.045)).toBeCloseTo(0.95, 1);
  });
  it("the straight fin tends to 1 for short, conductive fins and to 1/(mL) for long ones", () => {
    expect(straightFinEfficiency(10, 237, 0.006, 0.001)).toBeGreaterThan(0.999);
    const m = Math.sqrt((2 * 10) / (0.5 * 0.01));
    expect(straightFinEfficiency(10, 0.5, 0.01, 2)).toBeCloseTo(1 / (m * (2 + 0.005)), 3);
  });
});
