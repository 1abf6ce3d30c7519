import { describe, it, expect } from "vitest";
import fc from "fast-check";
import { foodThermal, estimateInitialFreezing_C, type Composition } from "../../lib/physics/properties";
import { seriesTheta, seriesMeanTheta, lumpedTheta, type Shape1D } from "../../lib/physics/conduction";
import { solve1D } from "../../lib/physics/solver1d";
import { nodePositions } from "../../lib/physics/shipper";
import { itemSurfaceCoefficient, naturalVerticalPlate, naturalHorizontalPlate, naturalSphere, forcedCylinder, forcedSphere, forcedFlatPlate } from "../../lib/physics/surfaces";
import { plankTime } from "../../lib/physics/phase-change";
import { runWarmup } from "../../lib/physics/warmup";
import { PhysicsInputError } from "../../lib/physics/validation";
import { DEMO_SCENARIO } from "../../lib/db/demo-scenario";
import { itemShape } from "../../lib/physics/geometry";
import { productSchema } from "../../lib/schemas/templates";

const beef: Composition = { water: 0.71, protein: 0.22, fat: 0.06, carbohydrate: 0, fibre: 0, ash: 0.01 };

describe("food properties", () => {
  const p = foodThermal({ composition: beef, initialFreezing_C: -1.7 });

  it("enthalpy and apparent specific heat are consistent: ∫c dT (trapezoid, 0.001 K) equals ΔH", () => {
    for (const [a, b] of [
      [-40, -20],
      [-20, -1.7],
      [-3, 0],
      [-1.7, 30],
      [-30, 60],
    ]) {
      let s = 0;
      const n = Math.round((b - a) / 0.001);
      for (let i = 0; i < n; i++) {
        const t0 = a + (i * (b - a)) / n;
        const t1 = a + ((i + 1) * (b - a)) / n;
        s += ((p.cAnalytic_J_kgK(t0) + p.cAnalytic_J_kgK(t1)) / 2) * (t1 - t0);
      }
      const dH = p.H_J_kg(b) - p.H_J_kg(a);
      expect(Math.abs(s - dH) / Math.abs(dH)).toBeLessThan(2e-3);
    }
  });

  it("the table slope c is exactly the derivative of the table H", () => {
    const T = -2.52; // inside a table cell, not on a node
    const d = 1e-6;
    expect((p.H_J_kg(T + d) - p.H_J_kg(T - d)) / (2 * d)).toBeCloseTo(p.c_J_kgK(T), 0);
  });

  it("the latent heat released between 0 °C and −40 °C is most of x_w × 333.6 kJ/kg (bound water stays liquid)", () => {
    const sensibleApprox = 3000 * 40; // rough upper bound of sensible heat over 40 K
    const dH = p.H_J_kg(0) - p.H_J_kg(-40);
    expect(dH).toBeGreaterThan(0.7 * p.latent_J_kg);
    expect(dH).toBeLessThan(p.latent_J_kg + sensibleApprox);
  });

  it("overrides win", () => {
    const o = foodThermal({ composition: beef, initialFreezing_C: -1.7, overrides: { kUnfrozen_W_mK: 0.42, cpUnfrozen_J_kgK: 3333, density_kg_m3: 1111 } });
    expect(o.k_W_mK(10)).toBeCloseTo(0.42, 10);
    expect(o.c_J_kgK(10)).toBeCloseTo(3333, 6);
    expect(o.rho_kg_m3).toBe(1111);
  });

  it("estimates a freezing point below zero from composition (Pham 1996)", () => {
    const Tf = estimateInitialFreezing_C(beef);
    expect(Tf).toBeLessThan(0);
    expect(Tf).toBeGreaterThan(-5);
  });

  it("rejects non-physical input with a typed error naming the field", () => {
    expect(() => foodThermal({ composition: { ...beef, water: 0.2 } })).toThrow(PhysicsInputError);
    expect(() => foodThermal({ composition: { ...beef, water: -0.1, protein: 0.53 } })).toThrow(/composition.water/);
    expect(() => foodThermal({ composition: beef, initialFreezing_C: -300 })).toThrow(/absolute zero/);
    expect(() => foodThermal({ composition: beef, overrides: { density_kg_m3: 0 } })).toThrow(/density/);
  });

  it("never returns NaN over a wide range of compositions and temperatures (property-based)", () => {
    fc.assert(
      fc.property(
        fc.record({ water: fc.double({ min: 0.05, max: 0.95, noNaN: true }), protein: fc.integer({ min: 0, max: 100 }), fat: fc.integer({ min: 0, max: 100 }), carb: fc.integer({ min: 1, max: 100 }) }),
        fc.double({ min: -120, max: 250, noNaN: true }),
        ({ water, protein, fat, carb }, T) => {
          const rest = 1 - water;
          const sum = protein + fat + carb;
          const c: Composition = { water, protein: (rest * protein) / sum, fat: (rest * fat) / sum, carbohydrate: (rest * carb) / sum, fibre: 0, ash: 0 };
          const f = foodThermal({ composition: c });
          for (const v of [f.H_J_kg(T), f.c_J_kgK(T), f.k_W_mK(T), f.ice(T)]) expect(Number.isFinite(v)).toBe(true);
          expect(f.k_W_mK(T)).toBeGreaterThan(0);
          expect(f.c_J_kgK(T)).toBeGreaterThan(0);
        },
      ),
      { numRuns: 150 },
    );
  });
});

describe("surface correlations", () => {
  it("return finite, positive coefficients for any valid input, warning outside their range (property-based)", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -40, max: 90, noNaN: true }),
        fc.double({ min: -40, max: 90, noNaN: true }),
        fc.double({ min: 0.001, max: 5, noNaN: true }),
        fc.double({ min: 0, max: 30, noNaN: true }),
        (Ts, Tinf, L, U) => {
          const w: string[] = [];
          for (const r of [
            naturalVerticalPlate("air", Ts, Tinf, L, w),
            naturalHorizontalPlate("air", Ts, Tinf, L, "up", w),
            naturalHorizontalPlate("air", Ts, Tinf, L, "down", w),
            naturalSphere("air", Ts, Tinf, L, w),
            forcedFlatPlate("air", Ts, Tinf, L, U, w),
            forcedCylinder("air", Ts, Tinf, L, U, w),
            forcedSphere("air", Ts, Tinf, L, U, w),
          ]) {
            expect(Number.isFinite(r.h_W_m2K)).toBe(true);
            expect(r.h_W_m2K).toBeGreaterThanOrEqual(0);
          }
        },
      ),
      { numRuns: 200 },
    );
  });

  it("warns when a correlation is used outside its published range", () => {
    const w: string[] = [];
    forcedSphere("air", 20, 0, 0.001, 0.01, w);
    expect(w.join(" ")).toMatch(/outside the range/);
  });

  it("moving air raises the coefficient; more emissive surfaces radiate more", () => {
    const g = { shape: "block" as const, height_m: 0.05, width_m: 0.3, length_m: 0.4 };
    const still = itemSurfaceCoefficient(g, 5, { fluid: "air", T_C: 25, speed_m_s: 0 }, 0.9);
    const windy = itemSurfaceCoefficient(g, 5, { fluid: "air", T_C: 25, speed_m_s: 3 }, 0.9);
    const shiny = itemSurfaceCoefficient(g, 5, { fluid: "air", T_C: 25, speed_m_s: 0 }, 0.1);
    expect(windy.h_W_m2K).toBeGreaterThan(still.h_W_m2K);
    expect(shiny.h_W_m2K).toBeLessThan(still.h_W_m2K);
  });
});

describe("analytic conduction: monotone where physics demands it (property-based)", () => {
  it("θ falls with time; a higher Bi cools faster; a thicker body (smaller Fo at the same t) is slower", () => {
    fc.assert(
      fc.property(
        fc.constantFrom<Shape1D>("slab", "cylinder", "sphere"),
        fc.double({ min: 0.01, max: 200, noNaN: true }),
        fc.double({ min: 0.001, max: 3, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (shape, Bi, Fo, x) => {
          const a = seriesTheta(shape, Bi, Fo, x);
          expect(Number.isFinite(a)).toBe(true);
          expect(seriesTheta(shape, Bi, Fo * 1.5, x)).toBeLessThanOrEqual(a + 1e-9);
          expect(seriesMeanTheta(shape, Bi * 2, Fo)).toBeLessThanOrEqual(seriesMeanTheta(shape, Bi, Fo) + 1e-9);
        },
      ),
      { numRuns: 300 },
    );
  });

  it("lumped capacitance decays as exp(−hAt/ρVc)", () => {
    expect(lumpedTheta(10, 1, 1000, 0.001, 4000, 400)).toBeCloseTo(Math.exp(-1), 12);
  });
});

describe("numerical solver", () => {
  const food = foodThermal({ composition: beef, initialFreezing_C: -1.7 });
  const thaw = (halfSize_m: number, h: number, nodes = 41) =>
    solve1D({ shape: "slab", halfSize_m, nodes, material: food, initial_C: -18, boundary: { kind: "convective", h_W_m2K: () => h, fluid_C: () => 10 }, tEnd_s: 40 * 3600, dt_s: 60, adaptive: { target_K: 1, dtMax_s: 900 }, stopWhen: (s) => s.center_C > 0 });

  it("conserves energy through freezing and thawing, and a thicker slab or lower h thaws slower", () => {
    const base = thaw(0.02, 15);
    const thick = thaw(0.03, 15);
    const lowH = thaw(0.02, 8);
    for (const r of [base, thick, lowH]) {
      expect(Math.abs(r.energyError_J) / Math.abs(r.storedChange_J)).toBeLessThan(1e-9);
      expect(r.stoppedEarly).toBe(true);
    }
    expect(thick.t_s.at(-1)!).toBeGreaterThan(base.t_s.at(-1)!);
    expect(lowH.t_s.at(-1)!).toBeGreaterThan(base.t_s.at(-1)!);
  });

  it("conserves energy with a coupled tray node and with radiation", () => {
    const r = solve1D({
      shape: "slab",
      halfSize_m: 0.02,
      nodes: 31,
      material: food,
      initial_C: -18,
      boundary: { kind: "node", contact_W_m2K: 200, capacity_J_m2K: 5000, exchange_W_m2K: () => 12, fluid_C: () => 5, node0_C: 5 },
      tEnd_s: 12 * 3600,
      dt_s: 60,
    });
    expect(Math.abs(r.energyError_J) / Math.abs(r.storedChange_J)).toBeLessThan(1e-9);
    const rad = solve1D({
      shape: "sphere",
      halfSize_m: 0.05,
      nodes: 31,
      material: food,
      initial_C: 60,
      boundary: { kind: "convective", h_W_m2K: () => 5, fluid_C: (t) => (t < 3600 ? 20 : 30), emissivity: 0.9, radiant_C: () => 15 },
      tEnd_s: 6 * 3600,
      dt_s: 30,
    });
    expect(Math.abs(rad.energyError_J) / Math.abs(rad.storedChange_J)).toBeLessThan(1e-9);
  });

  it("rejects a bad set-up with a typed error", () => {
    expect(() => solve1D({ shape: "slab", halfSize_m: -1, nodes: 10, material: food, initial_C: 0, boundary: { kind: "fixed", T_C: () => 0 }, tEnd_s: 1, dt_s: 1 })).toThrow(PhysicsInputError);
    expect(() => solve1D({ shape: "slab", halfSize_m: 1, nodes: 2, material: food, initial_C: 0, boundary: { kind: "fixed", T_C: () => 0 }, tEnd_s: 1, dt_s: 1 })).toThrow(/nodes/);
  });
});

describe("Plank", () => {
  it("thicker → slower, higher h → faster, never NaN (property-based)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.005, max: 0.5, noNaN: true }), fc.double({ min: 1, max: 500, noNaN: true }), (a, h) => {
        const base = { shape: "slab" as const, rho_kg_m3: 1050, latent_J_kg: 250_000, k_W_mK: 1.2, Tf_C: -2, medium_C: -25 };
        const t = plankTime({ ...base, a_m: a, h_W_m2K: h }).value;
        expect(Number.isFinite(t)).toBe(true);
        expect(plankTime({ ...base, a_m: a * 1.2, h_W_m2K: h }).value).toBeGreaterThan(t);
        expect(plankTime({ ...base, a_m: a, h_W_m2K: h * 1.2 }).value).toBeLessThan(t);
      }),
    );
  });
});

describe("warm-up / cool-down check", () => {
  const rs = DEMO_SCENARIO.rulesets[0];
  const product = (name: string) => DEMO_SCENARIO.products.find((p) => p.name.startsWith(name))!;

  it("chicken tray on a warm pass: series method, centre crosses 5 °C later than the surface", () => {
    const r = runWarmup({ product: product("Roast chicken"), start_C: 3, surroundings: { medium: "air", T_C: 28, speed_m_s: 0 }, ruleSet: rs, limit: "chilledMax", horizon_s: 8 * 3600 });
    expect(r.method).toBe("series");
    expect(r.timeToLimit_s.surface).not.toBeNull();
    expect(r.timeToLimit_s.center!).toBeGreaterThan(r.timeToLimit_s.surface!);
    expect(r.timeToLimit_s.mean!).toBeGreaterThan(r.timeToLimit_s.surface!);
    expect(r.series[0].center_C).toBeCloseTo(3, 6);
    expect(r.assumptions.length).toBeGreaterThan(2);
  });

  it("hot rice cooling: crosses the hot-holding limit, surface first", () => {
    const r = runWarmup({ product: product("Steamed rice"), start_C: 80, surroundings: { medium: "air", T_C: 22, speed_m_s: 0.3 }, ruleSet: rs, limit: "hotHoldMin", horizon_s: 6 * 3600 });
    expect(r.direction).toBe("cooling");
    expect(r.timeToLimit_s.surface!).toBeLessThan(r.timeToLimit_s.center!);
  });

  it("a frozen block warming uses the numerical solver with a closed energy balance and closed-form estimates", () => {
    const r = runWarmup({ product: product("Cod fillets"), start_C: -18, surroundings: { medium: "air", T_C: 20, speed_m_s: 0 }, ruleSet: rs, limit: "chilledMax", horizon_s: 24 * 3600 });
    expect(r.method).toBe("numerical");
    expect(r.energyBalanceError!).toBeLessThan(1e-9);
    expect(r.estimates?.plank_s).toBeGreaterThan(0);
    expect(r.timeToLimit_s.center!).toBeGreaterThan(r.estimates!.plank_s!);
  });

  it("a small, conductive item in still air is lumped", () => {
    const p = { ...product("Roast chicken"), dimA_m: 0.004, dimB_m: 0.03, dimC_m: 0.03, mass_kg: 0.004, kUnfrozen_W_mK: 5 };
    const r = runWarmup({ product: p, start_C: 3, surroundings: { medium: "air", T_C: 25, speed_m_s: 0, h_W_m2K: 8 }, ruleSet: rs, limit: "chilledMax", horizon_s: 3600 });
    expect(r.method).toBe("lumped");
    expect(r.biotLumped).toBeLessThan(0.1);
  });

  it("never crossing gives null, and says why", () => {
    const r = runWarmup({ product: product("Roast chicken"), start_C: 3, surroundings: { medium: "air", T_C: 4, speed_m_s: 0 }, ruleSet: rs, limit: "chilledMax", horizon_s: 3600 });
    expect(r.timeToLimit_s).toEqual({ center: null, surface: null, mean: null, midFace: null, edge: null, corner: null });
    expect(r.warnings.join(" ")).toMatch(/never crosses/);
  });

  it("an explicit h is used as given", () => {
    const r = runWarmup({ product: product("Roast chicken"), start_C: 3, surroundings: { medium: "air", T_C: 30, speed_m_s: 0, h_W_m2K: 25 }, ruleSet: rs, limit: "chilledMax" });
    expect(r.h_W_m2K).toBe(25);
  });

  it("a higher air speed or a warmer room shortens the time to the limit (property-based)", () => {
    fc.assert(
      fc.property(fc.double({ min: 10, max: 40, noNaN: true }), fc.double({ min: 0, max: 5, noNaN: true }), (Tair, U) => {
        const run = (T: number, u: number) =>
          runWarmup({ product: product("Roast chicken"), start_C: 2, surroundings: { medium: "air", T_C: T, speed_m_s: u }, ruleSet: rs, limit: "chilledMax", horizon_s: 24 * 3600 }).timeToLimit_s.center!;
        const t = run(Tair, U);
        expect(run(Tair + 5, U)).toBeLessThan(t);
        expect(run(Tair, U + 2)).toBeLessThanOrEqual(t * 1.0001);
      }),
      { numRuns: 25 },
    );
  });
});

describe("hollow items", () => {
  const turkey = DEMO_SCENARIO.products.find((p) => p.name.startsWith("Whole turkey"))!;
  it("a hollow sphere's volume is the shell's and its area the outer surface", () => {
    const s = itemShape(turkey);
    const R = turkey.dimA_m / 2;
    const Ri = R - turkey.wallThickness_m!;
    expect(s.volume_m3).toBeCloseTo((4 / 3) * Math.PI * (R ** 3 - Ri ** 3), 12);
    expect(s.area_m2).toBeCloseTo(4 * Math.PI * R * R, 12);
    expect(s.hollow!.inner_m).toBeCloseTo(Ri, 12);
    expect(s.oneD.innerRadius_m).toBeCloseTo(Ri, 12);
  });
  it("a solid item is unchanged: no wall, no cavity", () => {
    const s = itemShape({ ...turkey, wallThickness_m: null });
    expect(s.hollow).toBeNull();
    expect(s.oneD.innerRadius_m).toBe(0);
  });
  it("the schema refuses a wall on a block and a wall as thick as the radius, with field messages", () => {
    const bad1 = productSchema.safeParse({ ...DEMO_SCENARIO.products[0], wallThickness_m: 0.01 });
    expect(bad1.success).toBe(false);
    expect(bad1.error!.issues[0].path).toEqual(["wallThickness_m"]);
    const bad2 = productSchema.safeParse({ ...turkey, wallThickness_m: turkey.dimA_m / 2 });
    expect(bad2.success).toBe(false);
    expect(bad2.error!.issues[0].message).toMatch(/less than half the diameter/);
    expect(productSchema.safeParse(turkey).success).toBe(true);
    const { wallThickness_m: _w, ...older } = turkey;
    expect(productSchema.safeParse(older).success).toBe(true);
  });
  it("the warm-up check runs a hollow bird on its shell and conserves energy", () => {
    const rs = DEMO_SCENARIO.rulesets[0];
    const r = runWarmup({ product: turkey, start_C: 2, surroundings: { medium: "air", T_C: 20, speed_m_s: 0.2 }, ruleSet: rs, limit: "chilledMax", horizon_s: 12 * 3600 });
    expect(r.method).toBe("numerical");
    expect(r.energyBalanceError!).toBeLessThan(1e-9);
    expect(r.biotLength_m).toBeCloseTo(turkey.wallThickness_m!, 12);
  });
  it("a thicker wall thaws slower (same outer size)", () => {
    const rs = DEMO_SCENARIO.rulesets[0];
    const t = (w: number) => runWarmup({ product: { ...turkey, wallThickness_m: w, mass_kg: 1054 * (4 / 3) * Math.PI * ((turkey.dimA_m / 2) ** 3 - (turkey.dimA_m / 2 - w) ** 3) }, start_C: -18, surroundings: { medium: "water", T_C: 15, speed_m_s: 0 }, ruleSet: rs, limit: "chilledMax", horizon_s: 48 * 3600 }).timeToLimit_s.center!;
    expect(t(0.06)).toBeGreaterThan(t(0.04));
  });
});

describe("graded body grid (nodePositions)", () => {
  it("runs from the centre to the surface, rising, with the surface interval the given share of the uniform one", () => {
    fc.assert(
      fc.property(fc.double({ min: 1e-3, max: 0.5, noNaN: true }), fc.integer({ min: 3, max: 80 }), fc.double({ min: 0.05, max: 1, noNaN: true }), (R, n, ratio) => {
        const r = nodePositions(R, n, ratio);
        expect(r[0]).toBe(0);
        expect(r[n - 1]).toBe(R);
        for (let i = 1; i < n; i++) expect(r[i]).toBeGreaterThan(r[i - 1]);
        const last = r[n - 1] - r[n - 2];
        expect(last / (R / (n - 1))).toBeCloseTo(ratio, 6);
        // Finer at the surface never makes an interval nearer the surface longer than one nearer the centre.
        for (let i = 2; i < n; i++) expect(r[i] - r[i - 1]).toBeLessThanOrEqual(r[i - 1] - r[i - 2] + 1e-9 * R);
      }),
    );
  });
  it("is uniform at ratio 1 and for one or two nodes", () => {
    expect(Array.from(nodePositions(0.04, 5, 1))).toEqual([0, 0.01, 0.02, 0.03, 0.04].map((x, i) => (i === 4 ? 0.04 : expect.closeTo(x, 15))));
    expect(Array.from(nodePositions(0.04, 2, 0.2))).toEqual([0, 0.04]);
    expect(Array.from(nodePositions(0.04, 1, 0.2))).toEqual([0]);
  });
});
