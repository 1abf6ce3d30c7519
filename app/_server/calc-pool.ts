import "server-only";
import { availableParallelism } from "node:os";
import path from "node:path";
import { existsSync } from "node:fs";
import { Piscina } from "piscina";
import type { CalcAnswer, CalcJob, Calculation, HelperAnswer } from "./calc-worker";
import { runWhole } from "./calc-pieces";
import { plannerOf } from "@/lib/planners/registry";

/**
 * The server's calculation pool: every hold, thaw, warm-up and sizing runs in a worker thread, so the
 * request thread stays free for pages and template lists. Each job has a time limit; when it runs out the
 * worker is stopped (piscina terminates the thread on abort) and the caller gets a clear 422. A full queue,
 * or a second heavy sizing while one already holds every spare thread, is a 503 with Retry-After.
 *
 * The worker is the prebuilt bundle dist/calc-worker.mjs (scripts/bundle.mjs, run by postinstall and
 * prebuild), so the server never needs a TypeScript loader in its threads.
 */
/** Each planner's time limit and what to change when it runs out: its registry entry (lib/planners/). */
export const timeLimitDefault = (kind: Calculation): number => plannerOf(kind).timeLimit_s;

const MAX_QUEUE = 64;

export type PoolOutcome = CalcAnswer | { ok: false; status: 503; message: string; fieldErrors: Record<string, string[]>; retryAfter_s: number };

interface PoolState {
  pool: Piscina<CalcJob, CalcAnswer | HelperAnswer>;
  threads: number;
  sizingRunning: number;
  /** Jobs sent to the pool and not yet settled (queued or running), helpers included. */
  jobs: number;
}
const g = globalThis as unknown as { __holdlineCalcPool?: PoolState };

/** The bundle's path, found at run time (the build must not trace it: it is not part of Next's output). */
export function workerFile(): string {
  return path.resolve(/*turbopackIgnore: true*/ process.env.HOLDLINE_WORKER_FILE ?? path.join(/*turbopackIgnore: true*/ process.cwd(), "dist", "calc-worker.mjs"));
}

function state(): PoolState {
  if (!g.__holdlineCalcPool) {
    const filename = workerFile();
    if (!existsSync(/*turbopackIgnore: true*/ filename)) throw new Error(`The calculation worker ${filename} is missing: run \`npm run bundle\` (npm install and npm run build do it)`);
    const threads = Math.max(2, availableParallelism());
    g.__holdlineCalcPool = {
      // niceIncrement (19, the lowest) lowers the worker threads' CPU priority (Linux, through the optional @napi-rs/nice),
      // so the request thread is never starved by a long sizing on a busy machine.
      pool: new Piscina<CalcJob, CalcAnswer | HelperAnswer>({ filename, minThreads: Math.min(2, threads), maxThreads: threads, maxQueue: MAX_QUEUE, idleTimeout: 60_000, niceIncrement: 19 }),
      threads,
      sizingRunning: 0,
      jobs: 0,
    };
  }
  return g.__holdlineCalcPool;
}

/** Runs one calculation in the pool with its time limit (seconds; the kind's default unless given). */
export async function runCalculation(kind: Calculation, input: unknown, limit_s = timeLimitOf(kind)): Promise<PoolOutcome> {
  const s = state();
  // A sizing may take minutes: never let sizings take every thread, so a hold or thaw always has one.
  if (kind === "size" && s.sizingRunning >= Math.max(1, s.threads - 1)) {
    return { ok: false, status: 503, message: "Another pack-out sizing is running; try again when it has finished", fieldErrors: {}, retryAfter_s: 10 };
  }
  if (s.pool.queueSize >= MAX_QUEUE) return busy();
  if (kind === "size") s.sizingRunning++;
  const signal = AbortSignal.timeout(limit_s * 1000);
  try {
    // Pieces go only to threads that are free now (none queued behind other work).
    const idle = Math.max(0, s.threads - s.jobs);
    const send = (job: CalcJob) => {
      s.jobs++;
      return s.pool.run(job, { signal }).finally(() => s.jobs--);
    };
    return await runWhole(kind, input, idle, send);
  } catch (e) {
    const err = e as Error;
    if (err?.name === "AbortError" || err?.name === "TimeoutError") {
      const message = `This calculation took longer than ${limit_s} s and was stopped: ${plannerOf(kind).tooLongHint}`;
      return { ok: false, status: 422, message, fieldErrors: { "": [message] } };
    }
    if (/queue is at limit/i.test(err?.message ?? "")) return busy();
    throw e;
  } finally {
    if (kind === "size") s.sizingRunning--;
  }
}

function busy(): PoolOutcome {
  return { ok: false, status: 503, message: "The server is busy with other calculations; try again in a few seconds", fieldErrors: {}, retryAfter_s: 5 };
}

/** The time limit of a kind of job; HOLDLINE_CALC_TIME_LIMIT_S (seconds) overrides every kind's. */
export function timeLimitOf(kind: Calculation): number {
  const env = Number(process.env.HOLDLINE_CALC_TIME_LIMIT_S);
  return Number.isFinite(env) && env > 0 ? env : timeLimitDefault(kind);
}

/** For tests and shutdown. */
export async function closeCalculationPool(): Promise<void> {
  const s = g.__holdlineCalcPool;
  g.__holdlineCalcPool = undefined;
  if (s) await s.pool.destroy();
}
