/**
 * Synthetic logger files made by the model itself: a plan run with known calibration factors, sampled
 * every few minutes, Gaussian noise of a chosen size added with a seeded generator, written as CSV.
 */
import { interpolate } from "../../lib/calibration/align";
import type { HoldInput } from "../../lib/schemas/hold";
import { DEMO_SCENARIO as D } from "../../lib/db/demo-scenario";

export const P = (n: string) => D.products.find((p) => p.name.startsWith(n))!;
export const K = (n: string) => D.packs.find((p) => p.name.startsWith(n))!;
export const S = (n: string) => D.shippers.find((p) => p.name.startsWith(n))!;

/** A caterer's plan from the demo library: roast chicken in the thin cooler with two gel packs on the summer lunch run. */
export const lunchPlan: HoldInput = {
  products: [{ product: P("Roast chicken"), count: 1, start_C: 1 }],
  shipper: S("Quillfield thin"),
  materials: D.materials,
  packs: [{ pack: K("Gel pack"), count: 2, conditioning_C: -18 }],
  route: D.routes[0],
  ruleSet: D.rulesets[1],
  boxStart_C: 8,
  extendFraction: 1,
};

/** Park–Miller generator and Box–Muller normal deviates: the same noise on every run. */
export function gaussian(seed: number): () => number {
  let s = seed;
  const u = () => (s = (s * 16807) % 2147483647) / 2147483647;
  return () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
}

export interface SyntheticColumn {
  header: string;
  /** Modelled curve to sample. */
  t_s: number[];
  T_C: number[];
}

/** CSV text "elapsed_min,<headers…>" sampled every `every_s` from 0 to `end_s`, with noise of `noise_K` standard deviation. */
export function syntheticCsv(columns: SyntheticColumn[], end_s: number, every_s: number, noise_K: number, seed = 7, opts: { offset_s?: number; unit?: "C" | "F" } = {}): string {
  const g = gaussian(seed);
  const lines = [["elapsed_min", ...columns.map((c) => c.header)].join(",")];
  const off = opts.offset_s ?? 0;
  for (let t = 0; t <= end_s + 1e-9; t += every_s) {
    const vals = columns.map((c) => {
      const T = (interpolate(c, Math.max(0, t - off)) ?? c.T_C[c.T_C.length - 1]) + noise_K * g();
      return (opts.unit === "F" ? (T * 9) / 5 + 32 : T).toFixed(3);
    });
    lines.push([(t / 60).toFixed(3), ...vals].join(","));
  }
  return lines.join("\n");
}
