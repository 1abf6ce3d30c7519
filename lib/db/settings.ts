import type { Db } from "./client";
import { settingsSchema, type Settings } from "../schemas/templates";
import { fieldErrorsOf, type FieldErrors } from "../schemas/errors";
import { DEFAULT_UNIT_PREFS } from "../units";

/** The single settings row (id 1). Created on first read. */
export async function getSettings(db: Db): Promise<Settings> {
  const row = await db.setting.findUnique({ where: { id: 1 } });
  if (!row) return { ...DEFAULT_UNIT_PREFS };
  const parsed = settingsSchema.safeParse(row);
  return parsed.success ? parsed.data : { ...DEFAULT_UNIT_PREFS };
}

export async function saveSettings(db: Db, input: unknown): Promise<{ ok: true; settings: Settings } | { ok: false; fieldErrors: FieldErrors }> {
  const parsed = settingsSchema.safeParse(input);
  if (!parsed.success) return { ok: false, fieldErrors: fieldErrorsOf(parsed.error) };
  await db.setting.upsert({
    where: { id: 1 },
    create: { id: 1, ...parsed.data },
    update: { ...parsed.data, version: { increment: 1 } },
  });
  return { ok: true, settings: parsed.data };
}
