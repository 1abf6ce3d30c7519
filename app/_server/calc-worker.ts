/**
 * The calculation worker: runs in a worker thread of the server's pool (app/_server/calc-pool.ts), never
 * on the request thread. It is bundled to dist/calc-worker.mjs by scripts/bundle.mjs, so it must stay
 * free of Next- and Prisma-only imports: the input arrives with its templates already copied in, is
 * checked here with its planner's zod schema (lib/planners/registry.ts) and computed.
 */
import type { FieldErrors } from "../../lib/schemas/errors";
import { runPlanner, runPlannerPieces } from "../../lib/planners/run";
import { MAX_HELPERS, SharedBoard } from "../../lib/planners/shared-board";
import { isPlannerKind, plannerOf, type PlannerKind } from "../../lib/planners/registry";

export type Calculation = PlannerKind;

export interface CalcJob {
  kind: Calculation;
  input: unknown;
  /** One of the threads taking a planner's pieces (PlannerEntry.pieces) from a board in shared memory (calc-pieces.ts): helper 0 is the lead, 1 … a helper. */
  pieces?: { board: SharedArrayBuffer; helper: number };
}

/** A helper's answer: its pieces are on the board; the lead's answer is the whole one. */
export type HelperAnswer = { ok: true; helped: true };

export type CalcAnswer =
  /** The result as JSON text: serialised here, so the request thread only passes a string on. */
  | { ok: true; json: string }
  | { ok: false; status: 422; message: string; fieldErrors: FieldErrors }
  | { ok: false; status: 500; message: string; fieldErrors: FieldErrors };

function pieces(kind: Calculation, input: unknown, p: NonNullable<CalcJob["pieces"]>): CalcAnswer | HelperAnswer {
  const board = new SharedBoard(p.board, p.helper);
  if (p.helper > 0) {
    runPlannerPieces(plannerOf(kind), input, board, "helper");
    return { ok: true, helped: true };
  }
  const r = runPlannerPieces(plannerOf(kind), input, board, "lead");
  // The pool never withdraws a board: a lead that says it was replaced is a defect.
  if (!r.ok && "superseded" in r) return defect(new Error(r.message));
  if (!r.ok) return { ok: false, status: 422, message: r.message ?? "Some fields are not valid", fieldErrors: r.fieldErrors };
  return finished(r.value);
}

/** A model failure that is not an input error: a 500 that says it is a defect, with the model's words. */
function defect(e: unknown): CalcAnswer {
  const what = e instanceof Error ? e.message : String(e);
  return { ok: false, status: 500, message: `The model failed (${what}); this is a defect, please report it with the input`, fieldErrors: {} };
}

/** A finished result as JSON text, or a 500 where the model produced a number that is not finite. */
function finished(result: unknown): CalcAnswer {
  const bad = nonFinitePath(result);
  if (bad !== null) return { ok: false, status: 500, message: `The model produced a number that is not finite (at ${bad || "the top"}); this is a defect, please report it with the input`, fieldErrors: {} };
  return { ok: true, json: JSON.stringify(result) };
}

async function checked(kind: Calculation, input: unknown): Promise<CalcAnswer> {
  let r: Awaited<ReturnType<typeof runPlanner>>;
  try {
    r = await runPlanner(plannerOf(kind), input);
  } catch (e) {
    return defect(e);
  }
  if (!r.ok) return { ok: false, status: 422, message: r.message ?? "Some fields are not valid", fieldErrors: r.fieldErrors };
  return finished(r.result.result);
}

/** The path of the first NaN or ±Infinity in a result (JSON would silently turn it into null), else null. */
export function nonFinitePath(x: unknown): string | null {
  const path: (string | number)[] = [];
  return firstNonFinite(x, path) ? path.join(".") : null;
}

/** Whether x holds a non-finite number; if so, `path` is left holding the keys to the first one (built only then). */
function firstNonFinite(x: unknown, path: (string | number)[]): boolean {
  if (typeof x === "number") return !Number.isFinite(x);
  if (typeof x !== "object" || x === null) return false;
  if (Array.isArray(x)) {
    for (let i = 0; i < x.length; i++) {
      if (firstNonFinite(x[i], path)) {
        path.unshift(i);
        return true;
      }
    }
    return false;
  }
  for (const k in x) {
    if (!Object.prototype.hasOwnProperty.call(x, k)) continue;
    if (firstNonFinite((x as Record<string, unknown>)[k], path)) {
      path.unshift(k);
      return true;
    }
  }
  return false;
}

/** Piscina calls the default export with each job. */
export default function run(job: CalcJob): Promise<CalcAnswer | HelperAnswer> {
  if (!job || !isPlannerKind(job.kind)) return Promise.resolve({ ok: false, status: 422, message: "Unknown calculation", fieldErrors: {} });
  if (job.pieces) {
    const { board, helper } = job.pieces;
    if (!(board instanceof SharedArrayBuffer) || !Number.isInteger(helper) || helper < 0 || helper > MAX_HELPERS) return Promise.resolve({ ok: false, status: 422, message: "A piece's board must be shared memory and its helper one the board can name", fieldErrors: {} });
    try {
      return Promise.resolve(pieces(job.kind, job.input, job.pieces));
    } catch (e) {
      return Promise.resolve(defect(e));
    }
  }
  return checked(job.kind, job.input);
}
