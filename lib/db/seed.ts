import type { Db } from "./client";
import { DEMO_SCENARIO } from "./demo-scenario";
import { importLibrary } from "./library";
import { countTemplates } from "./templates";

/**
 * Seeds the demo scenario once, into a database that has never been seeded and holds
 * no templates. A database with user data, or one already seeded (even if the user
 * has since deleted the demo), is never touched.
 */
export async function seedIfFresh(db: Db): Promise<"seeded" | "skipped"> {
  const setting = await db.setting.findUnique({ where: { id: 1 } });
  if (setting?.seededAt) return "skipped";
  if ((await countTemplates(db)) > 0) {
    await db.setting.upsert({ where: { id: 1 }, create: { id: 1, seededAt: new Date() }, update: { seededAt: new Date() } });
    return "skipped";
  }
  const r = await importLibrary(db, DEMO_SCENARIO);
  if (!r.ok) throw new Error("Demo scenario failed its own schema:\n" + r.errors.join("\n"));
  await db.setting.upsert({ where: { id: 1 }, create: { id: 1, seededAt: new Date() }, update: { seededAt: new Date() } });
  return "seeded";
}
