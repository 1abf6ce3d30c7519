import { getDb } from "@/app/_server/db";
import { defaultRuleSet, listTemplates } from "@/lib/db/templates";
import { WarmupPlanner } from "./WarmupPlanner";

export default async function WarmupPage() {
  const db = await getDb();
  const [products, rulesets, def] = await Promise.all([listTemplates(db, "products"), listTemplates(db, "rulesets"), defaultRuleSet(db)]);
  return (
    <>
      <h1>Warm-up and cool-down check</h1>
      <p className="lede">How long can this food sit out before its centre or its surface crosses the limit — or how long does hot food take to fall below the hot-holding limit?</p>
      {products.length === 0 || rulesets.length === 0 ? (
        <p>Add at least one product and one rule set to the library first.</p>
      ) : (
        <WarmupPlanner products={products.map((p) => p.data)} ruleSets={rulesets.map((r) => r.data)} defaultRuleSet={def?.data.name ?? rulesets[0].data.name} />
      )}
    </>
  );
}
