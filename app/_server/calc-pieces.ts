/**
 * How the server's pool runs one calculation: whole on one thread, or, for a planner whose run comes in
 * pieces (PlannerEntry.pieces: the hold planner's central run and band corners) while threads are free, as
 * a lead job and helper jobs that take the pieces from one board in shared memory as each becomes free.
 * Helpers are only sent to threads that are free when the request arrives, so they start at once; the lead
 * waits only for a piece a helper has taken, and only while that helper's job is still running (a piece
 * whose helper has gone, done or failed, without its number is run by the lead). A helper that starts after
 * the lead has taken the last piece does nothing. Free of server-only imports so that the benchmark and the
 * tests run the same code against their own pool.
 */
import type { CalcAnswer, CalcJob, Calculation, HelperAnswer } from "./calc-worker";
import { plannerOf } from "../../lib/planners/registry";
import { MAX_HELPERS, SharedBoard } from "../../lib/planners/shared-board";

/**
 * Runs one calculation on the pool through `run`: in pieces where the planner has them and more than one of
 * the `idle` threads is free, else whole. `board` is for tests that look at who took what.
 */
export async function runWhole(kind: Calculation, input: unknown, idle: number, run: (job: CalcJob) => Promise<CalcAnswer | HelperAnswer>, board = SharedBoard.create()): Promise<CalcAnswer> {
  const pieces = plannerOf(kind).pieces;
  const helpers = pieces ? Math.max(0, Math.min(idle, pieces.threads, MAX_HELPERS + 1) - 1) : 0;
  if (helpers === 0) return lead(await run({ kind, input }));
  // The lead first, so that it starts first.
  const answer = run({ kind, input, pieces: { board: board.buffer, helper: 0 } });
  let left = helpers;
  for (let id = 1; id <= helpers; id++) {
    const settled = () => board.helperSettled(id, --left === 0);
    run({ kind, input, pieces: { board: board.buffer, helper: id } }).then(settled, settled);
  }
  return lead(await answer);
}

/** The lead's answer (a helper's here would be a defect of this module). */
function lead(a: CalcAnswer | HelperAnswer): CalcAnswer {
  if ("helped" in a) return { ok: false, status: 500, message: "A helper's answer came back where the whole answer was expected", fieldErrors: {} };
  return a;
}
