"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/app/_server/db";
import { deleteTemplate, duplicateTemplate, saveTemplate, type SaveResult } from "@/lib/db/templates";
import { isTemplateKind } from "@/lib/schemas/templates";
import { authorize } from "@/app/_server/auth";

/** Saves a template; the zod schema of its kind checks the input again here. */
export async function saveTemplateAction(kind: string, id: number | null, version: number | null, data: unknown): Promise<SaveResult> {
  if (!isTemplateKind(kind)) return { ok: false, reason: "not_found", message: `Unknown template kind "${kind}"` };
  const who = await authorize("edit");
  if (!who.ok) return { ok: false, reason: "invalid", fieldErrors: { "": [who.message] } };
  const r = await saveTemplate(await getDb(), kind, id, version, data, who.actor);
  if (r.ok) revalidatePath(`/library/${kind}`);
  return r;
}

export async function deleteTemplateAction(kind: string, id: number): Promise<{ ok: boolean; message?: string }> {
  if (!isTemplateKind(kind)) return { ok: false, message: `Unknown template kind "${kind}"` };
  const who = await authorize("edit");
  if (!who.ok) return { ok: false, message: who.message };
  const r = await deleteTemplate(await getDb(), kind, id, who.actor);
  revalidatePath(`/library/${kind}`);
  return r;
}

export async function duplicateTemplateAction(kind: string, id: number): Promise<SaveResult> {
  if (!isTemplateKind(kind)) return { ok: false, reason: "not_found", message: `Unknown template kind "${kind}"` };
  const who = await authorize("edit");
  if (!who.ok) return { ok: false, reason: "invalid", fieldErrors: { "": [who.message] } };
  const r = await duplicateTemplate(await getDb(), kind, id, who.actor);
  revalidatePath(`/library/${kind}`);
  return r;
}
