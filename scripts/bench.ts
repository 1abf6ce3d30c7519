/**
 * npm run bench — prints speed figures. Nothing here is asserted; tests never time anything.
 */
import { foodThermal } from "../lib/physics/properties";
import { solve1D } from "../lib/physics/solver1d";
import { oneTermTheta, seriesTheta } from "../lib/physics/conduction";
import { runWarmup } from "../lib/physics/warmup";
import { DEMO_SCENARIO } from "../lib/db/demo-scenario";

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

function time(fn: () => void, runs: number, warm = 5): number[] {
  for (let i = 0; i < warm; i++) fn();
  const out: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    fn();
    out.push(performance.now() - t);
  }
  return out;
}

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
if (sink === 42) console.log("");
