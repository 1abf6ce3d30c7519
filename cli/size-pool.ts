/** A pool of Node worker threads running the sizer's model (both cores by default). */
import { Worker } from "node:worker_threads";
import { existsSync } from "node:fs";
import os from "node:os";
import type { SizeParsed } from "../lib/schemas/size";
import { makePool, type FromWorker } from "../lib/physics/sizing-worker";
import type { SizingPlan } from "../lib/physics/sizing";
import { sizeWorkerFile } from "./paths";

/**
 * The threads run the prebuilt JavaScript worker (dist/cli/size-worker.mjs, built by `npm install`
 * or `node scripts/bundle.mjs`), never a TypeScript loader, so each starts in milliseconds.
 */
export function nodePool(inp: SizeParsed, threads = Math.max(1, Math.min(2, os.availableParallelism?.() ?? os.cpus().length))) {
  const file = sizeWorkerFile();
  if (!existsSync(file)) throw new Error(`the sizer's worker ${file} is not built: run "node scripts/bundle.mjs" (npm install does it)`);
  const workers = Array.from({ length: threads }, () => new Worker(file));
  const evaluate = makePool(
    workers.map((w) => ({ post: (m) => w.postMessage(m), onMessage: (f: (m: FromWorker) => void) => w.on("message", f) })),
    inp,
  );
  return {
    evaluate: (indices: number[], _plan: SizingPlan) => evaluate(indices),
    close: () => Promise.all(workers.map((w) => w.terminate())),
  };
}
