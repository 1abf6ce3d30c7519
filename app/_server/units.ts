import "server-only";
import { getDb } from "./db";
import { getSettings } from "@/lib/db/settings";
import type { UnitPrefs } from "@/lib/units";

export async function currentUnits(): Promise<UnitPrefs> {
  return getSettings(await getDb());
}
