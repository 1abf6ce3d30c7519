/** A pool of Node worker threads running the sizer's model (both cores by default). */
import { Worker } from "node:worker_threads";
import os from "node:os";
import type { SizeParsed } from "../lib/schemas/size";
import { makePool, type FromWorker } from "../lib/physics/sizing-worker";
import type { SizingPlan } from "../lib/physics/sizing";

export function nodePool(inp: SizeParsed, threads = Math.max(1, Math.min(2, os.availableParallelism?.() ?? os.cpus().length))) {
  const workers = Array.from({ length: threads }, () => new Worker(new URL("./size-worker.mjs", import.meta.url)));
  const evaluate = makePool(
    workers.map((w) => ({ post: (m) => w.postMessage(m), onMessage: (f: (m: FromWorker) => void) => w.on("message", f) })),
    inp,
  );
  return {
    evaluate: (indices: number[], _plan: SizingPlan) => evaluate(indices),
    close: () => Promise.all(workers.map((w) => w.terminate())),
  };
}
