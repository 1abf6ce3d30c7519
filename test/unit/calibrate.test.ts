import { describe, it, expect } from "vitest";
import { runCalibration, LogFileError, routeFromOutsideAir } from "../../lib/physics/calibrate";
import { runHoldParsed } from "../../lib/physics/hold";
import { runThawParsed } from "../../lib/physics/thaw";
import { holdInputSchema, type HoldInput } from "../../lib/schemas/hold";
import { thawInputSchema } from "../../lib/schemas/thaw";
import { calibrateInputSchema, type CalibrateInput } from "../../lib/schemas/calibrate";
import { runValidated } from "../../lib/schemas/run";
import { jsonSchemaOf } from "../../lib/schemas/json-schema";
import { parseLogCsv } from "../../lib/calibration/log-csv";
import { compareHoldWithLog, resolvePlanStart } from "../../lib/calibration/align";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";
import { lunchPlan, K, P, S, syntheticCsv } from "../helpers/synthetic-log";

const noBand = { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 };
const plan: HoldInput = lunchPlan;
const run = (x: HoldInput) => runHoldParsed(holdInputSchema.parse({ ...x, uncertainty: noBand }));
const elapsed = { kind: "elapsed" as const, column: "elapsed_min", unit: "min" as const };
const curves = (r: ReturnType<typeof run>) => {
  const t = r.series.map((p) => p.t_s);
  return {
    air: { header: "Air", t_s: t, T_C: r.series.map((p) => p.air_C) },
    probe: { header: "Probe", t_s: t, T_C: r.series.map((p) => p.products[0].center_C) },
    pack: { header: "Pack", t_s: t, T_C: r.series.map((p) => p.packs[0]?.T_C ?? 0) },
  };
};

describe("calibration factors on the plan inputs", () => {
  it("factors of 1 change nothing; a leakier wall, a higher inside coefficient and better contact each change the curves", () => {
    const base = run(plan);
    const ones = run({ ...plan, calibration: { wallConductance: 1, innerH: 1, contact: 1 } });
    expect(ones.series.at(-1)!.products[0].center_C).toBeCloseTo(base.series.at(-1)!.products[0].center_C, 9);
    const leaky = run({ ...plan, calibration: { wallConductance: 2 } });
    expect(leaky.series.at(-1)!.packs[0].latentLeft).toBeLessThan(base.series.at(-1)!.packs[0].latentLeft);
    expect(leaky.ua.total_W_K).toBeGreaterThan(base.ua.total_W_K);
    expect(run({ ...plan, calibration: { innerH: 2 } }).innerH_W_m2K).toBeCloseTo(2 * base.innerH_W_m2K, 9);
    const contact = run({ ...plan, calibration: { contact: 4 } });
    expect(contact.series.at(-1)!.products[0].center_C).not.toBeCloseTo(base.series.at(-1)!.products[0].center_C, 3);
    expect(contact.assumptions.join(" ")).toMatch(/pack contact ×4\.00/);
  });

  it("the thaw surface factor scales the coefficient of the chosen method only", () => {
    const thaw = { product: P("Cod fillets"), start_C: -18, ruleSet: D.rulesets[1], method: { kind: "running_water" as const, water_C: 15, speed_m_s: 0.05 }, compare: true };
    const a = runThawParsed(thawInputSchema.parse(thaw));
    const b = runThawParsed(thawInputSchema.parse({ ...thaw, calibration: { surfaceH: 0.5, source: "cod.csv" } }));
    expect(b.thawTime_s!).toBeGreaterThan(a.thawTime_s!);
    expect(b.h_W_m2K).toBeCloseTo(0.5 * a.h_W_m2K, 6);
    expect(b.assumptions.join(" ")).toMatch(/Calibrated from cod\.csv/);
    const fridge = (r: typeof a) => r.comparison!.find((m) => m.kind === "fridge_air")!.thawTime_s;
    expect(fridge(b)).toBe(fridge(a));
  });

  it("a factor out of range is refused by the schema with its field", () => {
    const r = holdInputSchema.safeParse({ ...plan, calibration: { wallConductance: 0 } });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].path).toEqual(["calibration", "wallConductance"]);
  });
});

describe("plan against log", () => {
  it("a log that is the plan itself, started 10 minutes before it, aligns to zero residual", () => {
    const r = run(plan);
    const c = curves(r);
    const text = syntheticCsv([c.air, c.probe], 9000, 300, 0, 1, { offset_s: 600 });
    const parsed = parseLogCsv(text, { time: elapsed, channels: [{ column: "Air", role: "inside_air" }, { column: "Probe", role: "product" }] });
    if (!parsed.ok) throw new Error("log not read");
    const cmp = compareHoldWithLog(holdInputSchema.parse({ ...plan, uncertainty: noBand }), r, parsed.log, resolvePlanStart(parsed.log, 600));
    expect(cmp.channels).toHaveLength(2);
    expect(cmp.channels[0].leftOut).toBe(2);
    expect(cmp.maxResidual_K!).toBeLessThan(2e-3);
    // Misaligned, the gap shows.
    const off = compareHoldWithLog(holdInputSchema.parse({ ...plan, uncertainty: noBand }), r, parsed.log, 0);
    expect(off.maxResidual_K!).toBeGreaterThan(0.5);
    expect(off.maxResidualAt!.label).toBe("Air");
  });

  it("a plan start given as a date-time on a date-time log", () => {
    const parsed = parseLogCsv("Time,Air\n2026-07-14T09:00:00,5\n2026-07-14T10:00:00,6\n", { time: { kind: "datetime", column: "Time", order: "iso" }, channels: [{ column: "Air", role: "inside_air" }] });
    if (!parsed.ok) throw new Error("log not read");
    expect(resolvePlanStart(parsed.log, "2026-07-14T09:15:00")).toBe(900);
    expect(() => resolvePlanStart(parsed.log, "2026-07-14T12:00:00")).toThrow(/outside the log/);
  });

  it("logged outside air becomes the route's air, keeping its speed, sun and lid openings", () => {
    const route = holdInputSchema.parse({ ...plan }).route;
    const t = Array.from({ length: 301 }, (_, i) => i * 60);
    const r = routeFromOutsideAir(route, t, t.map(() => 20), 18000);
    expect(r.segments.length).toBeLessThanOrEqual(100);
    expect(r.segments.reduce((a, s) => a + s.duration_s, 0)).toBeCloseTo(18000, 6);
    expect(r.segments.every((s) => s.airTemp_C === 20)).toBe(true);
    expect(r.segments.reduce((a, s) => a + s.lidOpenings, 0)).toBe(route.segments.reduce((a, s) => a + s.lidOpenings, 0));
    expect(r.segments.some((s) => s.sun_W_m2 > 0)).toBe(true);
  });
});

describe("calibration: what a log cannot tell", () => {
  it("a short, flat log: every factor reported as not identifiable and held at 1, not fitted", () => {
    const made = run({ ...plan, calibration: { wallConductance: 1.5, innerH: 1, contact: 1 } });
    // Ten minutes of a probe reading: with twenty, the pack contact is already identified (interval 0.58–1.02
    // around the true 1, second-order solver), so this is the log that really cannot tell any factor.
    const text = syntheticCsv([curves(made).probe], 600, 120, 0.15, 3);
    const r = runCalibration({ planner: "hold", plan, log: { name: "short.csv", text }, format: { time: elapsed, channels: [{ column: "Probe", role: "product" }] } });
    for (const f of r.factors) {
      expect(f.identifiable, f.name).toBe(false);
      expect(f.value).toBe(1);
      expect(f.low).toBeNull();
      expect(f.high).toBeNull();
    }
    const w = r.warnings.join(" ");
    expect(w).toMatch(/flat trace/);
    expect(w).toMatch(/ends before pack line 1 has melted/);
    expect(w).toMatch(/not identifiable/);
  });

  it("no packs: the contact factor has nothing to act on; the wall factor is still fitted", () => {
    const hot: HoldInput = { ...plan, products: [{ product: P("Steamed rice"), count: 1, start_C: 85 }], packs: [], shipper: S("Quillfield thick"), ruleSet: D.rulesets[0] };
    const truth = 1.4;
    const made = run({ ...hot, calibration: { wallConductance: truth } });
    const c = curves(made);
    const text = syntheticCsv([c.air, c.probe], 13500, 300, 0.15, 5);
    const r = runCalibration({ planner: "hold", plan: hot, log: { name: "rice.csv", text }, format: { time: elapsed, channels: [{ column: "Air", role: "inside_air" }, { column: "Probe", role: "product" }] }, fit: ["wallConductance", "contact"] });
    const wall = r.factors.find((f) => f.name === "wallConductance")!;
    const contact = r.factors.find((f) => f.name === "contact")!;
    expect(contact.identifiable).toBe(false);
    expect(contact.value).toBe(1);
    expect(contact.note).toMatch(/barely respond/);
    expect(wall.identifiable).toBe(true);
    expect(wall.low!).toBeLessThanOrEqual(truth);
    expect(wall.high!).toBeGreaterThanOrEqual(truth);
    expect(r.factors.find((f) => f.name === "innerH")!.note).toMatch(/not asked for/);
  });

  it("a logged outside-air channel drives the model instead of the route", () => {
    const logged = { ...plan, route: { ...D.routes[0], segments: [{ ...D.routes[0].segments[0], duration_s: 18000, airTemp_C: 18 }] } };
    const made = run({ ...logged, calibration: { wallConductance: 1.2 } });
    const c = curves(made);
    const outside = { header: "Outside", t_s: [0, 18000], T_C: [18, 18] };
    const text = syntheticCsv([c.air, c.probe, outside], 18000, 300, 0.1, 9);
    const input = (use: boolean): CalibrateInput => ({
      planner: "hold",
      plan: { ...plan, route: { ...D.routes[0], segments: [{ ...D.routes[0].segments[0], duration_s: 18000, airTemp_C: 30 }] } },
      log: { name: "outside.csv", text },
      format: { time: elapsed, channels: [{ column: "Air", role: "inside_air" }, { column: "Probe", role: "product" }, { column: "Outside", role: "outside_air" }] },
      fit: ["wallConductance"],
      useLoggedOutsideAir: use,
    });
    const withAir = runCalibration(input(true));
    expect(withAir.factors[0].low!).toBeLessThanOrEqual(1.2);
    expect(withAir.factors[0].high!).toBeGreaterThanOrEqual(1.2);
    expect(withAir.assumptions.join(" ")).toMatch(/logged outside air/);
    expect(withAir.comparison.channels.map((ch) => ch.role)).not.toContain("outside_air");
    // Without it the route's 30 °C air is compared with the logged 18 °C and the fit is worse.
    const without = runCalibration(input(false));
    expect(without.rms_K).toBeGreaterThan(withAir.rms_K);
  });
});

describe("calibration: bad input", () => {
  const good: CalibrateInput = { planner: "hold", plan, log: { name: "x.csv", text: "" }, format: { time: elapsed, channels: [{ column: "Air", role: "inside_air" }] } };
  it.each([
    ["wrong delimiter", "elapsed_min;Air\n0;5\n5;6\n", 1, null],
    ["text in a number column", "elapsed_min,Air\n0,5\n5,warm\n10,6\n", 3, "Air"],
    ["time going backwards", "elapsed_min,Air\n0,5\n10,6\n5,6\n", 4, "elapsed_min"],
    ["a single row", "elapsed_min,Air\n0,5\n", 2, null],
  ])("%s: refused with row and column, as a field error on the log", (_, text, row, column) => {
    let err: unknown = null;
    try {
      runCalibration({ ...good, log: { name: "bad.csv", text } });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(LogFileError);
    expect((err as LogFileError).problems[0]).toMatchObject({ row, column });
    const v = runValidated(calibrateInputSchema, { ...good, log: { name: "bad.csv", text } }, (p) => runCalibration(p));
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.fieldErrors["log.text"][0]).toMatch(new RegExp(`row ${row}`));
  });

  it("a channel naming a product line the plan does not have", () => {
    const v = runValidated(calibrateInputSchema, { ...good, log: { name: "x.csv", text: "elapsed_min,Air\n0,5\n5,6\n10,7\n" }, format: { time: elapsed, channels: [{ column: "Air", role: "product", line: 3 }] } }, (p) => runCalibration(p));
    expect(v.ok).toBe(false);
    if (!v.ok) expect(Object.keys(v.fieldErrors)[0]).toBe("format.channels.0.line");
  });

  it("a plan the planner refuses: the field error is named under plan", () => {
    const tooMany = { ...plan, packs: [{ pack: K("Water ice"), count: 200, conditioning_C: -18 }] };
    const v = runValidated(calibrateInputSchema, { ...good, plan: tooMany, log: { name: "x.csv", text: "elapsed_min,Air\n0,5\n5,6\n10,7\n" } }, (p) => runCalibration(p));
    expect(v.ok).toBe(false);
    if (!v.ok) expect(Object.keys(v.fieldErrors)[0]).toBe("plan.products");
  });

  it("a pack channel on a thaw plan, and a plan start past the log", () => {
    const thaw = { planner: "thaw" as const, plan: { product: P("Cod fillets"), ruleSet: D.rulesets[1], method: { kind: "fridge_air" as const, air_C: 4, speed_m_s: 0.3 } }, log: { name: "x.csv", text: "elapsed_min,T\n0,-18\n60,-10\n120,-5\n" } };
    const a = runValidated(calibrateInputSchema, { ...thaw, format: { time: elapsed, channels: [{ column: "T", role: "pack" }] } }, (p) => runCalibration(p));
    expect(a.ok).toBe(false);
    if (!a.ok) expect(Object.keys(a.fieldErrors)[0]).toBe("format.channels.0.role");
    const b = runValidated(calibrateInputSchema, { ...thaw, planStart: 7190, format: { time: elapsed, channels: [{ column: "T", role: "product" }] } }, (p) => runCalibration(p));
    expect(b.ok).toBe(false);
    if (!b.ok) expect(b.fieldErrors["log.text"][0]).toMatch(/nothing to fit/);
  });

  it("the schema refuses unknown factors and prints as JSON Schema", () => {
    expect(calibrateInputSchema.safeParse({ ...good, log: { name: "x", text: "a" }, fit: ["sunshine"] }).success).toBe(false);
    const js = jsonSchemaOf("calibrate") as { oneOf?: unknown[] };
    expect(js.oneOf).toHaveLength(2);
  });
});
