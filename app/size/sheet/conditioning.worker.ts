// Browser Web Worker for the pack-out sheet: how long each pack line needs in its cabinet (the enthalpy solver, off the page's thread).
import { conditioningTimes } from "@/lib/planners/pack-out-sheet";
import type { HoldParsed } from "@/lib/schemas/hold";

self.onmessage = (e: MessageEvent<{ id: number; packs: HoldParsed["packs"] }>) => {
  let times: (number | null)[] | "failed";
  try {
    times = conditioningTimes(e.data.packs);
  } catch {
    times = "failed";
  }
  (self as unknown as Worker).postMessage({ id: e.data.id, times });
};
