/**
 * Runs a planner on untrusted input, the one way every host does it (the server's worker pool, the
 * browser's planner worker, the CLI): check with the entry's zod schema, compute; bad input comes back as
 * field errors, a physics input error (valid shape, impossible value) names its field.
 */
import { fieldErrorsOf } from "../schemas/errors";
import type { FieldErrors } from "../schemas/errors";
import { PhysicsInputError } from "../physics/validation";
import type { PlannerEntry } from "./types";

export type PlannerRun =
  | { ok: true; result: { parsed: unknown; result: unknown; pending: string | null } }
  /** `message`: the physics input error's own words; absent for schema problems ("Some fields are not valid"). */
  | { ok: false; fieldErrors: FieldErrors; message?: string };

/** With stage "quick", runs the entry's cheaper first answer where it has one (`pending` says what is to come). */
export async function runPlanner(entry: PlannerEntry, input: unknown, stage: "quick" | "full" = "full"): Promise<PlannerRun> {
  const parsed = entry.schema.safeParse(input);
  if (!parsed.success) return { ok: false, fieldErrors: fieldErrorsOf(parsed.error) };
  try {
    const q = stage === "quick" ? entry.quick(parsed.data) : null;
    // Nothing cheaper to show first: the quick stage computes nothing (the full stage follows).
    if (stage === "quick" && !q) return { ok: true, result: { parsed: parsed.data, result: undefined, pending: null } };
    const result = await entry.run(q ? q.input : parsed.data);
    return { ok: true, result: { parsed: parsed.data, result, pending: q ? q.pending : null } };
  } catch (e) {
    if (e instanceof PhysicsInputError) return { ok: false, fieldErrors: { [e.field]: [e.message] }, message: e.message };
    throw e;
  }
}

/**
 * One share of a planner's full run (PlannerEntry.shares), or, with `parts`, all of them put together: on
 * untrusted input, checked and reported as runPlanner does. For hosts that run the shares side by side.
 */
export function runPlannerShare(entry: PlannerEntry, input: unknown, share: { index: number; of: number } | { parts: unknown[] }): { ok: true; value: unknown } | { ok: false; fieldErrors: FieldErrors; message?: string } {
  const sh = entry.shares;
  if (!sh) return { ok: false, fieldErrors: { "": ["This calculation does not come in shares"] }, message: "This calculation does not come in shares" };
  const parsed = entry.schema.safeParse(input);
  if (!parsed.success) return { ok: false, fieldErrors: fieldErrorsOf(parsed.error) };
  try {
    return { ok: true, value: "parts" in share ? sh.join(parsed.data, share.parts) : sh.runPart(parsed.data, share.index, share.of) };
  } catch (e) {
    if (e instanceof PhysicsInputError) return { ok: false, fieldErrors: { [e.field]: [e.message] }, message: e.message };
    throw e;
  }
}

