/**
 * Synthetic logger files made by the model itself: a plan run with known calibration factors, sampled
 * every few minutes, Gaussian noise of a chosen size added with a seeded generator, written as CSV.
 */
import { interpolate } from "../../lib/calibration/align";

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
