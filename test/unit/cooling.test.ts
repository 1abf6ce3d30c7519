import { describe, it, expect } from "vitest";
import { runCool, runCoolParsed, coolingRecord } from "../../lib/physics/cooling";
import { coolInputSchema, ICE_PADDLE_REFUSAL, type CoolInput } from "../../lib/schemas/cool";
import { runValidated } from "../../lib/schemas/run";
import { brent } from "../../lib/physics/numerics";
import { solve1D } from "../../lib/physics/solver1d";
import { simpleMaterial } from "../../lib/physics/properties";
import { coolingStages, coolingStageLines } from "../../lib/physics/compliance";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";

const rice = D.products.find((p) => p.name === "Steamed rice, full pan")!;
const chicken = D.products.find((p) => p.name.startsWith("Roast chicken"))!;
const fda = D.rulesets.find((r) => r.name.startsWith("US"))!;
const fsanz = D.rulesets.find((r) => r.name.startsWith("Australia"))!;
const england = D.rulesets.find((r) => r.name.startsWith("England"))!;

const base = (over: Partial<CoolInput> = {}): CoolInput => ({
  product: rice,
  start_C: 74,
  setup: { kind: "pan", size: "1/1", height_m: 0.1, depth_m: 0.05 },
  method: { kind: "walk_in" },
  ruleSet: fda,
  compare: false,
  searchDepth: false,
  horizon_s: 24 * 3600,
  ...over,
});
const stage = (r: ReturnType<typeof runCool>, n: 1 | 2) => r.stages.find((s) => s.stage === n)!;

describe("Brent's method (lib/physics/numerics.ts)", () => {
  it("finds the root of cos x − x to 1e-12 in fewer evaluations than bisection", () => {
    const r = brent((x) => Math.cos(x) - x, 0, 1, { xtol_abs: 1e-12 });
    expect(r.converged).toBe(true);
    expect(Math.abs(r.x - 0.7390851332151607)).toBeLessThan(1e-11);
    expect(r.evaluations).toBeLessThan(40); // bisection needs 40 halvings for 1e-12 on [0, 1]
  });
  it("handles a flat triple root, a root at an end and a step, and refuses a bracket without a sign change", () => {
    expect(Math.abs(brent((x) => (x - 1) ** 3, 0, 3, { xtol_abs: 1e-10 }).x - 1)).toBeLessThan(1e-3);
    expect(brent((x) => x - 2, 2, 5).x).toBe(2);
    const step = brent((x) => (x < 0.3 ? -1 : 1), 0, 1, { xtol_abs: 1e-9 });
    expect(Math.abs(step.x - 0.3)).toBeLessThan(1e-8);
    expect(() => brent((x) => x * x + 1, -1, 1)).toThrow(RangeError);
  });
});

describe("solver: a slab with a second face", () => {
  const mat = simpleMaterial({ rho_kg_m3: 1000, cSolid_J_kgK: 4000, cLiquid_J_kgK: 4000, kSolid_W_mK: 0.5, kLiquid_W_mK: 0.5, melt_C: -50, latent_J_kg: 0 });
  it("conserves energy with different coefficients and a temperature-dependent flux on the two faces", () => {
    const r = solve1D({
      shape: "slab",
      halfSize_m: 0.05,
      nodes: 31,
      material: mat,
      initial_C: 70,
      boundary: { kind: "convective", h_W_m2K: () => 8, fluid_C: () => 3, emissivity: 0.9, surfaceFlux: (_t, Ts) => ({ q_W_m2: -20 * (Ts - 3), dq_dT_W_m2K: -20 }) },
      innerBoundary: { kind: "convective", h_W_m2K: () => 100, fluid_C: () => 0 },
      tEnd_s: 4 * 3600,
      dt_s: 5,
      adaptive: { target_K: 0.3, dtMax_s: 120 },
    });
    expect(Math.abs(r.energyError_J) / Math.abs(r.storedChange_J)).toBeLessThan(1e-8);
    // The warmest point sits inside, nearer the weaker (top) face than the bath side.
    const i = r.profile_C.indexOf(Math.max(...r.profile_C));
    expect(i).toBeGreaterThan(0);
    expect(i).toBeLessThan(30);
    expect(i).toBeGreaterThan(15);
    expect(r.max_C![r.max_C!.length - 1]).toBeCloseTo(Math.max(...r.profile_C), 10);
  });
  it("refuses a second face on a cylinder", () => {
    expect(() =>
      solve1D({ shape: "cylinder", halfSize_m: 0.05, nodes: 11, material: mat, initial_C: 20, boundary: { kind: "fixed", T_C: () => 0 }, innerBoundary: { kind: "convective", h_W_m2K: () => 1, fluid_C: () => 0 }, tEnd_s: 10, dt_s: 1 }),
    ).toThrow(/only a slab/);
  });
});

describe("cooling stages as numbers", () => {
  it("coolingStages and coolingStageLines say the same; stage 2 counted in all (FDA) or after stage 1 (FSANZ)", () => {
    const curve = { t_s: [0, 3600, 7200, 14400, 21600], T_C: [70, 40, 20, 8, 4] };
    const a = coolingStages(fda, curve, 21600);
    expect(a.map((s) => s.line)).toEqual(coolingStageLines(fda, curve, 21600));
    expect(a[1].from_C).toBe(57);
    const b = coolingStages(fsanz, curve, 21600);
    expect(b[1].from_C).toBe(21);
    // Both reach 5 °C at the same moment: FSANZ counts it from the end of stage 1, FDA from its start.
    expect(b[0].countedFrom_s! + b[0].reached_s! + b[1].reached_s!).toBeCloseTo(a[0].countedFrom_s! + a[1].reached_s!, 6);
  });
});

describe("cooling planner: directions, through runCool on the demo rice", () => {
  it("deeper is slower, for both stages", () => {
    const t = [0.03, 0.05, 0.08].map((d) => runCool(base({ setup: { kind: "pan", size: "1/1", height_m: 0.1, depth_m: d } })));
    for (const n of [1, 2] as const) {
      expect(stage(t[0], n).reached_s!).toBeLessThan(stage(t[1], n).reached_s!);
      expect(stage(t[1], n).reached_s!).toBeLessThan(stage(t[2], n).reached_s!);
    }
  });
  it("a lid removes evaporation and slows the cooling", () => {
    const open = runCool(base());
    const lid = runCool(base({ setup: { kind: "pan", size: "1/1", height_m: 0.1, depth_m: 0.05, lid: true } }));
    expect(open.waterEvaporated_kg).toBeGreaterThan(0.05);
    expect(open.evaporationShare).toBeGreaterThan(0.2);
    expect(lid.waterEvaporated_kg).toBe(0);
    expect(stage(lid, 1).reached_s!).toBeGreaterThan(stage(open, 1).reached_s!);
    expect(stage(lid, 2).reached_s!).toBeGreaterThan(stage(open, 2).reached_s!);
  });
  it("damper air evaporates less and cools slower", () => {
    const dry = runCool(base({ method: { kind: "walk_in", relativeHumidity: 0.3 } }));
    const damp = runCool(base({ method: { kind: "walk_in", relativeHumidity: 0.95 } }));
    expect(damp.waterEvaporated_kg).toBeLessThan(dry.waterEvaporated_kg);
    expect(stage(damp, 1).reached_s!).toBeGreaterThan(stage(dry, 1).reached_s!);
  });
  it("an ice-water bath beats refrigerator air (stage 1), and in a walk-in beats it on both stages", () => {
    const air = runCool(base());
    const bath = runCool(base({ method: { kind: "ice_bath" } }));
    expect(stage(bath, 1).reached_s!).toBeLessThan(stage(air, 1).reached_s!);
    const bathInWalkIn = runCool(base({ method: { kind: "ice_bath", air_C: 3, relativeHumidity: 0.85, speed_m_s: 0.5 } }));
    expect(stage(bathInWalkIn, 1).reached_s!).toBeLessThan(stage(air, 1).reached_s!);
    expect(stage(bathInWalkIn, 2).reached_s!).toBeLessThan(stage(air, 2).reached_s!);
    // A lower water level wets less of the sides: slower (a narrow pan, where the sides matter).
    const narrow = (level: number) => runCool(base({ setup: { kind: "pan", size: "1/9", height_m: 0.1, depth_m: 0.06 }, method: { kind: "ice_bath", level_m: level } }));
    expect(stage(narrow(0.06), 1).reached_s!).toBeLessThan(stage(narrow(0.01), 1).reached_s!);
  });
  it("a blast chiller beats a walk-in on both stages; a wire rack beats a solid shelf", () => {
    const walk = runCool(base());
    const blast = runCool(base({ method: { kind: "blast_chiller" } }));
    for (const n of [1, 2] as const) expect(stage(blast, n).reached_s!).toBeLessThan(stage(walk, n).reached_s!);
    const shelf = runCool(base({ method: { kind: "walk_in", support: "shelf" } }));
    expect(stage(shelf, 1).reached_s!).toBeGreaterThan(stage(walk, 1).reached_s!);
  });
  it("stainless and aluminium pans cool alike and faster than a plastic one; the sides matter in a narrow pan", () => {
    const pan = (material: "stainless" | "aluminium" | "plastic", size: "1/1" | "1/9" = "1/1") => runCool(base({ setup: { kind: "pan", size, height_m: 0.1, depth_m: 0.05, material }, method: { kind: "ice_bath" } }));
    expect(stage(pan("plastic"), 1).reached_s!).toBeGreaterThan(stage(pan("stainless"), 1).reached_s!);
    // Both metal walls are negligible resistances beside the water film: within 1 %.
    expect(Math.abs(stage(pan("aluminium"), 1).reached_s! / stage(pan("stainless"), 1).reached_s! - 1)).toBeLessThan(0.01);
    expect(stage(pan("stainless", "1/9"), 1).reached_s!).toBeLessThan(stage(pan("stainless"), 1).reached_s!);
  });
});

describe("cooling planner: a surface that crosses the air temperature", () => {
  it("an ice-water bath under 3 °C air, 80 mm in a 2/1 pan, runs (the evaporation once took a coefficient that jumped there and the solver found no root)", () => {
    const r = runCool(base({ setup: { kind: "pan", size: "2/1", height_m: 0.2, depth_m: 0.08 }, method: { kind: "ice_bath", air_C: 3, relativeHumidity: 0.85 }, horizon_s: 30 * 3600 }));
    expect(stage(r, 1).reached_s).not.toBeNull();
    expect(Math.min(...r.series.map((p) => p.surface_C))).toBeLessThan(3);
    expect(r.energyBalanceError).toBeLessThan(1e-6);
  });
});

describe("cooling planner: answers", () => {
  it("the deepest layer: at that depth both stages are met, 3 mm deeper one is missed", () => {
    const r = runCool(base({ searchDepth: true }));
    expect(r.maxDepth.limitedBy).toBe("stages");
    const d = r.maxDepth_m!;
    const at = runCool(base({ setup: { kind: "pan", size: "1/1", height_m: 0.1, depth_m: d } }));
    expect(at.meetsAll).toBe(true);
    const deeper = runCool(base({ setup: { kind: "pan", size: "1/1", height_m: 0.1, depth_m: d + 0.003 } }));
    expect(deeper.meetsAll).toBe(false);
  });
  it("a pan that meets in full says the pan limits it; a method that cannot meet gives none", () => {
    const full = runCool(base({ setup: { kind: "pan", size: "1/1", height_m: 0.02, depth_m: 0.02 }, method: { kind: "blast_chiller" }, searchDepth: true }));
    expect(full.maxDepth).toMatchObject({ limitedBy: "pan" });
    expect(full.maxDepth_m).toBe(0.02);
    const warmRoom = runCool(base({ method: { kind: "walk_in", air_C: 12 }, searchDepth: true }));
    expect(warmRoom.maxDepth_m).toBeNull();
    expect(warmRoom.maxDepth.limitedBy).toBe("none");
  });
  it("the JSON names of the issue, the methods side by side, a closed energy balance and no NaN", () => {
    const r = runCool(base({ compare: true, searchDepth: true }));
    for (const s of r.stages) for (const k of ["from_C", "to_C", "limit_s", "reached_s", "meets"]) expect(s).toHaveProperty(k);
    expect(r.comparison!.map((c) => c.kind)).toEqual(["walk_in", "blast_chiller", "ice_bath", "cold_plate"]);
    expect(r.comparison![0].maxDepth_m).toBe(r.maxDepth_m);
    expect(r.energyBalanceError).toBeLessThan(1e-6);
    expect(r.series.length).toBeGreaterThan(20);
    expect(JSON.stringify(r)).not.toMatch(/NaN|null,"surface_C"/);
    expect(r.compliance.length).toBe(2);
  });
  it("a cold plate under warm room air: stage 2 missed, and the warning says where the slowest point settles", () => {
    const r = runCool(base({ method: { kind: "cold_plate" } }));
    expect(stage(r, 1).meets).toBe(true);
    expect(stage(r, 2).meets).toBe(false);
    expect(r.warnings.join(" ")).toMatch(/levels off near 1\d\.\d °C.*cover it or move the pan/);
  });
  it("a rule set without two-stage limits: nothing judged, a warning, no search", () => {
    const r = runCool(base({ ruleSet: england, searchDepth: true }));
    expect(r.stages).toEqual([]);
    expect(r.meetsAll).toBeNull();
    expect(r.maxDepth.limitedBy).toBe("not searched");
    expect(r.warnings.join(" ")).toMatch(/no two-stage cooling limit/);
  });
  it("a whole piece in chiller air: the centre is the slowest point", () => {
    const r = runCool({ product: chicken, start_C: 75, setup: { kind: "piece" }, method: { kind: "blast_chiller" }, ruleSet: fsanz, compare: true, searchDepth: true });
    expect(r.maxDepth_m).toBeNull();
    expect(r.comparison!.map((c) => c.kind)).toEqual(["walk_in", "blast_chiller"]);
    for (const p of r.series) expect(p.slowest_C).toBeGreaterThanOrEqual(p.surface_C - 1e-9);
    expect(stage(r, 1).reached_s).not.toBeNull();
  });
});

describe("cooling input: field-level messages, nothing computed", () => {
  const err = (input: unknown) => {
    const r = runValidated(coolInputSchema, input, runCoolParsed);
    expect(r.ok).toBe(false);
    return r.ok ? {} : r.fieldErrors;
  };
  it("refuses the ice paddle with the reason", () => {
    expect(err(base({ method: { kind: "ice_paddle" } }))["method.kind"]).toEqual([ICE_PADDLE_REFUSAL]);
  });
  it("names the field: food deeper than the pan, water over the rim, a piece in a bath, food colder than the coolant, a bad humidity", () => {
    expect(err(base({ setup: { kind: "pan", height_m: 0.04, depth_m: 0.05 } }))["setup.depth_m"][0]).toMatch(/does not fit/);
    expect(err(base({ method: { kind: "ice_bath", level_m: 0.2 } }))["method.level_m"][0]).toMatch(/rim/);
    expect(err(base({ setup: { kind: "piece" }, method: { kind: "ice_bath" } }))["setup.kind"][0]).toMatch(/pan/);
    expect(err(base({ start_C: 2 }))["start_C"][0]).toMatch(/warmer/);
    expect(err(base({ method: { kind: "walk_in", relativeHumidity: 60 } }))["method.relativeHumidity"][0]).toMatch(/fraction/);
    expect(Object.keys(err({ ...base(), method: { kind: "microwave" } }))).toContain("method.kind");
  });
  it("states the defaults once: a minimal input parses to the documented values", () => {
    const p = coolInputSchema.parse({ product: rice, start_C: 74, setup: { kind: "pan", depth_m: 0.04 }, method: { kind: "walk_in" }, ruleSet: fda });
    expect(p.setup).toMatchObject({ size: "1/1", height_m: 0.065, material: "stainless", wall_m: null, lid: false });
    expect(p.method).toMatchObject({ air_C: 3, speed_m_s: 0.5, relativeHumidity: 0.85, support: "rack" });
    expect(p).toMatchObject({ horizon_s: 36000, compare: true, searchDepth: true, emissivity: 0.9 });
  });
});

describe("cooling input: JSON Schema", () => {
  it("the zod schema converts (for `holdline schema cool` and /api/v1/schema/cool once wired) and lists the methods", async () => {
    const { z } = await import("zod");
    const js = JSON.stringify(z.toJSONSchema(coolInputSchema, { io: "input", unrepresentable: "any" }));
    for (const k of ["walk_in", "blast_chiller", "ice_bath", "cold_plate", "ice_paddle", "relativeHumidity", "depth_m", "coolStage1Max_s"]) expect(js).toContain(k);
  });
});

describe("the cooling record (the sheet a kitchen fills in)", () => {
  it("has the start, hourly checks and both deadlines, the model's value beside each, and blanks for probe and initials", () => {
    for (const rs of [fda, fsanz]) {
      const inp = coolInputSchema.parse(base({ ruleSet: rs, setup: { kind: "pan", size: "1/1", height_m: 0.065, depth_m: 0.04 } }));
      const r = runCoolParsed(inp);
      const rec = coolingRecord(inp, r);
      expect(rec.blanks).toEqual(expect.arrayContaining(["Probe reading (°C)", "Initials"]));
      const due = rec.rows.filter((x) => x.limit_C !== null);
      expect(due.map((x) => x.limit_C)).toEqual([rs.coolStage1To_C, rs.coolStage2To_C]);
      // The model meets a stage exactly when its value at the deadline is within the limit.
      expect(due[0].expected_C <= rs.coolStage1To_C! + 0.05).toBe(stage(r, 1).meets);
      expect(due[1].expected_C <= rs.coolStage2To_C! + 0.05).toBe(stage(r, 2).meets);
      expect(rec.rows[0]).toMatchObject({ t_s: 0, expected_C: 74 });
      for (let i = 1; i < rec.rows.length; i++) expect(rec.rows[i].t_s).toBeGreaterThanOrEqual(rec.rows[i - 1].t_s);
    }
  });
});

describe("cooling planner on random valid inputs (fast-check)", () => {
  it("never returns NaN or throws anything but a field error", async () => {
    const fc = await import("fast-check");
    const methods = [
      fc.record({ kind: fc.constant("walk_in" as const), air_C: fc.double({ min: -5, max: 15, noNaN: true }), speed_m_s: fc.double({ min: 0, max: 5, noNaN: true }), relativeHumidity: fc.double({ min: 0, max: 1, noNaN: true }), support: fc.constantFrom("rack" as const, "shelf" as const) }),
      fc.record({ kind: fc.constant("blast_chiller" as const), air_C: fc.double({ min: -35, max: 5, noNaN: true }), speed_m_s: fc.double({ min: 0, max: 10, noNaN: true }) }),
      fc.record({ kind: fc.constant("ice_bath" as const), water_C: fc.double({ min: -2, max: 10, noNaN: true }), level_m: fc.option(fc.double({ min: 0.001, max: 0.1, noNaN: true }), { nil: null }) }),
      fc.record({ kind: fc.constant("cold_plate" as const), plate_C: fc.double({ min: -20, max: 5, noNaN: true }) }),
    ];
    await fc.assert(
      fc.asyncProperty(
        fc.oneof(...methods),
        fc.double({ min: 0.002, max: 0.1, noNaN: true }),
        fc.constantFrom("1/1", "1/3", "1/9", "2/1"),
        fc.constantFrom("stainless", "aluminium", "plastic"),
        fc.boolean(),
        fc.double({ min: 30, max: 100, noNaN: true }),
        async (method, depth, size, material, lid, start) => {
          const input = { product: rice, start_C: start, setup: { kind: "pan", size, height_m: 0.1, depth_m: depth, material, lid }, method, ruleSet: fda, compare: false, searchDepth: false, horizon_s: 4 * 3600 };
          const r = runValidated(coolInputSchema, input, runCoolParsed);
          if (!r.ok) {
            expect(Object.keys(r.fieldErrors).length).toBeGreaterThan(0);
            return;
          }
          expect(JSON.stringify(r.result)).not.toMatch(/NaN|Infinity/);
          // The series is rounded to 0.01 K.
          for (const p of r.result.series) expect(p.slowest_C).toBeLessThanOrEqual(start + 0.006);
        },
      ),
      { numRuns: 25, seed: 14 },
    );
  });
});
