"use client";
import { useEffect, useRef, useState } from "react";
import type { FromPlannerWorker, ToPlannerWorker } from "@/lib/planners/worker-protocol";
import type { PlannerKind } from "@/lib/planners/registry";
import type { CsvRow, PlanView } from "@/lib/planners/types";
import type { FieldErrors } from "@/lib/schemas/errors";
import { SharedBoard } from "@/lib/planners/shared-board";
import { useUnits } from "./units-context";

/** How long the page waits after the last change before asking the worker (ms): typing a number is one request. */
export const INPUT_DEBOUNCE_MS = 40;
/**
 * How long the page waits for the helper worker to say it has finished with a request's board before it
 * stops it and lets the first worker go on alone (ms): a helper that died without an error event would
 * otherwise keep the lead waiting for the piece it took. The hold planner's own limit on the server is 30 s.
 */
export const HELPER_TIMEOUT_MS = 30_000;

export type PlannerState =
  | { status: "working" }
  | { status: "invalid"; fieldErrors: FieldErrors }
  | { status: "error"; message: string }
  | { status: "ready"; stage: "quick" | "full"; view: PlanView; csv: CsvRow[]; parsed: unknown; result: unknown; stale: boolean };

type Answer = (Exclude<PlannerState, { status: "ready" }> | Omit<Extract<PlannerState, { status: "ready" }>, "stale">) & { forKey: string };

declare global {
  interface Window {
    /** Time from the last input change to each answer, for the browser suite's latency figures. */
    __holdlineTimings?: { kind: string; stage: string; ms: number; compute_ms: number; pieces?: number }[];
  }
}

/**
 * Whether the page can share memory with its workers (it is served cross-origin isolated: next.config.js)
 * and has a second core for a helper worker.
 */
function canShareWork(): boolean {
  return typeof SharedArrayBuffer !== "undefined" && globalThis.crossOriginIsolated === true && (navigator.hardwareConcurrency ?? 1) > 1;
}

/**
 * Runs a planner in a Web Worker on every input change (debounced), keeping the page's thread free; the
 * last good answer stays on screen, marked as being updated, until the new one arrives. Where memory can be
 * shared, a second worker helps with the planner's pieces (the hold planner's band corners) on a board
 * both workers share (lib/planners/worker-protocol.ts); the answer is the same.
 */
export function usePlanner(kind: PlannerKind, input: unknown): PlannerState {
  const units = useUnits();
  const worker = useRef<Worker | null>(null);
  const helper = useRef<Worker | null>(null);
  /** Each request's board while the helper may still be on it; and the last request's, until the next. */
  const boards = useRef(new Map<number, SharedBoard>());
  const lastBoard = useRef<SharedBoard | null>(null);
  /** Starts the wait for the helper's word on a request's board (HELPER_TIMEOUT_MS). */
  const helperTimeout = useRef<(id: number) => void>(() => {});
  const seq = useRef(0);
  const changedAt = useRef(0);
  const key = JSON.stringify(input ?? null);
  const [answer, setAnswer] = useState<Answer>({ status: "working", forKey: "" });
  /** The input each request was for, so an answer knows whether it is still current. */
  const sent = useRef(new Map<number, string>());

  useEffect(() => {
    const w = new Worker(new URL("./planner.worker.ts", import.meta.url), { type: "module" });
    worker.current = w;
    w.onmessage = (e: MessageEvent<FromPlannerWorker>) => {
      const m = e.data;
      if (m.id !== seq.current) return; // a newer request is on its way
      (window.__holdlineTimings ??= []).push({ kind, stage: m.type === "result" ? m.stage : m.type, ms: performance.now() - changedAt.current, compute_ms: m.type === "result" ? m.compute_ms : 0 });
      const forKey = sent.current.get(m.id) ?? "";
      if (m.type === "result") setAnswer({ status: "ready", stage: m.stage, view: m.view, csv: m.csv, parsed: m.parsed, result: m.result, forKey });
      else if (m.type === "invalid") setAnswer({ status: "invalid", fieldErrors: m.fieldErrors, forKey });
      else if (m.type === "error") setAnswer({ status: "error", message: m.message, forKey });
    };
    // The helper: once it has finished with a board, the lead no longer waits for pieces it took.
    const timers = new Map<number, ReturnType<typeof setTimeout>>();
    const settle = (id: number) => {
      const b = boards.current.get(id);
      if (!b) return;
      clearTimeout(timers.get(id));
      timers.delete(id);
      b.helperSettled(1, true);
      boards.current.delete(id);
      // How many pieces the helper put in, for the browser suite.
      let pieces = 0;
      for (let at = 1; at < b.capacity; at++) if (b.ownerOf(at) === 1 && b.isIn(at)) pieces++;
      (window.__holdlineTimings ??= []).push({ kind, stage: "helped", ms: performance.now() - changedAt.current, compute_ms: 0, pieces });
    };
    const h = canShareWork() ? new Worker(new URL("./planner.worker.ts", import.meta.url), { type: "module" }) : null;
    helper.current = h;
    // A helper that fails, or stays silent past HELPER_TIMEOUT_MS, is stopped: the first worker goes on alone.
    const drop = () => {
      h?.terminate();
      if (helper.current === h) helper.current = null;
      for (const id of [...boards.current.keys()]) settle(id);
    };
    if (h) {
      h.onmessage = (e: MessageEvent<FromPlannerWorker>) => {
        if (e.data.type === "helped") settle(e.data.id);
      };
      h.onerror = drop;
    }
    helperTimeout.current = (id: number) => timers.set(id, setTimeout(drop, HELPER_TIMEOUT_MS));
    const open = boards.current;
    return () => {
      for (const t of timers.values()) clearTimeout(t);
      timers.clear();
      helperTimeout.current = () => {};
      w.terminate();
      h?.terminate();
      worker.current = null;
      helper.current = null;
      for (const b of open.values()) b.helperSettled(1, true);
      open.clear();
    };
  }, [kind]);

  useEffect(() => {
    changedAt.current = performance.now();
    const id = ++seq.current;
    sent.current.clear();
    sent.current.set(id, key + JSON.stringify(units));
    const t = setTimeout(() => {
      const input: unknown = JSON.parse(key);
      // A newer request: no worker takes another piece of the older one (its lead stops too). Every board
      // before it was withdrawn when its own successor went out.
      lastBoard.current?.withdraw();
      let board: SharedBoard | null = null;
      if (helper.current) {
        board = SharedBoard.create();
        boards.current.set(id, board);
        lastBoard.current = board;
        const help: ToPlannerWorker = { type: "help", id, kind, input, board: board.buffer };
        helper.current.postMessage(help);
        helperTimeout.current(id);
      }
      const msg: ToPlannerWorker = { type: "run", id, kind, input, units, ...(board ? { board: board.buffer } : {}) };
      worker.current?.postMessage(msg);
    }, INPUT_DEBOUNCE_MS);
    return () => clearTimeout(t);
  }, [key, kind, units]);

  const current = key + JSON.stringify(units);
  if (answer.status === "ready") return { ...answer, stale: answer.forKey !== current };
  return answer;
}
