/**
 * Writes the calibration examples under public/examples/: logger-trip.csv, an invented logger file made by
 * Holdline's own model (the demo lunch run with known factors plus seeded noise: not a real trip), the
 * hold plan it belongs to (calibrate-plan.json, templates by name) and the whole calibrate input
 * (calibrate.json). Run: node --import tsx scripts/make-calibrate-example.ts
 */
import { writeFileSync } from "node:fs";
import path from "node:path";
import { runHoldParsed } from "../lib/physics/hold";
import { holdInputSchema } from "../lib/schemas/hold";
import { lunchPlan, syntheticCsv } from "../test/helpers/synthetic-log";
import { EXAMPLE_PLAN } from "../lib/calibration/example";

/** The factors the invented trip was made with (the fit should find them within its intervals). */
export const EXAMPLE_TRUTH = { wallConductance: 1.25, innerH: 0.85, contact: 1.6 };
export const EXAMPLE_NOISE_K = 0.15;
export const EXAMPLE_PREAMBLE = "Invented demo data: made by Holdline's own model of the demo lunch run (not a real trip)";

export function exampleLogText(): string {
  // The "trip" stands for reality, so it is made with a fine step error (1/8 of the planner's, as a fit runs).
  const made = runHoldParsed(holdInputSchema.parse({ ...lunchPlan, uncertainty: { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 }, calibration: { ...EXAMPLE_TRUTH, source: "" } }), { errorScale: 1 / 8 });
  const t = made.series.map((p) => p.t_s);
  const csv = syntheticCsv(
    [
      { header: "Inside air", t_s: t, T_C: made.series.map((p) => p.air_C) },
      { header: "Probe", t_s: t, T_C: made.series.map((p) => p.products[0].center_C) },
      { header: "Pack", t_s: t, T_C: made.series.map((p) => p.packs[0].T_C) },
    ],
    5 * 3600,
    300,
    EXAMPLE_NOISE_K,
    23,
  );
  return `${EXAMPLE_PREAMBLE}\n${csv}\n`;
}


if (import.meta.url === `file://${process.argv[1]}`) {
  const dir = path.join(import.meta.dirname, "..", "public", "examples");
  const text = exampleLogText();
  writeFileSync(path.join(dir, "logger-trip.csv"), text);
  writeFileSync(path.join(dir, "calibrate-plan.json"), JSON.stringify(EXAMPLE_PLAN, null, 2) + "\n");
  const input = {
    planner: "hold",
    plan: EXAMPLE_PLAN,
    log: { name: "logger-trip.csv", text },
    format: {
      skipRows: 1,
      time: { kind: "elapsed", column: "elapsed_min", unit: "min" },
      channels: [
        { column: "Inside air", role: "inside_air" },
        { column: "Probe", role: "product", line: 0, point: "centre" },
        { column: "Pack", role: "pack", line: 0 },
      ],
    },
  };
  writeFileSync(path.join(dir, "calibrate.json"), JSON.stringify(input, null, 2) + "\n");
  console.log(`wrote logger-trip.csv (${text.split("\n").length - 1} lines), calibrate-plan.json and calibrate.json`);
}
