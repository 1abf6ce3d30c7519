"use server";
import { revalidatePath } from "next/cache";
import { authorize } from "@/app/_server/auth";
import { computeAndSaveCalibratedBox } from "@/app/_server/calibrate";
import type { FieldErrors } from "@/lib/schemas/errors";

type Outcome = { ok: true; shipperId: number; shipperName: string; planId: number } | { ok: false; fieldErrors: FieldErrors };

/** Saves the calibrated box of `{ input, name? }` (editors only); the server fits the log itself. */
export async function saveCalibratedBoxAction(body: unknown): Promise<Outcome> {
  const who = await authorize("edit");
  if (!who.ok) return { ok: false, fieldErrors: { "": [who.message] } };
  const r = await computeAndSaveCalibratedBox(body, who.actor);
  if (!r.ok) return { ok: false, fieldErrors: Object.keys(r.fieldErrors).length ? r.fieldErrors : { "": [r.message] } };
  revalidatePath("/library");
  revalidatePath("/plans");
  revalidatePath("/hold");
  return { ok: true, shipperId: r.shipperId, shipperName: r.shipperName, planId: r.planId };
}
