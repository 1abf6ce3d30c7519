/**
 * npm run bench — prints speed figures. Nothing here is asserted; tests never time anything.
 */
import { foodThermal } from "../lib/physics/properties";
import { solve1D } from "../lib/physics/solver1d";
import { oneTermTheta, seriesTheta } from "../lib/physics/conduction";
import { runWarmup } from "../lib/physics/warmup";
import { DEMO_SCENARIO } from "../lib/db/demo-scenario";
import { runHoldParsed } from "../lib/physics/hold";
import { runThawParsed } from "../lib/physics/thaw";
import { thawInputSchema } from "../lib/schemas/thaw";
import { runSizing, evaluateHere } from "../lib/physics/sizing";
import { nodePool } from "../cli/size-pool";
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { cliBundleIsStale } from "./source-stamp.mjs";
import { bundle } from "./bundle.mjs";
import { median, time } from "./bench-util";
import { holdInput, sizeInput } from "./bench-cases";
import { Piscina } from "piscina";
import { runWhole } from "../app/_server/calc-pieces";
import type { CalcAnswer, CalcJob, HelperAnswer } from "../app/_server/calc-worker";
import { Worker } from "node:worker_threads";
import * as esbuild from "esbuild";
import { SharedBoard } from "../lib/planners/shared-board";
import { DEFAULT_UNIT_PREFS } from "../lib/units";
import type { FromPlannerWorker } from "../lib/planners/worker-protocol";

const ROOT = path.resolve(import.meta.dirname, "..");
// The sizer's threads and the CLI timings below run the bundle: build it if the sources moved on.
if (cliBundleIsStale(ROOT)) await bundle({ quiet: true });


const cod = DEMO_SCENARIO.products.find((p) => p.name.startsWith("Cod"))!;
const food = foodThermal({ composition: cod.composition, initialFreezing_C: cod.initialFreezing_C });

// 1. Numerical solver: 50 mm frozen cod block (slab half-thickness 25 mm) from −18 °C in 20 °C air, h = 10 W/(m²·K), 48 h.
const thaw = (nodes: number, adaptive: { target_K: number; dtMax_s: number } | undefined, dt: number) =>
  solve1D({ shape: "slab", halfSize_m: 0.025, nodes, material: food, initial_C: -18, boundary: { kind: "convective", h_W_m2K: () => 10, fluid_C: () => 20 }, tEnd_s: 48 * 3600, dt_s: dt, adaptive });
const centreAt0 = (r: ReturnType<typeof thaw>) => {
  for (let i = 1; i < r.t_s.length; i++) if (r.center_C[i] > 0) return r.t_s[i - 1] + ((0 - r.center_C[i - 1]) / (r.center_C[i] - r.center_C[i - 1])) * (r.t_s[i] - r.t_s[i - 1]);
  return NaN;
};
const ref = thaw(2000, undefined, 5);
const tRef = centreAt0(ref);
const fast = thaw(100, { target_K: 2, dtMax_s: 1800 }, 30);
const runsSolver = time(() => thaw(100, { target_K: 2, dtMax_s: 1800 }, 30), 30);
const t100 = centreAt0(fast);
let worstT = 0;
for (let i = 0; i < fast.t_s.length; i++) {
  const j = ref.t_s.findIndex((t) => t >= fast.t_s[i]);
  if (j > 0) worstT = Math.max(worstT, Math.abs(fast.center_C[i] - ref.center_C[j]));
}

console.log("Holdline bench (median of repeated runs, this machine)\n");
console.log("Numerical enthalpy solver — 100 nodes, 48 h simulated, thaw of a 50 mm frozen cod block (−18 °C → 20 °C air, h = 10 W/(m²·K))");
console.log(`  median ${median(runsSolver).toFixed(2)} ms per run (${runsSolver.length} runs); ${fast.steps} adaptive implicit steps, ${fast.newtonIterations} Newton iterations`);
console.log(`  centre reaches 0 °C at ${(t100 / 3600).toFixed(3)} h vs ${(tRef / 3600).toFixed(3)} h with 2,000 nodes and 5 s steps (${(((t100 - tRef) / tRef) * 100).toFixed(2)} %)`);
console.log(`  largest centre-temperature difference from the 2,000-node reference at the same time: ${worstT.toFixed(2)} K (step-time sampling)`);
console.log(`  energy balance error ${(Math.abs(fast.energyError_J) / Math.abs(fast.storedChange_J)).toExponential(1)} of the heat stored`);

// 2. Series evaluations.
let sink = 0;
const N = 200000;
const one = time(() => {
  for (let i = 0; i < N; i++) sink += oneTermTheta("cylinder", 0.5 + (i % 7), 0.4, 0.3);
}, 5);
const ser = time(() => {
  for (let i = 0; i < N; i++) sink += seriesTheta("sphere", 0.5 + (i % 7), 0.05 + (i % 5) * 0.1, 0.7);
}, 5);
console.log("\nAnalytic conduction (eigenvalues cached per Biot number)");
console.log(`  one-term evaluation: median ${((median(one) / N) * 1000).toFixed(3)} µs`);
console.log(`  exact multi-term series (as many terms as Fo needs, Fo ≥ 0.05): median ${((median(ser) / N) * 1000).toFixed(3)} µs`);

// 3. The whole warm-up check, as the page runs it.
const rs = DEMO_SCENARIO.rulesets[0];
const cases: [string, number, number, "chilledMax" | "hotHoldMin"][] = [
  ["Roast chicken", 3, 28, "chilledMax"],
  ["Steamed rice", 80, 22, "hotHoldMin"],
  ["Cod fillets", -18, 20, "chilledMax"],
];
console.log("\nWarm-up / cool-down check, end to end (properties, coefficients, method, curve)");
for (const [name, start, air, limit] of cases) {
  const product = DEMO_SCENARIO.products.find((p) => p.name.startsWith(name))!;
  let method = "";
  const ts = time(() => {
    method = runWarmup({ product, start_C: start, surroundings: { medium: "air", T_C: air, speed_m_s: 0 }, ruleSet: rs, limit, horizon_s: 24 * 3600 }).method;
  }, 15, 3);
  console.log(`  ${product.name}: ${method}, median ${median(ts).toFixed(2)} ms`);
}
// The cooling planner: one plan, the depth search, every method side by side (scripts/bench-cool.ts).
console.log("");
await import("./bench-cool");
// 4. Hold planner: a 48-hour route with 6 segments, one box, 4 pack lines and 3 product lines.
const D = DEMO_SCENARIO;
const find = <T extends { name: string }>(xs: T[], start: string) => xs.find((x) => x.name.startsWith(start))!;
const single = holdInput(false);
const withBand = holdInput(true);
let lastHold = runHoldParsed(single);
const h1 = time(() => (lastHold = runHoldParsed(single)), 40, 40);
const h9 = time(() => runHoldParsed(withBand), 15, 5);
console.log("\nHold planner — 48 h route, 6 segments, 1 box, 4 pack lines, 3 product lines");
console.log(`  one plan: median ${median(h1).toFixed(2)} ms (${lastHold.steps} implicit steps, ${lastHold.newtonIterations} Newton iterations, energy balance ${lastHold.energyBalanceError?.toExponential(1) ?? "not meaningful"})`);
console.log(`  with the uncertainty band (central + 8 runs): median ${median(h9).toFixed(2)} ms (${(median(h9) / median(h1)).toFixed(1)}× one plan)`);
// The same plan as the server runs it (POST /api/v1/hold): its pool's worker bundle, the central run and
// the corners as pieces taken by two threads side by side, the lead answering (wall time).
{
  // execArgv []: the threads run plain node, as under `next start` (not with this script's TypeScript loader, which slows them).
  const pool = new Piscina<CalcJob, CalcAnswer | HelperAnswer>({ filename: path.join(ROOT, "dist", "calc-worker.mjs"), minThreads: 2, maxThreads: 2, execArgv: [] });
  const asServer = async (threads: number) => {
    const a = await runWhole("hold", withBand, threads, (job) => pool.run(job));
    if (!a.ok) throw new Error(a.message);
    return a;
  };
  const wall = async (threads: number, runs: number, warm: number) => {
    for (let i = 0; i < warm; i++) await asServer(threads);
    const out: number[] = [];
    for (let i = 0; i < runs; i++) {
      const t0 = performance.now();
      await asServer(threads);
      out.push(performance.now() - t0);
    }
    return out;
  };
  // Warm both threads (each compiles the model on its own), then time in pieces and whole.
  await wall(2, 0, 150);
  const shared = await wall(2, 40, 10);
  const whole = await wall(1, 40, 10);
  await pool.destroy();
  console.log(`  with the band, as the server runs it (worker pool, 2 threads): in pieces on both threads median ${median(shared).toFixed(2)} ms wall; whole on one thread ${median(whole).toFixed(2)} ms`);
}
// The same plan as the page runs it: its planner worker's protocol (quick answer, then the full one with
// its view and CSV rows) in worker threads, one worker alone or a lead and a helper on one board (wall
// time from the request to the full answer).
{
  const host = path.join(mkdtempSync(path.join(os.tmpdir(), "holdline-bench-")), "page-worker.mjs");
  await esbuild.build({ entryPoints: [path.join(ROOT, "scripts", "page-worker-host.ts")], bundle: true, platform: "node", format: "esm", outfile: host, logLevel: "warning" });
  const lead = new Worker(host);
  const helper = new Worker(host);
  const input = JSON.parse(JSON.stringify(withBand)) as unknown;
  const boards = new Map<number, SharedBoard>();
  helper.on("message", (m: FromPlannerWorker) => {
    if (m.type !== "helped") return;
    boards.get(m.id)?.helperSettled(1, true);
    boards.delete(m.id);
  });
  let id = 0;
  const once = (withHelper: boolean) =>
    new Promise<number>((resolve) => {
      const my = ++id;
      const t0 = performance.now();
      const on = (m: FromPlannerWorker) => {
        if (m.id !== my || (m.type === "result" && m.stage === "quick")) return;
        lead.off("message", on);
        resolve(performance.now() - t0);
      };
      lead.on("message", on);
      let board: SharedBoard | null = null;
      if (withHelper) {
        board = SharedBoard.create();
        boards.set(my, board);
        helper.postMessage({ type: "help", id: my, kind: "hold", input, board: board.buffer });
      }
      lead.postMessage({ type: "run", id: my, kind: "hold", input, units: DEFAULT_UNIT_PREFS, ...(board ? { board: board.buffer } : {}) });
    });
  // Each worker compiles the model on its own: warm both, then alternate the two ways (the machine's load drifts).
  for (let i = 0; i < 120; i++) await once(i % 2 === 0);
  const paired: number[] = [];
  const alone: number[] = [];
  for (let i = 0; i < 40; i++) {
    paired.push(await once(true));
    alone.push(await once(false));
  }
  await lead.terminate();
  await helper.terminate();
  console.log(`  with the band, as the page runs it (planner worker protocol, quick then full answer with view and CSV): with a helper worker median ${median(paired).toFixed(2)} ms wall; one worker ${median(alone).toFixed(2)} ms`);
}
// 5. Thaw planner.
const codThaw = thawInputSchema.parse({ product: find(D.products, "Cod fillets"), start_C: -18, ruleSet: D.rulesets[0], method: { kind: "fridge_air", air_C: 4, speed_m_s: 0.3 } });
const compare = thawInputSchema.parse({ product: find(D.products, "Cod fillets"), start_C: -18, ruleSet: D.rulesets[0], method: { kind: "fridge_air", air_C: 4, speed_m_s: 0.3 }, compare: true });
let oneThaw = runThawParsed(codThaw);
const th1 = time(() => (oneThaw = runThawParsed(codThaw)), 30, 10);
let cmp = runThawParsed(compare);
const th5 = time(() => (cmp = runThawParsed(compare)), 10, 3);
console.log("\nThaw planner — 5 kg frozen cod block (50 × 250 × 400 mm) from −18 °C");
console.log(`  one thaw in a 4 °C refrigerator to the end point: median ${median(th1).toFixed(2)} ms (${oneThaw.steps} steps; ${((oneThaw.thawTime_s ?? 0) / 3600).toFixed(1)} h)`);
console.log(`  all five methods compared: median ${median(th5).toFixed(2)} ms (${cmp.comparison!.map((m) => `${m.kind} ${((m.thawTime_s ?? 0) / 3600).toFixed(1)} h`).join(", ")})`);
// 6. Pack-out sizer: about 2,000 candidates (5 box variants × 0–10 ice × 0–10 gel packs × 2 × 2 conditioning, less repeats).
const sizeInp = sizeInput;
const timeSizing = async (prune: boolean) => {
  const inp = sizeInp(prune);
  const pool = nodePool(inp);
  const t0 = performance.now();
  const cold = await runSizing(inp, pool.evaluate);
  const coldMs = performance.now() - t0;
  const t1 = performance.now();
  const warm = await runSizing(inp, pool.evaluate);
  const warmMs = performance.now() - t1;
  await pool.close();
  return { cold, coldMs, warm, warmMs };
};
const singleInp = sizeInp(false);
const ts0 = performance.now();
const singleRun = await runSizing(singleInp, evaluateHere(singleInp));
const singleMs = performance.now() - ts0;
const pr = await timeSizing(true);
const un = await timeSizing(false);
console.log(`\nPack-out sizer — ${un.warm.candidates.length} candidates, overnight route (17 h), judged at the low end of the band, 2 worker threads`);
console.log(`  with monotone pruning: ${pr.warmMs.toFixed(0)} ms (${pr.coldMs.toFixed(0)} ms including starting the workers); ${pr.warm.evaluated} run, ${pr.warm.pruned} decided by monotonicity`);
console.log(`  every candidate run (no pruning): ${un.warmMs.toFixed(0)} ms (${un.coldMs.toFixed(0)} ms including starting the workers); one thread: ${singleMs.toFixed(0)} ms`);
console.log(`  same answer pruned and unpruned: ${JSON.stringify(pr.warm.pareto) === JSON.stringify(un.warm.pareto) && JSON.stringify(singleRun.pareto) === JSON.stringify(un.warm.pareto) ? "yes" : "NO"} (Pareto front of ${un.warm.pareto.length})`);
if (sink === 42) console.log("");

// 7. The command line, as a user starts it: whole processes, next to a bare `node -e ""`. Wall time
// is what the user waits; CPU time (children's user + system, from /proc) is steadier on a busy machine.
{
  const tmp = mkdtempSync(path.join(os.tmpdir(), "holdline-bench-"));
  const D2 = DEMO_SCENARIO;
  const shipper = find(D2.shippers, "Quillfield lined");
  const named = new Set([...shipper.wallLayers, ...(shipper.lidLayers ?? [])].map((l) => l.material).concat(shipper.finishMaterial));
  const spelledOut = {
    products: [{ product: find(D2.products, "Cod fillets"), count: 1, start_C: -22 }],
    shipper,
    materials: D2.materials.filter((m) => named.has(m.name)),
    packs: [{ pack: find(D2.packs, "Dry ice"), count: 1, conditioning_C: -78.5 }],
    route: find(D2.routes, "Overnight"),
    ruleSet: D2.rulesets.find((r) => r.isDefault) ?? D2.rulesets[0],
  };
  const banded = path.join(tmp, "hold-spelled-out.json");
  writeFileSync(banded, JSON.stringify(spelledOut));
  const single = path.join(tmp, "hold-spelled-out-single.json");
  writeFileSync(single, JSON.stringify({ ...spelledOut, uncertainty: { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 } }));
  const db = path.join(tmp, "bench.db");
  const bin = path.join(ROOT, "bin", "holdline.mjs");
  /** CPU seconds of waited-for children (user + system), from /proc/self/stat; null where there is no /proc. */
  const childCpu_s = (): number | null => {
    try {
      const f = readFileSync("/proc/self/stat", "utf8").split(") ")[1].split(" ");
      return (Number(f[13]) + Number(f[14])) / 100; // cutime + cstime, in clock ticks of 1/100 s (Linux USER_HZ)
    } catch {
      return null;
    }
  };
  const measure = (args: string[], runs: number) => {
    spawnSync(process.execPath, args, { encoding: "utf8", maxBuffer: 64 << 20 }); // warms the file cache
    const ts: number[] = [];
    const cpu0 = childCpu_s();
    for (let i = 0; i < runs; i++) {
      const t = performance.now();
      const r = spawnSync(process.execPath, args, { encoding: "utf8", maxBuffer: 64 << 20 });
      ts.push(performance.now() - t);
      if (r.status !== 0) throw new Error(`${args.join(" ")} exited ${r.status}: ${r.stderr}`);
    }
    const cpu1 = childCpu_s();
    return { wall_ms: median(ts), cpu_ms: cpu0 === null || cpu1 === null ? null : ((cpu1 - cpu0) * 1000) / runs };
  };
  spawnSync(process.execPath, [bin, "export", "--db", db], { encoding: "utf8" }); // creates and seeds the library once
  const bare = measure(["-e", ""], 15);
  const rows: [string, string[]][] = [
    ["holdline --help", [bin, "--help"]],
    ["holdline schema hold", [bin, "schema", "hold"]],
    ["holdline hold, templates spelled out, one run (no uncertainty band)", [bin, "hold", single]],
    ["holdline hold, templates spelled out, with the uncertainty band (9 runs)", [bin, "hold", banded]],
    ["holdline hold public/examples/hold.json (templates by name: opens the library)", [bin, "hold", path.join(ROOT, "public", "examples", "hold.json"), "--db", db]],
    ["holdline export (whole library)", [bin, "export", "--db", db]],
  ];
  const cpu = (m: { cpu_ms: number | null }) => (m.cpu_ms === null ? "" : `, CPU ${m.cpu_ms.toFixed(0)} ms`);
  console.log("\nCommand line — whole processes (median wall time of 7 runs after a warm-up run; CPU is the mean)");
  console.log(`  node -e "" (bare start-up): ${bare.wall_ms.toFixed(0)} ms${cpu(bare)}`);
  for (const [label, args] of rows) {
    const m = measure(args, 7);
    const ratio = `${(m.wall_ms / bare.wall_ms).toFixed(1)}× bare node` + (m.cpu_ms !== null && bare.cpu_ms ? `; CPU ${(m.cpu_ms / bare.cpu_ms).toFixed(1)}×` : "");
    console.log(`  ${label}: ${m.wall_ms.toFixed(0)} ms${cpu(m)} (${ratio})`);
  }
  console.log(`  (the hold planner's own work for the banded input is in "Hold planner" above: 9 network runs; the rest is start-up)`);
}
