/**
 * How the server's pool runs one calculation: whole on one thread, or, for a planner whose run comes in
 * shares (PlannerEntry.shares: the hold planner's central run and band corners), each share on its own
 * thread side by side and then one more job that puts them together. No job waits for another inside the
 * pool, so a full pool cannot deadlock. Free of server-only imports so that the benchmark runs the same
 * code against its own pool.
 */
import type { CalcAnswer, CalcJob, Calculation, ShareAnswer } from "./calc-worker";
import { plannerOf } from "../../lib/planners/registry";

export async function runWhole(kind: Calculation, input: unknown, threads: number, run: (job: CalcJob) => Promise<CalcAnswer | ShareAnswer>): Promise<CalcAnswer> {
  const shares = plannerOf(kind).shares;
  if (!shares || threads < 2) return whole(await run({ kind, input }));
  const of = Math.min(shares.count, threads);
  const answers = await Promise.all(Array.from({ length: of }, (_, index) => run({ kind, input, share: { index, of } })));
  const parts: unknown[] = [];
  for (const a of answers) {
    if (!a.ok) return a;
    if ("part" in a) parts.push(a.part);
  }
  return whole(await run({ kind, input, share: { parts } }));
}

/** A whole job's answer (a share's answer here would be a defect of this module). */
function whole(a: CalcAnswer | ShareAnswer): CalcAnswer {
  if (a.ok && "part" in a) return { ok: false, status: 500, message: "A share of a calculation came back where its whole answer was expected", fieldErrors: {} };
  return a;
}
