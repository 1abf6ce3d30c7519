/**
 * Runs a planner on untrusted input, the one way every host does it (the server's worker pool, the
 * browser's planner worker, the CLI): check with the entry's zod schema, compute; bad input comes back as
 * field errors, a physics input error (valid shape, impossible value) names its field.
 */
import { fieldErrorsOf } from "../schemas/errors";
import type { FieldErrors } from "../schemas/errors";
import { PhysicsInputError } from "../physics/validation";
import type { PlannerEntry, PlannerPieces } from "./types";

export type PlannerRun =
  | { ok: true; result: { parsed: unknown; result: unknown; pending: string | null } }
  /** `message`: the physics input error's own words; absent for schema problems ("Some fields are not valid"). */
  | { ok: false; fieldErrors: FieldErrors; message?: string };

/** With stage "quick", runs the entry's cheaper first answer where it has one (`pending` says what is to come). */
export async function runPlanner(entry: PlannerEntry, input: unknown, stage: "quick" | "full" = "full"): Promise<PlannerRun> {
  const parsed = entry.schema.safeParse(input);
  if (!parsed.success) return { ok: false, fieldErrors: fieldErrorsOf(parsed.error) };
  try {
    const q = stage === "quick" ? entry.quick(parsed.data) : null;
    // Nothing cheaper to show first: the quick stage computes nothing (the full stage follows).
    if (stage === "quick" && !q) return { ok: true, result: { parsed: parsed.data, result: undefined, pending: null } };
    const result = await entry.run(q ? q.input : parsed.data);
    return { ok: true, result: { parsed: parsed.data, result, pending: q ? q.pending : null } };
  } catch (e) {
    if (e instanceof PhysicsInputError) return { ok: false, fieldErrors: { [e.field]: [e.message] }, message: e.message };
    throw e;
  }
}

/**
 * Where the threads running one calculation's pieces (PlannerEntry.pieces) meet: which piece is taken next
 * and each piece's number. The server's and the page's is shared memory (shared-board.ts); a test's may be a
 * plain object.
 */
export interface PieceBoard {
  /** How many pieces it has room for (a run with more is run whole by its lead). */
  capacity: number;
  /** Takes the next piece no thread has taken yet, counting from 1; a number past the last when none is left. */
  take(): number;
  /** A piece's number; NaN: the thread that took it gave up. */
  put(at: number, value: number): void;
  /** Said by the lead once it has taken the last piece (or will run them all itself): a helper starting later has nothing to do. */
  close(): void;
  isClosed(): boolean;
  /** Waits until every piece from 1 to count − 1 has its number (NaN where its thread gave up, or is gone) and returns them. */
  collect(count: number): ArrayLike<number>;
  /** Whether the host has withdrawn the board for a newer request: the lead's answer is no longer wanted. */
  withdrawn(): boolean;
}

/** The lead's `value` is the whole result and `parsed` its checked input; a helper's are null. */
export type PieceRun =
  | { ok: true; value: unknown; parsed: unknown }
  | { ok: false; fieldErrors: FieldErrors; message?: string }
  /** The lead stopped: the host withdrew the board for a newer request (the page's workers). */
  | { ok: false; superseded: true; fieldErrors: FieldErrors; message: string };

const SUPERSEDED: PieceRun = { ok: false, superseded: true, fieldErrors: {}, message: "A newer request replaced this one" };

/**
 * Runs a planner's pieces on untrusted input, as one of several threads sharing `board`. The lead runs
 * piece 0, then takes pieces until none is left, waits for the others', runs itself any that another
 * thread gave up, and returns the whole result (the same as runPlanner's). A helper takes pieces until none
 * is left and returns nothing, never throwing: on a closed board (it started late) or input the lead will
 * reject it does nothing, and if a piece throws it gives that piece up and stops (the lead runs it again
 * and reports the error). A lead whose board the host has
 * withdrawn stops after the piece in hand and returns `superseded`. `afterLead` sees piece 0's run once it
 * is in, before any other piece (the page's quick answer).
 */
export function runPlannerPieces(entry: PlannerEntry, input: unknown, board: PieceBoard, role: "lead" | "helper", afterLead?: (parsed: unknown, run: PlannerPieces<unknown>) => void): PieceRun {
  const pc = entry.pieces;
  if (!pc) return { ok: false, fieldErrors: { "": ["This calculation does not come in pieces"] }, message: "This calculation does not come in pieces" };
  if (role === "helper" && board.isClosed()) return { ok: true, value: null, parsed: null };
  const parsed = entry.schema.safeParse(input);
  if (!parsed.success) return role === "lead" ? { ok: false, fieldErrors: fieldErrorsOf(parsed.error) } : { ok: true, value: null, parsed: null };
  try {
    const run = pc.start(parsed.data);
    const shared = run.count <= board.capacity;
    if (role === "helper") {
      if (!shared) return { ok: true, value: null, parsed: null };
      for (let at = board.take(); at < run.count; at = board.take()) {
        try {
          board.put(at, run.runPiece(at));
        } catch {
          // Given up (its number NaN): the lead runs it again and reports what went wrong.
          board.put(at, NaN);
          break;
        }
      }
      return { ok: true, value: null, parsed: null };
    }
    run.runLead();
    // The lead's host may show an answer from piece 0 before the others are in (the page's quick answer).
    afterLead?.(parsed.data, run);
    const values = new Float64Array(run.count);
    if (shared) {
      for (let at = board.take(); at < run.count; at = board.take()) board.put(at, (values[at] = run.runPiece(at)));
      // Withdrawn (take gives out nothing more): the pieces left are not run for an answer nobody wants.
      if (board.withdrawn()) return SUPERSEDED;
      board.close();
      const got = board.collect(run.count);
      for (let at = 1; at < run.count; at++) values[at] = Number.isNaN(got[at]) ? run.runPiece(at) : got[at];
    } else {
      board.close();
      for (let at = 1; at < run.count; at++) values[at] = run.runPiece(at);
    }
    return { ok: true, value: run.finish(values), parsed: parsed.data };
  } catch (e) {
    // A helper leaves every failure to the lead, which meets it again and reports it.
    if (role === "helper") return { ok: true, value: null, parsed: null };
    if (e instanceof PhysicsInputError) return { ok: false, fieldErrors: { [e.field]: [e.message] }, message: e.message };
    throw e;
  }
}
