/**
 * npx tsx scripts/bench-calibrate.ts — speed and recovery of calibration from a logged trip (nothing
 * asserted; tests never time anything). The invented example log (public/examples/logger-trip.csv, made
 * by the model with known factors plus 0.15 K noise) fitted through the registry entry from several
 * starting guesses: each fit's time, steps and model runs, and the fitted factors with their 95 %
 * intervals beside the true ones.
 */
import { plannerOf } from "../lib/planners/registry";
import { runPlanner } from "../lib/planners/run";
import type { CalibrationResult } from "../lib/physics/calibrate";
import { lunchPlan } from "../test/helpers/synthetic-log";
import { exampleLogText, EXAMPLE_TRUTH, EXAMPLE_NOISE_K } from "./make-calibrate-example";
import { median } from "./bench-util";

const entry = plannerOf("calibrate");
const text = exampleLogText();
const format = {
  skipRows: 1,
  time: { kind: "elapsed", column: "elapsed_min", unit: "min" },
  channels: [
    { column: "Inside air", role: "inside_air" },
    { column: "Probe", role: "product" },
    { column: "Pack", role: "pack" },
  ],
};
const guesses = [
  { wallConductance: 1, innerH: 1, contact: 1 },
  { wallConductance: 0.5, innerH: 2, contact: 0.5 },
  { wallConductance: 2, innerH: 0.5, contact: 4 },
  { wallConductance: 3, innerH: 3, contact: 0.3 },
];

async function main() {
  console.log(`Calibration, demo lunch run, 5 h log every 5 min (61 rows × 3 channels), noise ${EXAMPLE_NOISE_K} K; truth ${JSON.stringify(EXAMPLE_TRUTH)}`);
  // Warm-up run (JIT), not counted.
  await runPlanner(entry, { planner: "hold", plan: lunchPlan, log: { name: "logger-trip.csv", text }, format });
  const times: number[] = [];
  for (const g of guesses) {
    const t0 = performance.now();
    const r = await runPlanner(entry, { planner: "hold", plan: lunchPlan, log: { name: "logger-trip.csv", text }, format, initial: g });
    const ms = performance.now() - t0;
    times.push(ms);
    if (!r.ok) throw new Error(JSON.stringify(r.fieldErrors));
    const c = r.result.result as CalibrationResult;
    const fs = c.factors.map((f) => {
      const truth = EXAMPLE_TRUTH[f.name as keyof typeof EXAMPLE_TRUTH];
      const inside = f.low !== null && f.high !== null && f.low <= truth && truth <= f.high;
      return `${f.name} ${f.value.toFixed(3)} [${f.low?.toFixed(3)}, ${f.high?.toFixed(3)}] (true ${truth}${inside ? ", inside" : ", OUTSIDE"})`;
    });
    console.log(`  from ${JSON.stringify(g)}: ${ms.toFixed(0)} ms, ${c.iterations} steps, ${c.modelRuns} model runs; RMS ${c.rms_K.toFixed(3)} K, max ${c.maxResidual_K.toFixed(2)} K\n    ${fs.join("\n    ")}`);
  }
  console.log(`  one fit: median ${median(times).toFixed(0)} ms (min ${Math.min(...times).toFixed(0)}, max ${Math.max(...times).toFixed(0)})`);
}
void main();
