"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/app/_server/db";
import { deleteTemplate, duplicateTemplate, saveTemplate, type SaveResult } from "@/lib/db/templates";
import { isTemplateKind } from "@/lib/schemas/templates";

/** Saves a template; the zod schema of its kind checks the input again here. */
export async function saveTemplateAction(kind: string, id: number | null, version: number | null, data: unknown): Promise<SaveResult> {
  if (!isTemplateKind(kind)) return { ok: false, reason: "not_found", message: `Unknown template kind "${kind}"` };
  const r = await saveTemplate(await getDb(), kind, id, version, data);
  if (r.ok) revalidatePath(`/library/${kind}`);
  return r;
}

export async function deleteTemplateAction(kind: string, id: number): Promise<{ ok: boolean; message?: string }> {
  if (!isTemplateKind(kind)) return { ok: false, message: `Unknown template kind "${kind}"` };
  const r = await deleteTemplate(await getDb(), kind, id);
  revalidatePath(`/library/${kind}`);
  return r;
}

export async function duplicateTemplateAction(kind: string, id: number): Promise<SaveResult> {
  if (!isTemplateKind(kind)) return { ok: false, reason: "not_found", message: `Unknown template kind "${kind}"` };
  const r = await duplicateTemplate(await getDb(), kind, id);
  revalidatePath(`/library/${kind}`);
  return r;
}
