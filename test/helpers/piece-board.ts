/**
 * A PieceBoard on one thread for tests: `helperTakes` caps how many pieces a helper role may take (so a
 * helper run first, then the lead, plays two threads sharing the pieces), and `giveUp` makes the helper's
 * number for those pieces NaN (a thread that failed on them).
 */
import type { PieceBoard } from "../../lib/planners/run";

export class TestBoard implements PieceBoard {
  readonly values = new Map<number, number>();
  taken = 0;
  closed = false;
  private helperLeft = Infinity;
  constructor(
    readonly capacity = 1024,
    private readonly giveUp: number[] = [],
  ) {}
  /** The next `n` pieces go to the helper role run next. */
  helper(n: number): this {
    this.helperLeft = n;
    return this;
  }
  lead(): this {
    this.helperLeft = Infinity;
    return this;
  }
  take(): number {
    if (this.helperLeft <= 0) return Number.MAX_SAFE_INTEGER;
    this.helperLeft--;
    return ++this.taken;
  }
  put(at: number, value: number): void {
    this.values.set(at, this.giveUp.includes(at) ? NaN : value);
  }
  close(): void {
    this.closed = true;
  }
  isClosed(): boolean {
    return this.closed;
  }
  withdrawn(): boolean {
    return false;
  }
  collect(count: number): Float64Array {
    const out = new Float64Array(count);
    for (let at = 1; at < count; at++) out[at] = this.values.get(at) ?? NaN;
    return out;
  }
}
