/**
 * The message protocol of the planner worker (a browser Web Worker; the same handler could serve any host
 * that can post messages). The page posts every input change; the worker answers with a quick first
 * answer where the planner has one (the central run), then the full one (with the uncertainty band, the
 * comparison, the depth search). A newer request makes the worker drop what is left of an older one,
 * so stale results never arrive after fresh ones. Pure: the host wires `post` and the timer.
 *
 * Where the page can share memory (cross-origin isolated) it runs a second worker as a helper: with each
 * request it gives both workers one board (shared-board.ts). The helper takes the planner's pieces (the
 * hold planner's band corners) from it at once, while the first worker works out the quick answer and
 * then, as the lead, the central run and the pieces left; the full answer is the same as one worker gives
 * (runPlannerPieces). The helper says when it has finished, so that the page can tell the lead not to wait
 * for it any more. When a newer request goes out the page withdraws the older board: neither worker takes
 * another piece of it, and its lead stops without a full answer.
 */
import type { UnitPrefs } from "../units";
import type { FieldErrors } from "../schemas/errors";
import { isPlannerKind, plannerOf, type PlannerKind } from "./registry";
import { runPlanner, runPlannerPieces } from "./run";
import { SharedBoard } from "./shared-board";
import type { CsvRow, PlanView } from "./types";

export type ToPlannerWorker =
  /** `board`: the lead of the request's pieces, shared with a helper worker (absent: the worker runs it whole). */
  | { type: "run"; id: number; kind: PlannerKind; input: unknown; units: UnitPrefs; board?: SharedArrayBuffer }
  /** To the helper worker: take pieces of request `id` from `board` until none is left. */
  | { type: "help"; id: number; kind: PlannerKind; input: unknown; board: SharedArrayBuffer };

export type FromPlannerWorker =
  | { type: "result"; id: number; stage: "quick" | "full"; view: PlanView; csv: CsvRow[]; parsed: unknown; result: unknown; compute_ms: number }
  | { type: "invalid"; id: number; fieldErrors: FieldErrors }
  | { type: "error"; id: number; message: string }
  /** From the helper worker: it has finished with request `id`'s board (done, nothing to do, or gave up). */
  | { type: "helped"; id: number };

/** Lets queued messages in before the next stage (a macrotask: the newer request is seen first). */
const yieldToMessages = () => new Promise<void>((r) => setTimeout(r, 0));

export function plannerWorkerHandler(post: (m: FromPlannerWorker) => void, now: () => number = () => Date.now()): (m: ToPlannerWorker) => Promise<void> {
  let latest = 0;
  return async (m) => {
    if (!m) return;
    // Every help message is answered (an unknown planner has nothing to take), so the page never waits on it.
    if (m.type === "help") return help(m, post);
    if (!isPlannerKind(m.kind)) return;
    if (m.type !== "run") return;
    latest = Math.max(latest, m.id);
    // Let any newer request that is already queued arrive first: only the last one is worth computing.
    await yieldToMessages();
    if (m.id !== latest) return;
    const entry = plannerOf(m.kind);
    try {
      if (entry.pieces && isShared(m.board)) return lead(entry, m, m.board, post, now);
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

/** Whether x is shared memory (a page that is not cross-origin isolated has no SharedArrayBuffer at all). */
function isShared(x: unknown): x is SharedArrayBuffer {
  return typeof SharedArrayBuffer !== "undefined" && x instanceof SharedArrayBuffer;
}

/**
 * Both stages as the lead of the pieces on `board`: the quick answer from piece 0 (the central run) as soon
 * as it is in (PlannerPieces.quick: the same answer as the quick stage run apart), then the full one once
 * every piece is. Nothing more once the page has withdrawn the board for a newer request (it stops the lead;
 * the newer request is waiting). A planner with pieces but no quick answer from them shows the full one only.
 */
function lead(entry: ReturnType<typeof plannerOf>, m: Extract<ToPlannerWorker, { type: "run" }>, buffer: SharedArrayBuffer, post: (m: FromPlannerWorker) => void, now: () => number): void {
  // compute_ms: the quick answer's from the start, the full answer's from the start too (its own stage
  // began with the central run the quick answer shares).
  const t0 = now();
  const board = new SharedBoard(buffer, 0);
  const r = runPlannerPieces(entry, m.input, board, "lead", (parsed, run) => {
    const q = entry.quick(parsed);
    if (!q || !run.quick || board.withdrawn()) return;
    const result = run.quick(q.input);
    const view = entry.view(parsed, result, m.units, { quick: true });
    view.pending = q.pending;
    post({ type: "result", id: m.id, stage: "quick", view, csv: [], parsed, result, compute_ms: now() - t0 });
  });
  if (!r.ok) {
    if (!("superseded" in r)) post({ type: "invalid", id: m.id, fieldErrors: r.fieldErrors });
    return;
  }
  const view = entry.view(r.parsed, r.value, m.units, { quick: false });
  post({ type: "result", id: m.id, stage: "full", view, csv: entry.csv(r.parsed, r.value, m.units), parsed: r.parsed, result: r.value, compute_ms: now() - t0 });
}

/**
 * The helper worker's part: take pieces from the board until none is left (nothing if the lead has taken
 * the last, or the page has withdrawn the board for a newer request), then say so. Input the lead will
 * reject, or a piece that throws, leaves the rest to the lead (which reports the error).
 */
function help(m: Extract<ToPlannerWorker, { type: "help" }>, post: (m: FromPlannerWorker) => void): void {
  try {
    if (isPlannerKind(m.kind) && isShared(m.board)) runPlannerPieces(plannerOf(m.kind), m.input, new SharedBoard(m.board, 1), "helper");
  } finally {
    post({ type: "helped", id: m.id });
  }
}
