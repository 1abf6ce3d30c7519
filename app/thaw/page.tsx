import { getDb } from "@/app/_server/db";
import { defaultRuleSet, listTemplates } from "@/lib/db/templates";
import { ThawPlanner } from "./ThawPlanner";

export default async function ThawPage() {
  const db = await getDb();
  const [products, rulesets, materials, def] = await Promise.all([listTemplates(db, "products"), listTemplates(db, "rulesets"), listTemplates(db, "materials"), defaultRuleSet(db)]);
  return (
    <>
      <h1>Thaw planner</h1>
      <p className="lede">How long will this frozen item take to thaw, which way, when to start — and how long will its surface sit above the chill limit?</p>
      {products.length === 0 || rulesets.length === 0 ? (
        <p>Add a product and a rule set to the library first.</p>
      ) : (
        <ThawPlanner
          products={products.map((p) => p.data)}
          ruleSets={rulesets.map((r) => r.data)}
          trays={materials.map((m) => m.data).filter((m) => m.category === "tray" || m.category === "packaging")}
          defaultRuleSet={def?.data.name ?? rulesets[0].data.name}
        />
      )}
    </>
  );
}
