/**
 * The message protocol of the planner worker (a browser Web Worker; the same handler could serve any host
 * that can post messages). The page posts every input change; the worker answers with a quick first
 * answer where the planner has one (the central run), then the full one (with the uncertainty band, the
 * comparison, the depth search). A newer request makes the worker drop what is left of an older one,
 * so stale results never arrive after fresh ones. Pure: the host wires `post` and the timer.
 */
import type { UnitPrefs } from "../units";
import type { FieldErrors } from "../schemas/errors";
import { isPlannerKind, plannerOf, type PlannerKind } from "./registry";
import { runPlanner } from "./run";
import type { CsvRow, PlanView } from "./types";

export type ToPlannerWorker = { type: "run"; id: number; kind: PlannerKind; input: unknown; units: UnitPrefs };

export type FromPlannerWorker =
  | { type: "result"; id: number; stage: "quick" | "full"; view: PlanView; csv: CsvRow[]; parsed: unknown; result: unknown; compute_ms: number }
  | { type: "invalid"; id: number; fieldErrors: FieldErrors }
  | { type: "error"; id: number; message: string };

/** Lets queued messages in before the next stage (a macrotask: the newer request is seen first). */
const yieldToMessages = () => new Promise<void>((r) => setTimeout(r, 0));

export function plannerWorkerHandler(post: (m: FromPlannerWorker) => void, now: () => number = () => Date.now()): (m: ToPlannerWorker) => Promise<void> {
  let latest = 0;
  return async (m) => {
    if (!m || m.type !== "run" || !isPlannerKind(m.kind)) return;
    latest = Math.max(latest, m.id);
    // Let any newer request that is already queued arrive first: only the last one is worth computing.
    await yieldToMessages();
    if (m.id !== latest) return;
    const entry = plannerOf(m.kind);
    try {
      for (const stage of ["quick", "full"] as const) {
        const t0 = now();
        const r = await runPlanner(entry, m.input, stage);
        if (m.id !== latest) return;
        if (!r.ok) return post({ type: "invalid", id: m.id, fieldErrors: r.fieldErrors });
        const { parsed, result, pending } = r.result;
        if (stage === "quick" && pending === null) continue; // no cheaper answer: go straight to the full one
        const view = entry.view(parsed, result, m.units, { quick: stage === "quick" });
        if (pending) view.pending = pending;
        post({ type: "result", id: m.id, stage, view, csv: stage === "full" ? entry.csv(parsed, result, m.units) : [], parsed, result, compute_ms: now() - t0 });
        if (stage === "quick") {
          await yieldToMessages();
          if (m.id !== latest) return;
        }
      }
    } catch (e) {
      if (m.id === latest) post({ type: "error", id: m.id, message: (e as Error).message });
    }
  };
}
