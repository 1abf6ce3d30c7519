/**
 * Calibration from a logged trip along the user's paths: the registry entry (as the page's worker, the
 * server's pool and the CLI run it), `holdline calibrate --plan --log` and `holdline calibrate FILE`, the
 * first guess of a logger file's layout, and a box saved from a calibration planned with (its factors, its
 * "calibrated from" assumption and its band from the fitted intervals).
 * The logs are the model's own (test/helpers/synthetic-log.ts, the invented demo lunch run).
 */
import { describe, it, expect, beforeAll } from "vitest";
import { mkdtempSync, writeFileSync, readFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { plannerOf } from "../../lib/planners/registry";
import { runPlanner } from "../../lib/planners/run";
import { main } from "../../cli/holdline";
import { ROOT, STACK_TRACE } from "../helpers/cli-run";
import { lunchPlan, syntheticCsv } from "../helpers/synthetic-log";
import { exampleLogText, EXAMPLE_TRUTH } from "../../scripts/make-calibrate-example";
import { guessLogFormat } from "../../lib/calibration/guess-format";
import { calibratedShipper, calibratedBoxName } from "../../lib/calibration/calibrated-box";
import { runHoldParsed } from "../../lib/physics/hold";
import { runPlannerPieces } from "../../lib/planners/run";
import { TestBoard } from "../helpers/piece-board";
import { holdInputSchema, type HoldInput } from "../../lib/schemas/hold";
import { shipperSchema } from "../../lib/schemas/templates";
import type { CalibrationResult } from "../../lib/physics/calibrate";
import type { PlanView } from "../../lib/planners/types";
import { DEFAULT_UNIT_PREFS } from "../../lib/units";

const entry = plannerOf("calibrate");
const F = { ...DEFAULT_UNIT_PREFS, temperatureUnit: "F" as const };
const logText = exampleLogText();
const format = {
  skipRows: 1,
  time: { kind: "elapsed" as const, column: "elapsed_min", unit: "min" as const },
  channels: [
    { column: "Inside air", role: "inside_air" as const },
    { column: "Probe", role: "product" as const },
    { column: "Pack", role: "pack" as const },
  ],
};
const input = { planner: "hold", plan: lunchPlan, log: { name: "logger-trip.csv", text: logText }, format };

function capture() {
  let out = "";
  let err = "";
  return { io: { out: (s: string) => void (out += s), err: (s: string) => void (err += s) }, get out() { return out; }, get err() { return err; } };
}

describe("the calibrate planner through the registry", () => {
  let result: CalibrationResult;
  let parsed: unknown;
  beforeAll(async () => {
    const r = await runPlanner(entry, input);
    if (!r.ok) throw new Error(JSON.stringify(r.fieldErrors));
    result = r.result.result as CalibrationResult;
    parsed = r.result.parsed;
  }, 120_000);

  it("answers with factors (value, low, high), rms_K, maxResidual_K and warnings; the factors the log was made with lie inside their intervals", () => {
    expect(result.factors.map((f) => f.name)).toEqual(["wallConductance", "innerH", "contact"]);
    for (const f of result.factors) {
      const truth = EXAMPLE_TRUTH[f.name as keyof typeof EXAMPLE_TRUTH];
      expect(f.identifiable, f.note).toBe(true);
      expect(f.low!).toBeLessThanOrEqual(truth);
      expect(f.high!).toBeGreaterThanOrEqual(truth);
    }
    // (Line 8 of the file: a preamble line and the header come before the reading at 25 min.)
    // The log was made with 0.15 K of noise: the fit leaves about that.
    expect(result.rms_K).toBeGreaterThan(0.12);
    expect(result.rms_K).toBeLessThan(0.18);
    expect(result.maxResidual_K).toBeGreaterThan(result.rms_K);
    expect(Array.isArray(result.warnings)).toBe(true);
    expect(result.comparisonBefore.rms_K!).toBeGreaterThan(3 * result.rms_K);
  });

  it("the view and CSV are in the person's units: °F temperatures and °F residuals", () => {
    const v: PlanView = entry.view(parsed, result, F);
    const chart = v.charts.find((c) => c.testId === "calibrate-chart")!;
    expect(chart.unit).toBe("°F");
    expect(chart.lines.map((l) => l.label)).toEqual(expect.arrayContaining(["Inside air (logged)", "Inside air: model as built", "Inside air: fitted model"]));
    // The first inside-air reading, logged at 8.6 °C, is about 47.5 °F on the chart.
    const first = chart.data.find((d) => d.log0 !== undefined)!;
    expect(first.log0).toBeCloseTo((result.comparison.channels[0].log_C[0] * 9) / 5 + 32, 2);
    expect(v.facts.find((f) => f.testId === "calibrate-rms")!.value).toMatch(/°F/);
    const table = v.tables.find((t) => t.testId === "calibrate-factors")!;
    expect(table.rows).toHaveLength(3);
    expect(table.rows[0][2]).toMatch(/^\d\.\d+ – \d\.\d+$/);
    const csv = entry.csv(parsed, result, F);
    expect(Object.keys(csv[0])).toEqual(["t_s", "channel", "logged_F", "model_before_F", "model_after_F", "residual_F"]);
    const row = csv[5];
    expect(Number(row.residual_F)).toBeCloseTo(Number(row.logged_F) - Number(row.model_after_F), 2);
  });

  it("a malformed log is a field error naming row and column, not a crash", async () => {
    const bad = logText.replace(/\n(25\.000,)[^,]+,/, "\n$1warm,");
    const r = await runPlanner(entry, { ...input, log: { name: "bad.csv", text: bad } });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.fieldErrors["log.text"]?.[0]).toMatch(/row 8, "Inside air": "warm" is not a number/);
  });
});

describe("holdline calibrate", () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), "holdline-cal-"));
  const planFile = path.join(dir, "plan.json");
  const logFile = path.join(dir, "trip.csv");
  writeFileSync(planFile, JSON.stringify(lunchPlan));
  writeFileSync(logFile, logText);

  it("--plan FILE --log CSV: the first column is time, the rest inside air, product, pack; the answer names the factors", { timeout: 120_000 }, async () => {
    const c = capture();
    const code = await main(["calibrate", "--plan", planFile, "--log", logFile], c.io);
    expect(c.err).not.toMatch(STACK_TRACE);
    expect(code, c.err).toBe(0);
    const r = JSON.parse(c.out);
    expect(r.factors.map((f: { name: string }) => f.name)).toEqual(["wallConductance", "innerH", "contact"]);
    for (const f of r.factors) expect(f.low).toBeLessThan(f.high);
    expect(r.rms_K).toBeLessThan(0.2);
    expect(r.log.name).toBe("trip.csv");
  });

  it("--columns leaves columns out and --fit chooses the factors", { timeout: 120_000 }, async () => {
    const c = capture();
    expect(await main(["calibrate", "--plan", planFile, "--log", logFile, "--columns", "inside_air,-,-", "--fit", "wallConductance"], c.io)).toBe(0);
    const r = JSON.parse(c.out);
    expect(r.comparison.channels.map((x: { label: string }) => x.label)).toEqual(["Inside air"]);
    expect(r.factors.filter((f: { identifiable: boolean }) => f.identifiable).map((f: { name: string }) => f.name)).toEqual(["wallConductance"]);
  });

  it("a bad mapping, a missing --log and a file that cannot be read are refused with what to fix", async () => {
    const a = capture();
    expect(await main(["calibrate", "--plan", planFile, "--log", logFile, "--columns", "inside,probe"], a.io)).toBe(1);
    expect(a.err).toMatch(/Column mapping "inside"/);
    const b = capture();
    expect(await main(["calibrate", "--plan", planFile], b.io)).toBe(2);
    expect(b.err).toMatch(/--log CSV/);
    const semi = path.join(dir, "semi.csv");
    writeFileSync(semi, logText.replace(/,/g, ";"));
    const d = capture();
    expect(await main(["calibrate", "--plan", planFile, "--log", semi, "--delimiter", ","], d.io)).toBe(1);
    expect(d.err).toMatch(/one column only|No header row/);
    expect(d.err).not.toMatch(STACK_TRACE);
  });

  it("calibrate FILE runs the example input of public/examples (templates by name, resolved from the library)", async () => {
    const c = capture();
    const code = await main(["calibrate", path.join(ROOT, "public", "examples", "calibrate.json"), "--db", path.join(dir, "lib.db")], c.io);
    expect(code, c.err).toBe(0);
    const r = JSON.parse(c.out);
    expect(r.factors).toHaveLength(3);
    expect(JSON.parse(readFileSync(path.join(ROOT, "public", "examples", "calibrate.json"), "utf8")).log.text).toBe(logText);
  }, 120_000);
});

describe("a first guess of a logger file's layout", () => {
  it("a preamble line, elapsed minutes from the header, the columns in the usual order", () => {
    const g = guessLogFormat(logText, "hold");
    expect(g.ok).toBe(true);
    if (!g.ok) return;
    expect(g.format.skipRows).toBe(1);
    expect(g.format.time).toEqual({ kind: "elapsed", column: "elapsed_min", unit: "min" });
    expect(g.format.channels!.map((c) => c.role)).toEqual(["inside_air", "product", "pack"]);
  });

  it("ISO dates are recognised; a date like 14/07/2026 asks for the order instead of guessing it", () => {
    const iso = guessLogFormat("Time;Air\n2026-07-14T09:30:00;4,1\n2026-07-14T09:35:00;4,3\n", "hold", { decimal: "," });
    expect(iso.ok && iso.format.time).toEqual({ kind: "datetime", column: "Time", order: "iso" });
    const dm = guessLogFormat("Time,Air\n14/07/2026 09:30,4.1\n14/07/2026 09:35,4.3\n", "hold");
    expect(dm.ok).toBe(false);
    if (!dm.ok) {
      expect(dm.message).toMatch(/day_first or month_first/);
      expect(dm.header).toEqual(["Time", "Air"]);
    }
  });
});

describe("a box saved from a calibration, planned with", () => {
  let result: CalibrationResult;
  beforeAll(async () => {
    const r = await runPlanner(entry, input);
    if (!r.ok) throw new Error("fit");
    result = r.result.result as CalibrationResult;
  }, 120_000);
  const boxOf = () => {
    const box = calibratedShipper(holdInputSchema.parse(lunchPlan).shipper, result, { fittedOn: new Date("2026-07-14T12:00:00Z") });
    expect(box).not.toBeNull();
    return shipperSchema.parse(box);
  };

  it("is a new template named after the log and date, recording its source and every factor with its interval", () => {
    const box = boxOf();
    expect(box.name).toBe("Quillfield thin foam cooler — calibrated logger-trip.csv 2026-07-14");
    expect(box.calibration!.source).toBe("logger-trip.csv, fitted 2026-07-14");
    for (const f of result.factors) expect(box.calibration!.factors[f.name as "innerH"]).toEqual({ value: f.value, low: f.low, high: f.high });
    expect(calibratedBoxName("x".repeat(118), "a-long-logger-file-name.csv", "2026-07-14").length).toBeLessThanOrEqual(120);
  });

  it("the hold planner applies its factors, says it was calibrated, and draws its band from the fitted intervals", { timeout: 60_000 }, async () => {
    const box = boxOf();
    // One gel pack and a long run after the route, so that the load leaves its band and the band has ends.
    const shorter: HoldInput = { ...lunchPlan, packs: [{ ...lunchPlan.packs![0], count: 1 }], extendFraction: 3 };
    const plan: HoldInput = { ...shorter, shipper: box };
    const withBox = runHoldParsed(holdInputSchema.parse(plan));
    const explicit = runHoldParsed(holdInputSchema.parse({ ...shorter, calibration: { ...result.calibration } }));
    const asBuilt = runHoldParsed(holdInputSchema.parse(shorter));
    expect(withBox.assumptions.join(" ")).toMatch(/Calibrated from logger-trip\.csv, fitted 2026-07-14/);
    expect(withBox.assumptions.join(" ")).toMatch(/every corner of the fitted 95 % intervals \(wall conductance ×/);
    expect(explicit.assumptions.join(" ")).toMatch(/outer coefficient ±30 %/);
    // The central run is the fitted model (the same as the factors given by hand), not the box as built.
    expect(withBox.band.central).not.toBeNull();
    expect(withBox.band.central).toBe(explicit.band.central);
    expect(withBox.band.central).not.toBe(asBuilt.band.central);
    // The band: the fitted intervals (a few per cent) in place of ±30 % outer coefficient and ±10 % insulation k.
    const { low, central, high } = withBox.band as { low: number; central: number; high: number };
    expect(low).toBeLessThan(central);
    expect(high).toBeGreaterThan(central);
    expect(high - low).toBeLessThan((explicit.band.high! - explicit.band.low!) * 0.8);
    // Run in pieces on two threads, as the server does, the calibrated band is the same to the last digit.
    for (const helperTook of [1, 4]) {
      const board = new TestBoard().helper(helperTook);
      runPlannerPieces(plannerOf("hold"), plan, board, "helper");
      expect(runPlannerPieces(plannerOf("hold"), plan, board.lead(), "lead")).toEqual({ ok: true, value: withBox, parsed: expect.anything() });
    }
    // The registry's quick first answer (no band) stays a single run, also for a calibrated box.
    const quick = await runPlanner(plannerOf("hold"), plan, "quick");
    expect(quick.ok && quick.result.pending).toMatch(/uncertainty/);
    // The page's lead gives it from its own central run (PlannerPieces.quick): the same answer.
    const parsedPlan = holdInputSchema.parse(plan);
    const pieces = plannerOf("hold").pieces!.start(parsedPlan);
    pieces.runLead();
    const quickInput = plannerOf("hold").quick(parsedPlan)!.input;
    expect(pieces.quick!(quickInput)).toEqual(quick.ok && quick.result.result);
    expect(() => pieces.quick!(parsedPlan)).toThrow(/still has a band/);
  });

  it("a log that identifies nothing saves no box", () => {
    const flat = syntheticCsv([{ header: "Air", t_s: [0, 1e6], T_C: [5, 5] }], 1800, 300, 0.01);
    const none: CalibrationResult = { ...result, factors: result.factors.map((f) => ({ ...f, identifiable: false, low: null, high: null, value: 1 })) };
    expect(flat).toMatch(/^elapsed_min,Air/);
    expect(calibratedShipper(holdInputSchema.parse(lunchPlan).shipper, none, { fittedOn: new Date() })).toBeNull();
  });
});
