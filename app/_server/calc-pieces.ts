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
import type { PieceBoard } from "../../lib/planners/run";

/** Pieces a board has room for: far more than any plan's sample (a run with more is run whole by its lead). */
const BOARD_CAPACITY = 1024;
/** Helpers one board can name (ids 1 … MAX_HELPERS). */
export const MAX_HELPERS = 7;
/** How long one wait for a piece lasts before its helper's state is looked at again, ms. */
const WAIT_MS = 50;

/** Header words: the last piece taken; closed (the lead has taken the last piece); every helper settled; then each helper's settled flag. */
const NEXT = 0;
const CLOSED = 1;
const ALL_SETTLED = 2;
const HEADER = 4 + MAX_HELPERS + 1;

/**
 * The board over one SharedArrayBuffer, as seen by one thread (`id` 0: the lead or the request thread;
 * 1 … MAX_HELPERS: a helper): an Int32 header, an Int32 state (0 not in, 1 in) and owner (the helper that
 * took it; 0 the lead) per piece, and a Float64 number per piece. Atomics order the writes: a piece's
 * number is stored before its state says it is in. Only the server builds boards (create), never from a
 * request.
 */
export class SharedBoard implements PieceBoard {
  readonly capacity: number;
  private readonly head: Int32Array;
  private readonly state: Int32Array;
  private readonly owner: Int32Array;
  private readonly values: Float64Array;
  constructor(
    readonly buffer: SharedArrayBuffer,
    private readonly id = 0,
  ) {
    // Capacity even and the header of even length keep the numbers 8-byte aligned after the Int32 words.
    this.capacity = Math.max(0, 2 * Math.floor((buffer.byteLength - 4 * HEADER) / 32));
    this.head = new Int32Array(buffer, 0, HEADER);
    this.state = new Int32Array(buffer, 4 * HEADER, this.capacity);
    this.owner = new Int32Array(buffer, 4 * HEADER + 4 * this.capacity, this.capacity);
    this.values = new Float64Array(buffer, 4 * HEADER + 8 * this.capacity, this.capacity);
  }
  static create(capacity = BOARD_CAPACITY): SharedBoard {
    return new SharedBoard(new SharedArrayBuffer(4 * HEADER + 32 * Math.ceil(capacity / 2)));
  }
  take(): number {
    const at = Atomics.add(this.head, NEXT, 1) + 1;
    if (at < this.capacity && this.id > 0) Atomics.store(this.owner, at, this.id);
    return at;
  }
  put(at: number, value: number): void {
    if (at < 1 || at >= this.capacity) return;
    this.values[at] = value;
    Atomics.store(this.state, at, 1);
    Atomics.notify(this.state, at);
  }
  close(): void {
    Atomics.store(this.head, CLOSED, 1);
  }
  /** Whether the lead has taken the last piece (a helper starting now has nothing to do). */
  isClosed(): boolean {
    return Atomics.load(this.head, CLOSED) !== 0;
  }
  /** The helper that took a piece (0: the lead, or not taken by a helper). */
  ownerOf(at: number): number {
    return at > 0 && at < this.capacity ? Atomics.load(this.owner, at) : 0;
  }
  isIn(at: number): boolean {
    return at > 0 && at < this.capacity && Atomics.load(this.state, at) === 1;
  }
  collect(count: number): Float64Array {
    const out = new Float64Array(count);
    for (let at = 1; at < count; at++) {
      out[at] = NaN;
      while (Atomics.load(this.state, at) === 0) {
        // The piece's helper has settled without its number (or, owner not yet written, every helper has): its thread is gone.
        const o = Atomics.load(this.owner, at);
        const gone = Atomics.load(this.head, ALL_SETTLED) !== 0 || (o > 0 && Atomics.load(this.head, 3 + o) !== 0);
        if (gone && Atomics.load(this.state, at) === 0) break;
        Atomics.wait(this.state, at, 0, WAIT_MS);
      }
      if (Atomics.load(this.state, at) === 1) out[at] = this.values[at];
    }
    return out;
  }
  /** On the request thread, once helper `id`'s job has settled (done, failed or stopped); `all` once every helper's has. */
  helperSettled(id: number, all: boolean): void {
    if (id >= 1 && id <= MAX_HELPERS) Atomics.store(this.head, 3 + id, 1);
    if (all) Atomics.store(this.head, ALL_SETTLED, 1);
    for (let at = 1; at < this.capacity; at++) Atomics.notify(this.state, at);
  }
}

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
