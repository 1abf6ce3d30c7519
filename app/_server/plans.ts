import "server-only";
import { getDb } from "./db";
import { runCalculation } from "./calc-pool";
import { resolvePlannerInput } from "@/lib/db/resolve";
import { planRequestSchema, savePlan } from "@/lib/db/plans";
import { fieldErrorsOf, type FieldErrors } from "@/lib/schemas/errors";
import type { Actor } from "@/lib/db/audit";

export type SavePlanOutcome = { ok: true; id: number } | { ok: false; status: 422 | 503 | 500; message: string; fieldErrors: FieldErrors };

/**
 * Saves a plan the one way, from a page or the API: check the request, copy in named templates, compute
 * the result in the worker pool (the result stored is the server's own), then store input and result.
 */
export async function computeAndSavePlan(body: unknown, actor: Actor): Promise<SavePlanOutcome> {
  const req = planRequestSchema.safeParse(body);
  if (!req.success) return { ok: false, status: 422, message: "Some fields are not valid", fieldErrors: fieldErrorsOf(req.error) };
  const db = await getDb();
  const resolved = await resolvePlannerInput(db, req.data.kind, req.data.input);
  if (!resolved.ok) return { ok: false, status: 422, message: "Some fields are not valid", fieldErrors: prefixed(resolved.fieldErrors) };
  const r = await runCalculation(req.data.kind, resolved.value);
  if (!r.ok) return { ok: false, status: r.status, message: r.message, fieldErrors: prefixed(r.fieldErrors) };
  const id = await savePlan(db, { kind: req.data.kind, name: req.data.name, input: resolved.value, result: JSON.parse(r.json) }, actor);
  return { ok: true, id };
}

const prefixed = (e: FieldErrors): FieldErrors => Object.fromEntries(Object.entries(e).map(([k, v]) => [k ? `input.${k}` : "input", v]));
