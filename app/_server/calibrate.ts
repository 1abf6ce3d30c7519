import "server-only";
import { z } from "zod";
import { getDb } from "./db";
import { runCalculation } from "./calc-pool";
import { computeAndSavePlan } from "./plans";
import { resolvePlannerInput } from "@/lib/db/resolve";
import { saveTemplate } from "@/lib/db/templates";
import { calibrateInputSchema } from "@/lib/schemas/calibrate";
import { calibratedShipper } from "@/lib/calibration/calibrated-box";
import { calibratePlanner } from "@/lib/planners/calibrate";
import type { CalibrationResult } from "@/lib/physics/calibrate";
import { fieldErrorsOf, type FieldErrors } from "@/lib/schemas/errors";
import type { Actor } from "@/lib/db/audit";

/** `{ input, name? }`: a calibrate input (templates by name or spelled out) and the new box's name (default: "<box> — calibrated <log> <date>"). */
export const saveCalibratedBoxSchema = z.object({
  input: z.unknown().refine((x) => typeof x === "object" && x !== null, { error: "The calibration input is missing" }),
  name: z.string().trim().max(120, { error: "Name: at most 120 characters" }).optional(),
});

export type SaveCalibratedBoxOutcome =
  | { ok: true; shipperId: number; shipperName: string; planId: number; result: CalibrationResult }
  | { ok: false; status: 422 | 503 | 500; message: string; fieldErrors: FieldErrors };

const prefixed = (e: FieldErrors): FieldErrors => Object.fromEntries(Object.entries(e).map(([k, v]) => [k ? `input.${k}` : "input", v]));

/**
 * "Use what was measured", the one way from the page and the API: the server fits the log itself (in the
 * worker pool; a client's factors are never stored), saves the plan's box as a new template with the fitted
 * factors and their provenance, and saves a hold plan with that box, to reopen on the hold page.
 */
export async function computeAndSaveCalibratedBox(body: unknown, actor: Actor): Promise<SaveCalibratedBoxOutcome> {
  const req = saveCalibratedBoxSchema.safeParse(body);
  if (!req.success) return { ok: false, status: 422, message: "Some fields are not valid", fieldErrors: fieldErrorsOf(req.error) };
  const db = await getDb();
  const resolved = await resolvePlannerInput(db, "calibrate", req.data.input);
  if (!resolved.ok) return { ok: false, status: 422, message: "Some fields are not valid", fieldErrors: prefixed(resolved.fieldErrors) };
  const parsed = calibrateInputSchema.safeParse(resolved.value);
  if (!parsed.success) return { ok: false, status: 422, message: "Some fields are not valid", fieldErrors: prefixed(fieldErrorsOf(parsed.error)) };
  const inp = parsed.data;
  if (inp.planner !== "hold") {
    const message = "A thaw method is not a library template: put the result's calibration object into the thaw input instead (its `calibration` field)";
    return { ok: false, status: 422, message, fieldErrors: { "input.planner": [message] } };
  }
  const r = await runCalculation("calibrate", resolved.value);
  if (!r.ok) return { ok: false, status: r.status, message: r.message, fieldErrors: prefixed(r.fieldErrors) };
  const result = JSON.parse(r.json) as CalibrationResult;
  const box = calibratedShipper(inp.plan.shipper, result, { name: req.data.name, fittedOn: new Date() });
  if (!box) {
    const message = "The log could not identify any factor (see the warnings), so there is nothing measured to save: the box stays as built";
    return { ok: false, status: 422, message, fieldErrors: { "": [message] } };
  }
  const saved = await saveTemplate(db, "shippers", null, null, box, actor);
  if (!saved.ok) {
    const fe = saved.reason === "invalid" ? Object.fromEntries(Object.entries(saved.fieldErrors).map(([k, v]) => [k === "name" ? "name" : `box.${k}`, v])) : { "": [saved.message] };
    return { ok: false, status: 422, message: saved.reason === "invalid" ? "The calibrated box could not be saved" : saved.message, fieldErrors: fe };
  }
  // The plan again with the calibrated box (and no calibration of its own, so the box's applies).
  const { calibration: _own, ...rest } = (resolved.value as { plan: Record<string, unknown> }).plan;
  const rawPlan = { ...rest, shipper: box };
  const plan = await computeAndSavePlan({ kind: "hold", name: `${calibratePlanner.defaultName(inp).replace(/ calibrated from .*/, "")} — with ${box.name}`.slice(0, 200), input: rawPlan }, actor);
  if (!plan.ok) return { ok: false, status: plan.status, message: `The calibrated box "${box.name}" was saved, but the plan with it was not: ${plan.message}`, fieldErrors: plan.fieldErrors };
  return { ok: true, shipperId: saved.id, shipperName: box.name, planId: plan.id, result };
}
