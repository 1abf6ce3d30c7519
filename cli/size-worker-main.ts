import { parentPort } from "node:worker_threads";
import { workerHandler, type ToWorker } from "../lib/physics/sizing-worker";

const handle = workerHandler((m) => parentPort!.postMessage(m));
parentPort!.on("message", (m: ToWorker) => handle(m));
