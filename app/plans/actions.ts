"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/app/_server/db";
import { savePlan, planSchema } from "@/lib/db/plans";
import { fieldErrorsOf, type FieldErrors } from "@/lib/schemas/errors";
import { authorize } from "@/app/_server/auth";

export async function savePlanAction(plan: unknown): Promise<{ ok: true; id: number } | { ok: false; fieldErrors: FieldErrors }> {
  const parsed = planSchema.safeParse(plan);
  if (!parsed.success) return { ok: false, fieldErrors: fieldErrorsOf(parsed.error) };
  const who = await authorize("plan");
  if (!who.ok) return { ok: false, fieldErrors: { "": [who.message] } };
  const id = await savePlan(await getDb(), parsed.data, who.actor);
  revalidatePath("/plans");
  return { ok: true, id };
}
