// Browser Web Worker for the pack-out sizer: the same model code as the server and the CLI.
import { workerHandler, type ToWorker } from "@/lib/physics/sizing-worker";

const handle = workerHandler((m) => (self as unknown as Worker).postMessage(m));
self.onmessage = (e: MessageEvent<ToWorker>) => handle(e.data);
