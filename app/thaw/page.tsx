import { getDb } from "@/app/_server/db";
import { defaultRuleSet, listTemplates } from "@/lib/db/templates";
import { getPlan } from "@/lib/db/plans";
import { thawInputSchema } from "@/lib/schemas/thaw";
import { ThawPlanner } from "./ThawPlanner";

export default async function ThawPage({ searchParams }: { searchParams: Promise<{ plan?: string }> }) {
  const { plan: planId } = await searchParams;
  const db = await getDb();
  const [products, rulesets, materials, def] = await Promise.all([listTemplates(db, "products"), listTemplates(db, "rulesets"), listTemplates(db, "materials"), defaultRuleSet(db)]);
  // Reopening a saved plan: its own snapshot, not today's templates.
  const saved = planId ? await getPlan(db, planId) : null;
  const initial = saved && saved.kind === "thaw" ? thawInputSchema.safeParse(saved.input) : null;
  return (
    <>
      <h1 className="no-print">Thaw planner</h1>
      <p className="lede no-print">How long will this frozen item take to thaw, which way, when to start — and how long will its surface sit above the chill limit?</p>
      {products.length === 0 || rulesets.length === 0 ? (
        <p>Add a product and a rule set to the library first.</p>
      ) : (
        <ThawPlanner
          products={products.map((p) => p.data)}
          ruleSets={rulesets.map((r) => r.data)}
          trays={materials.map((m) => m.data).filter((m) => m.category === "tray" || m.category === "packaging")}
          defaultRuleSet={def?.data.name ?? rulesets[0].data.name}
          initial={initial?.success ? (initial.data as never) : undefined}
          reopened={initial?.success ? saved?.name : undefined}
        />
      )}
    </>
  );
}
