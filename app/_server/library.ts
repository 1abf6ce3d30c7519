import "server-only";
import { getDb } from "./db";
import { defaultRuleSet, listTemplates } from "@/lib/db/templates";

/** Every template, as plain data, for the planner pages; plus the default rule set's name. */
export async function loadLibrary() {
  const db = await getDb();
  const [products, shippers, packs, routes, ruleSets, materials, def] = await Promise.all([
    listTemplates(db, "products"),
    listTemplates(db, "shippers"),
    listTemplates(db, "packs"),
    listTemplates(db, "routes"),
    listTemplates(db, "rulesets"),
    listTemplates(db, "materials"),
    defaultRuleSet(db),
  ]);
  const d = <T,>(xs: { data: T }[]) => xs.map((x) => x.data);
  return {
    products: d(products),
    shippers: d(shippers),
    packs: d(packs),
    routes: d(routes),
    ruleSets: d(ruleSets),
    materials: d(materials),
    defaultRuleSet: def?.data.name ?? ruleSets[0]?.data.name ?? "",
  };
}
