"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/app/_server/db";
import { saveSettings } from "@/lib/db/settings";

export async function saveSettingsAction(data: unknown) {
  const r = await saveSettings(await getDb(), data);
  if (r.ok) revalidatePath("/", "layout");
  return r;
}
