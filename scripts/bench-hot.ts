/**
 * tsx scripts/bench-hot.ts [hold|size|all] — the two planner timings the solver-speed goals name, quickly:
 * a hold plan with its full uncertainty band (warm, median) and a 2,000-candidate sizing (cold, with the
 * worker start-up, and warm), with step and Newton counts. The hold figures are CPU time of this
 * process (steadier than wall time on a shared machine); the sizing figures are wall time. Nothing is asserted.
 */
import { runHoldParsed } from "../lib/physics/hold";
import { runSizing } from "../lib/physics/sizing";
import { nodePool } from "../cli/size-pool";
import path from "node:path";
import { cliBundleIsStale } from "./source-stamp.mjs";
import { bundle } from "./bundle.mjs";
import { median } from "./bench-util";
import { holdInput, sizeInput } from "./bench-cases";

const what = process.argv[2] ?? "all";
/** CPU milliseconds of each of `runs` timed calls after `warm` untimed ones. */
function cpu(fn: () => unknown, runs: number, warm: number): number[] {
  for (let i = 0; i < warm; i++) fn();
  const out: number[] = [];
  for (let i = 0; i < runs; i++) {
    const c = process.cpuUsage();
    fn();
    const d = process.cpuUsage(c);
    out.push((d.user + d.system) / 1000);
  }
  return out;
}
const ROOT = path.resolve(import.meta.dirname, "..");
if (what !== "hold" && cliBundleIsStale(ROOT)) await bundle({ quiet: true });

if (what === "hold" || what === "all") {
  const single = holdInput(false);
  const band = holdInput(true);
  let r = runHoldParsed(single);
  const h1 = cpu(() => (r = runHoldParsed(single)), 40, 20);
  let rb = runHoldParsed(band);
  const h9 = cpu(() => (rb = runHoldParsed(band)), 20, 10);
  console.log(`hold one plan (CPU): ${median(h1).toFixed(2)} ms (${r.steps} steps, ${r.newtonIterations} Newton), hold ${(r.band.central! / 3600).toFixed(4)} h`);
  console.log(`hold with band (CPU): ${median(h9).toFixed(2)} ms; band ${rb.band.low === null ? "-" : (rb.band.low / 3600).toFixed(4)} / ${rb.band.central === null ? "-" : (rb.band.central / 3600).toFixed(4)} / ${rb.band.high === null ? "-" : (rb.band.high / 3600).toFixed(4)} h`);
}
if (what === "size" || what === "all") {
  // process.cpuUsage counts every thread of the process, the worker threads included.
  const cpuMs = (c: NodeJS.CpuUsage) => (c.user + c.system) / 1000;
  const inp = sizeInput(true);
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  const pool = nodePool(inp);
  const cold = await runSizing(inp, pool.evaluate);
  const coldMs = performance.now() - t0;
  const coldCpu = cpuMs(process.cpuUsage(c0));
  const t1 = performance.now();
  const c1 = process.cpuUsage();
  const warm = await runSizing(inp, pool.evaluate);
  const warmMs = performance.now() - t1;
  const warmCpu = cpuMs(process.cpuUsage(c1));
  await pool.close();
  console.log(`sizing ${warm.candidates.length} candidates, 2 worker threads: cold ${coldMs.toFixed(0)} ms wall, ${coldCpu.toFixed(0)} ms CPU (pool created inside); warm ${warmMs.toFixed(0)} ms wall, ${warmCpu.toFixed(0)} ms CPU; ${warm.evaluated} run, ${warm.pruned} pruned; front ${JSON.stringify(cold.pareto) === JSON.stringify(warm.pareto) ? "same" : "DIFFERS"} (${warm.pareto.length})`);
}
