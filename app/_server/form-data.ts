import "server-only";
import { getDb } from "./db";
import { listTemplates } from "@/lib/db/templates";

export async function materialOptions(): Promise<{ name: string; category: string }[]> {
  return (await listTemplates(await getDb(), "materials")).map((m) => ({ name: m.data.name, category: m.data.category }));
}
