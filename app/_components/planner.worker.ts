// The browser's planner worker: every planner's model runs here, off the page's thread (lib/planners/worker-protocol.ts).
import { plannerWorkerHandler, type ToPlannerWorker } from "@/lib/planners/worker-protocol";

const handle = plannerWorkerHandler((m) => (self as unknown as Worker).postMessage(m));
self.onmessage = (e: MessageEvent<ToPlannerWorker>) => void handle(e.data);
