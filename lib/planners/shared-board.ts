/**
 * Where the threads running one calculation's pieces (PlannerEntry.pieces: the hold planner's central run
 * and band corners) meet, in shared memory: the server's worker pool (app/_server/calc-pieces.ts) and the
 * page's two planner workers (app/_components/usePlanner.ts) use the same board. Pure: a SharedArrayBuffer
 * and Atomics, no host API.
 */
import type { PieceBoard } from "./run";

/** Pieces a board has room for: far more than any plan's sample (a run with more is run whole by its lead). */
export const BOARD_CAPACITY = 1024;
/** Helpers one board can name (ids 1 … MAX_HELPERS). */
export const MAX_HELPERS = 7;
/** How long one wait for a piece lasts before its helper's state is looked at again, ms. */
const WAIT_MS = 50;

/** Header words: the last piece taken; closed (the lead has taken the last piece); every helper settled; then each helper's settled flag; withdrawn last. */
const NEXT = 0;
const CLOSED = 1;
const ALL_SETTLED = 2;
/** Set when a newer request has replaced this one (withdraw). */
const WITHDRAWN = 3 + MAX_HELPERS + 1;
const HEADER = 4 + MAX_HELPERS + 1;

/**
 * The board over one SharedArrayBuffer, as seen by one thread (`id` 0: the lead or the request thread;
 * 1 … MAX_HELPERS: a helper): an Int32 header, an Int32 state (0 not in, 1 in) and owner (the helper that
 * took it; 0 the lead) per piece, and a Float64 number per piece. Atomics order the writes: a piece's
 * number is stored before its state says it is in. Only a host builds boards (create), never from a
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
    if (Atomics.load(this.head, WITHDRAWN) !== 0) return this.capacity;
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
        // Or no thread has taken it (the board was withdrawn before it came up).
        const gone = Atomics.load(this.head, ALL_SETTLED) !== 0 || (o > 0 && Atomics.load(this.head, 3 + o) !== 0) || at > Atomics.load(this.head, NEXT);
        if (gone && Atomics.load(this.state, at) === 0) break;
        Atomics.wait(this.state, at, 0, WAIT_MS);
      }
      if (Atomics.load(this.state, at) === 1) out[at] = this.values[at];
    }
    return out;
  }
  /**
   * A newer request has replaced this one (the page's workers): no thread takes another piece from it. A
   * lead or helper still on it stops after its current piece, the lead without an answer (runPlannerPieces).
   */
  withdraw(): void {
    Atomics.store(this.head, WITHDRAWN, 1);
    Atomics.store(this.head, CLOSED, 1);
  }
  withdrawn(): boolean {
    return Atomics.load(this.head, WITHDRAWN) !== 0;
  }
  /** On the host's own thread (the request thread, the page), once helper `id`'s job has settled (done, failed or stopped); `all` once every helper's has. */
  helperSettled(id: number, all: boolean): void {
    if (id >= 1 && id <= MAX_HELPERS) Atomics.store(this.head, 3 + id, 1);
    if (all) Atomics.store(this.head, ALL_SETTLED, 1);
    for (let at = 1; at < this.capacity; at++) Atomics.notify(this.state, at);
  }
}
