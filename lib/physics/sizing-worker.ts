/**
 * The message protocol shared by the sizer's workers (browser Web Workers and Node worker threads):
 * the same model code runs in every worker. Pure: no I/O; the host wires `handle` to its messaging.
 */
import type { SizeParsed } from "../schemas/size";
import { evaluateCandidate, planSizing, type CandidateResult, type SizingPlan } from "./sizing";

export type ToWorker = { type: "init"; inp: SizeParsed } | { type: "eval"; id: number; indices: number[] };
export type FromWorker = { type: "ready" } | { type: "results"; id: number; results: CandidateResult[] } | { type: "error"; id: number; message: string };

export function workerHandler(post: (m: FromWorker) => void): (m: ToWorker) => void {
  let inp: SizeParsed | null = null;
  let plan: SizingPlan | null = null;
  return (m) => {
    if (m.type === "init") {
      inp = m.inp;
      plan = planSizing(inp);
      post({ type: "ready" });
      return;
    }
    try {
      const results = m.indices.map((i) => evaluateCandidate(inp!, plan!.candidates[i], plan!.required_s, plan!.routeLength_s));
      post({ type: "results", id: m.id, results });
    } catch (e) {
      post({ type: "error", id: m.id, message: (e as Error).message });
    }
  };
}

/** A pool over any workers that speak the protocol: splits each batch into chunks and keeps every worker busy. */
export function makePool(workers: { post: (m: ToWorker) => void; onMessage: (f: (m: FromWorker) => void) => void }[], inp: SizeParsed, onChunk?: (n: number) => void) {
  let nextId = 1;
  const pending = new Map<number, { resolve: (r: CandidateResult[]) => void; reject: (e: Error) => void }>();
  for (const w of workers) {
    w.onMessage((m) => {
      if (m.type === "ready") return;
      const p = pending.get(m.id);
      if (!p) return;
      pending.delete(m.id);
      if (m.type === "results") {
        onChunk?.(m.results.length);
        p.resolve(m.results);
      } else p.reject(new Error(m.message));
    });
    w.post({ type: "init", inp });
  }
  // One shared queue: each worker takes the next small chunk as soon as it is free, so a worker that drew
  // cheap candidates (early failures) is never left idle while the other works through expensive ones.
  const evaluate = async (indices: number[]): Promise<CandidateResult[]> => {
    const chunk = Math.max(1, Math.min(4, Math.ceil(indices.length / (workers.length * 6))));
    let next = 0;
    const out: CandidateResult[][] = [];
    await Promise.all(
      workers.map(async (w) => {
        while (next < indices.length) {
          const part = indices.slice(next, next + chunk);
          next += part.length;
          const id = nextId++;
          out.push(
            await new Promise<CandidateResult[]>((resolve, reject) => {
              pending.set(id, { resolve, reject });
              w.post({ type: "eval", id, indices: part });
            }),
          );
        }
      }),
    );
    return out.flat();
  };
  /** Rejects every request still waiting (after the workers were stopped). */
  const cancel = () => {
    for (const p of pending.values()) p.reject(new Error("cancelled"));
    pending.clear();
  };
  return Object.assign(evaluate, { cancel });
}
