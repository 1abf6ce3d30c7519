/**
 * The page's planner worker protocol (lib/planners/worker-protocol.ts) in a Node worker thread, for `npm run
 * bench`: the same handler as app/_components/planner.worker.ts, on worker_threads instead of a Web Worker,
 * so the benchmark can time the page's way of running a plan (one worker, or a lead and a helper on one
 * board) without a browser.
 */
import { parentPort } from "node:worker_threads";
import { plannerWorkerHandler, type ToPlannerWorker } from "../lib/planners/worker-protocol";

const handle = plannerWorkerHandler((m) => parentPort!.postMessage(m));
parentPort!.on("message", (m: ToPlannerWorker) => void handle(m));
