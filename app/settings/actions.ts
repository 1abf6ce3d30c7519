"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/app/_server/db";
import { saveSettings } from "@/lib/db/settings";
import { authorize } from "@/app/_server/auth";

export async function saveSettingsAction(data: unknown) {
  const who = await authorize("edit");
  if (!who.ok) return { ok: false as const, fieldErrors: { "": [who.message] } };
  const r = await saveSettings(await getDb(), data);
  if (r.ok) revalidatePath("/", "layout");
  return r;
}
