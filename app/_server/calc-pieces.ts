/**
 * How the server's pool runs one calculation: whole on one thread, or, for a planner whose run comes in
 * pieces (PlannerEntry.pieces: the hold planner's central run and band corners), as a lead job and helper
 * jobs on several threads that take the pieces from one board in shared memory as each becomes free. The
 * lead never waits for a job that has not started: a helper that starts late finds nothing left, and a
 * piece is only waited for once a running thread has taken it. Free of server-only imports so that the
 * benchmark runs the same code against its own pool.
 */
import type { CalcAnswer, CalcJob, Calculation, HelperAnswer } from "./calc-worker";
import { plannerOf } from "../../lib/planners/registry";
import type { PieceBoard } from "../../lib/planners/run";

/** Pieces a board has room for: far more than any plan's sample (a run with more is run whole by its lead). */
const BOARD_CAPACITY = 1024;
/** How long one wait for a piece lasts before the helpers' state is looked at again, ms. */
const WAIT_MS = 50;

/**
 * The board over one SharedArrayBuffer: an Int32 header (the last piece taken; whether every helper has
 * settled), an Int32 state per piece (0 not in, 1 in) and a Float64 number per piece. Atomics order the
 * writes: a piece's number is stored before its state says it is in.
 */
export class SharedBoard implements PieceBoard {
  readonly capacity: number;
  private readonly ctl: Int32Array;
  private readonly values: Float64Array;
  constructor(readonly buffer: SharedArrayBuffer) {
    // An even capacity keeps the numbers 8-byte aligned after the 4-byte states.
    this.capacity = Math.max(0, 2 * Math.floor((buffer.byteLength - 8) / 24));
    this.ctl = new Int32Array(buffer, 0, 2 + this.capacity);
    this.values = new Float64Array(buffer, 8 + 4 * this.capacity, this.capacity);
  }
  static create(capacity = BOARD_CAPACITY): SharedBoard {
    return new SharedBoard(new SharedArrayBuffer(8 + 24 * Math.ceil(capacity / 2)));
  }
  take(): number {
    return Atomics.add(this.ctl, 0, 1) + 1;
  }
  put(at: number, value: number): void {
    if (at < 1 || at >= this.capacity) return;
    this.values[at] = value;
    Atomics.store(this.ctl, 2 + at, 1);
    Atomics.notify(this.ctl, 2 + at);
  }
  collect(count: number): Float64Array {
    const out = new Float64Array(count);
    for (let at = 1; at < count; at++) {
      while (Atomics.load(this.ctl, 2 + at) === 0) {
        // Every helper has settled and this piece is still not in: its thread is gone (the lead runs it).
        if (Atomics.load(this.ctl, 1) !== 0 && Atomics.load(this.ctl, 2 + at) === 0) {
          this.values[at] = NaN;
          break;
        }
        Atomics.wait(this.ctl, 2 + at, 0, WAIT_MS);
      }
      out[at] = this.values[at];
    }
    return out;
  }
  /** Called on the request thread once every helper job has settled (done, failed or stopped). */
  helpersSettled(): void {
    Atomics.store(this.ctl, 1, 1);
    for (let at = 1; at < this.capacity; at++) Atomics.notify(this.ctl, 2 + at);
  }
}

export async function runWhole(kind: Calculation, input: unknown, threads: number, run: (job: CalcJob) => Promise<CalcAnswer | HelperAnswer>): Promise<CalcAnswer> {
  const pieces = plannerOf(kind).pieces;
  if (!pieces || threads < 2) return lead(await run({ kind, input }));
  const board = SharedBoard.create();
  // The lead first, so that it starts first where only one thread is free.
  const answer = run({ kind, input, pieces: { board: board.buffer, lead: true } });
  const helpers = Array.from({ length: Math.min(threads, pieces.threads) - 1 }, () => run({ kind, input, pieces: { board: board.buffer, lead: false } }));
  void Promise.allSettled(helpers).then(() => board.helpersSettled());
  return lead(await answer);
}

/** The lead's answer (a helper's here would be a defect of this module). */
function lead(a: CalcAnswer | HelperAnswer): CalcAnswer {
  if ("helped" in a) return { ok: false, status: 500, message: "A helper's answer came back where the whole answer was expected", fieldErrors: {} };
  return a;
}
