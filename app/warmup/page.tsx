import { getDb } from "@/app/_server/db";
import { defaultRuleSet, listTemplates } from "@/lib/db/templates";
import { getPlan } from "@/lib/db/plans";
import { warmupInputSchema } from "@/lib/schemas/warmup";
import { WarmupPlanner } from "./WarmupPlanner";

export default async function WarmupPage({ searchParams }: { searchParams: Promise<{ plan?: string }> }) {
  const { plan: planId } = await searchParams;
  const db = await getDb();
  const [products, rulesets, def] = await Promise.all([listTemplates(db, "products"), listTemplates(db, "rulesets"), defaultRuleSet(db)]);
  // Reopening a saved plan: its own snapshot, not today's templates.
  const saved = planId ? await getPlan(db, planId) : null;
  const initial = saved && saved.kind === "warmup" ? warmupInputSchema.safeParse(saved.input) : null;
  return (
    <>
      <h1 className="no-print">Warm-up and cool-down check</h1>
      <p className="lede no-print">How long can this food sit out before its centre or its surface crosses the limit — or how long does hot food take to fall below the hot-holding limit?</p>
      {products.length === 0 || rulesets.length === 0 ? (
        <p>Add at least one product and one rule set to the library first.</p>
      ) : (
        <WarmupPlanner
          products={products.map((p) => p.data)}
          ruleSets={rulesets.map((r) => r.data)}
          defaultRuleSet={def?.data.name ?? rulesets[0].data.name}
          initial={initial?.success ? (initial.data as never) : undefined}
          reopened={initial?.success ? saved?.name : undefined}
        />
      )}
    </>
  );
}
