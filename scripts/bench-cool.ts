/**
 * npx tsx scripts/bench-cool.ts — speed of the cooling planner on the demo rice (nothing asserted;
 * tests never time anything). One plan; the plan with the deepest-layer search; the full answer with
 * every method side by side, each with its own search.
 */
import { runCoolParsed } from "../lib/physics/cooling";
import { coolInputSchema } from "../lib/schemas/cool";
import { DEMO_SCENARIO } from "../lib/db/demo-scenario";
import { median, time } from "./bench-util";


const rice = DEMO_SCENARIO.products.find((p) => p.name === "Steamed rice, full pan")!;
const fda = DEMO_SCENARIO.rulesets.find((r) => r.name.startsWith("US"))!;
const input = (over: Record<string, unknown>) =>
  coolInputSchema.parse({ product: rice, start_C: 74, setup: { kind: "pan", size: "1/1", height_m: 0.1, depth_m: 0.05 }, method: { kind: "walk_in" }, ruleSet: fda, ...over });

const one = input({ compare: false, searchDepth: false });
const search = input({ compare: false, searchDepth: true });
const all = input({ compare: true, searchDepth: true });
const r = runCoolParsed(search);
const f = (xs: number[]) => `median ${median(xs).toFixed(0)} ms (min ${Math.min(...xs).toFixed(0)}, max ${Math.max(...xs).toFixed(0)})`;
console.log("Cooling planner, demo rice, 50 mm in a 1/1 stainless pan, walk-in, FDA stages");
console.log(`  one plan:                        ${f(time(() => runCoolParsed(one), 9))}`);
console.log(`  plan + deepest-layer search:     ${f(time(() => runCoolParsed(search), 5))}  (${r.maxDepth.evaluations} runs, ${((r.maxDepth_m ?? 0) * 1000).toFixed(1)} mm)`);
console.log(`  four methods, each with search:  ${f(time(() => runCoolParsed(all), 3, 1))}`);
