/**
 * Calibration from a logged trip, checked the way an estimator is checked: logs made by the model itself
 * with known factors plus Gaussian noise (parameter recovery with synthetic data), on user-level plans from
 * the demo library, through runCalibration as the page, CLI and API will call it. And the Student t
 * quantiles its intervals use, against the published table.
 */
import { describe, it, expect } from "vitest";
import { runCalibration, t95, type CalibrationResult } from "../../lib/physics/calibrate";
import { runHoldParsed } from "../../lib/physics/hold";
import { runThawParsed } from "../../lib/physics/thaw";
import { holdInputSchema } from "../../lib/schemas/hold";
import { thawInputSchema, type ThawInput } from "../../lib/schemas/thaw";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";
import { lunchPlan, P, syntheticCsv } from "../helpers/synthetic-log";

const NOISE_K = 0.15;
const within = (r: CalibrationResult, truth: Record<string, number>) => {
  for (const f of r.factors) {
    expect(f.identifiable, `${f.name}: ${f.note}`).toBe(true);
    expect(f.low!, f.name).toBeLessThanOrEqual(truth[f.name]);
    expect(f.high!, f.name).toBeGreaterThanOrEqual(truth[f.name]);
    // A useful interval: known to better than ±25 %.
    expect(f.high! / f.low!, f.name).toBeLessThan(1.5);
  }
};

describe("calibration: Student t quantiles (two-sided 95 %, standard statistical tables; from memory)", () => {
  it.each([[1, 12.706], [5, 2.571], [10, 2.228], [30, 2.042], [1000, 1.96]])("ν = %i: %f", (nu, t) => {
    expect(t95(nu)).toBeCloseTo(t, 3);
  });
});

describe("calibration: a hold plan recovers known factors from a synthetic log", () => {
  const truth = { wallConductance: 1.3, innerH: 0.8, contact: 2 };
  const made = runHoldParsed(holdInputSchema.parse({ ...lunchPlan, uncertainty: { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 }, calibration: { ...truth, source: "" } }));
  const t = made.series.map((p) => p.t_s);
  const text = syntheticCsv(
    [
      { header: "Inside air", t_s: t, T_C: made.series.map((p) => p.air_C) },
      { header: "Probe", t_s: t, T_C: made.series.map((p) => p.products[0].center_C) },
      { header: "Pack", t_s: t, T_C: made.series.map((p) => p.packs[0].T_C) },
    ],
    18000,
    300,
    NOISE_K,
  );
  const calibrate = (initial: Record<string, number>) =>
    runCalibration({
      planner: "hold",
      plan: lunchPlan,
      log: { name: "synthetic-lunch.csv", text },
      format: { time: { kind: "elapsed", column: "elapsed_min", unit: "min" }, channels: [{ column: "Inside air", role: "inside_air" }, { column: "Probe", role: "product" }, { column: "Pack", role: "pack" }] },
      initial,
    });

  it.each([
    ["the model as built", { wallConductance: 1, innerH: 1, contact: 1 }],
    ["low, high, low", { wallConductance: 0.5, innerH: 2, contact: 0.5 }],
    ["high, low, high", { wallConductance: 2, innerH: 0.5, contact: 4 }],
  ])("from %s, every factor within its 95-percent interval", (_, initial) => {
    const t0 = performance.now();
    const r = calibrate(initial);
    const ms = performance.now() - t0;
    console.log(
      `hold fit from ${JSON.stringify(initial)}: ${r.factors.map((f) => `${f.name} ${f.value.toFixed(3)} [${f.low!.toFixed(3)}, ${f.high!.toFixed(3)}]`).join(", ")}; RMS ${r.rms_K.toFixed(3)} K (before ${r.before.rms_K.toFixed(2)} K), max ${r.maxResidual_K.toFixed(2)} K; ${r.iterations} steps, ${r.modelRuns} model runs, ${(ms / 1000).toFixed(1)} s`,
    );
    within(r, truth);
    // With the right model the residual is the noise put in (RMS within 20 % of its standard deviation).
    expect(r.rms_K).toBeGreaterThan(0.8 * NOISE_K);
    expect(r.rms_K).toBeLessThan(1.2 * NOISE_K);
    expect(r.before.rms_K).toBeGreaterThan(3 * r.rms_K);
    expect(r.calibration).toMatchObject({ source: "synthetic-lunch.csv" });
    // The fitted factors, used as the plan's calibration, give the fit's residuals back.
    const again = runHoldParsed(holdInputSchema.parse({ ...lunchPlan, calibration: r.calibration }));
    expect(again.assumptions.join(" ")).toMatch(/Calibrated from synthetic-lunch\.csv/);
  });
});

describe("calibration: a thaw plan recovers a known surface factor", () => {
  const plan: ThawInput = { product: P("Cod fillets"), start_C: -18, ruleSet: D.rulesets[1], method: { kind: "fridge_air", air_C: 4, speed_m_s: 0.3 } };
  const truth = 1.6;
  const parsed = thawInputSchema.parse({ ...plan, endPoint_C: 99, horizon_s: 30 * 3600, calibration: { surfaceH: truth } });
  const made = runThawParsed(parsed);
  const t = made.series.map((p) => p.t_s);
  const text = syntheticCsv(
    [
      { header: "Core", t_s: t, T_C: made.series.map((p) => p.center_C) },
      { header: "Skin", t_s: t, T_C: made.series.map((p) => p.surface_C) },
    ],
    30 * 3600,
    600,
    NOISE_K,
    11,
    { unit: "F" },
  );
  it.each([[1], [0.4], [5]])("from a starting guess of %s, within its 95-percent interval (a °F log)", (g) => {
    const t0 = performance.now();
    const r = runCalibration({
      planner: "thaw",
      plan,
      log: { name: "cod-fridge.csv", text },
      format: { unit: "F", time: { kind: "elapsed", column: "elapsed_min", unit: "min" }, channels: [{ column: "Core", role: "product", point: "centre" }, { column: "Skin", role: "product", point: "surface" }] },
      initial: { surfaceH: g },
    });
    console.log(`thaw fit from ${g}: surfaceH ${r.factors[0].value.toFixed(3)} [${r.factors[0].low?.toFixed(3)}, ${r.factors[0].high?.toFixed(3)}]; RMS ${r.rms_K.toFixed(3)} K (before ${r.before.rms_K.toFixed(2)} K); ${r.modelRuns} runs, ${((performance.now() - t0) / 1000).toFixed(1)} s`);
    within(r, { surfaceH: truth });
    expect(r.rms_K).toBeLessThan(1.2 * NOISE_K);
  });
});
