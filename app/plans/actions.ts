"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/app/_server/db";
import { computeAndSavePlan } from "@/app/_server/plans";
import { deletePlan, planNameSchema, renamePlan } from "@/lib/db/plans";
import type { FieldErrors } from "@/lib/schemas/errors";
import { authorize } from "@/app/_server/auth";
import { parseId } from "@/lib/schemas/id";

type Outcome = { ok: true; id: number } | { ok: false; fieldErrors: FieldErrors };

/** Saves `{ kind, name, input }`: the server computes the result it stores. */
export async function savePlanAction(plan: unknown): Promise<Outcome> {
  const who = await authorize("plan");
  if (!who.ok) return { ok: false, fieldErrors: { "": [who.message] } };
  const r = await computeAndSavePlan(plan, who.actor);
  if (!r.ok) return { ok: false, fieldErrors: Object.keys(r.fieldErrors).length ? r.fieldErrors : { "": [r.message] } };
  revalidatePath("/plans");
  return { ok: true, id: r.id };
}

export async function renamePlanAction(rawId: unknown, name: unknown): Promise<Outcome> {
  const who = await authorize("plan");
  if (!who.ok) return { ok: false, fieldErrors: { "": [who.message] } };
  const id = parseId(rawId);
  if (id === null) return { ok: false, fieldErrors: { id: ["No such plan"] } };
  const n = planNameSchema.safeParse(name);
  if (!n.success) return { ok: false, fieldErrors: { name: [n.error.issues[0].message] } };
  if (!(await renamePlan(await getDb(), id, n.data))) return { ok: false, fieldErrors: { id: ["No such plan"] } };
  revalidatePath("/plans");
  revalidatePath(`/plans/${id}`);
  return { ok: true, id };
}

export async function deletePlanAction(rawId: unknown): Promise<Outcome> {
  const who = await authorize("plan");
  if (!who.ok) return { ok: false, fieldErrors: { "": [who.message] } };
  const id = parseId(rawId);
  if (id === null || !(await deletePlan(await getDb(), id))) return { ok: false, fieldErrors: { id: ["No such plan"] } };
  revalidatePath("/plans");
  return { ok: true, id };
}
