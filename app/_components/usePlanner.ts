"use client";
import { useEffect, useRef, useState } from "react";
import type { FromPlannerWorker, ToPlannerWorker } from "@/lib/planners/worker-protocol";
import type { PlannerKind } from "@/lib/planners/registry";
import type { CsvRow, PlanView } from "@/lib/planners/types";
import type { FieldErrors } from "@/lib/schemas/errors";
import { useUnits } from "./units-context";

/** How long the page waits after the last change before asking the worker (ms): typing a number is one request. */
export const INPUT_DEBOUNCE_MS = 40;

export type PlannerState =
  | { status: "working" }
  | { status: "invalid"; fieldErrors: FieldErrors }
  | { status: "error"; message: string }
  | { status: "ready"; stage: "quick" | "full"; view: PlanView; csv: CsvRow[]; parsed: unknown; result: unknown; stale: boolean };

type Answer = (Exclude<PlannerState, { status: "ready" }> | Omit<Extract<PlannerState, { status: "ready" }>, "stale">) & { forKey: string };

declare global {
  interface Window {
    /** Time from the last input change to each answer, for the browser suite's latency figures. */
    __holdlineTimings?: { kind: string; stage: string; ms: number; compute_ms: number }[];
  }
}

/**
 * Runs a planner in a Web Worker on every input change (debounced), keeping the page's thread free; the
 * last good answer stays on screen, marked as being updated, until the new one arrives.
 */
export function usePlanner(kind: PlannerKind, input: unknown): PlannerState {
  const units = useUnits();
  const worker = useRef<Worker | null>(null);
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
      else setAnswer({ status: "error", message: m.message, forKey });
    };
    return () => {
      w.terminate();
      worker.current = null;
    };
  }, [kind]);

  useEffect(() => {
    changedAt.current = performance.now();
    const id = ++seq.current;
    sent.current.clear();
    sent.current.set(id, key + JSON.stringify(units));
    const t = setTimeout(() => {
      const msg: ToPlannerWorker = { type: "run", id, kind, input: JSON.parse(key), units };
      worker.current?.postMessage(msg);
    }, INPUT_DEBOUNCE_MS);
    return () => clearTimeout(t);
  }, [key, kind, units]);

  const current = key + JSON.stringify(units);
  if (answer.status === "ready") return { ...answer, stale: answer.forKey !== current };
  return answer;
}
