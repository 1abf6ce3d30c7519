import { getDb } from "@/app/_server/db";
import { defaultRuleSet, listTemplates } from "@/lib/db/templates";
import { getPlan } from "@/lib/db/plans";
import { holdInputSchema } from "@/lib/schemas/hold";
import { HoldPlanner } from "./HoldPlanner";

export default async function HoldPage({ searchParams }: { searchParams: Promise<{ plan?: string }> }) {
  const { plan: planId } = await searchParams;
  const db = await getDb();
  // Reopening a saved plan: its own snapshot, not today's templates.
  const saved = planId ? await getPlan(db, Number(planId)) : null;
  const initial = saved && saved.kind === "hold" ? holdInputSchema.safeParse(saved.input) : null;
  const [products, shippers, packs, routes, rulesets, materials, def] = await Promise.all([
    listTemplates(db, "products"),
    listTemplates(db, "shippers"),
    listTemplates(db, "packs"),
    listTemplates(db, "routes"),
    listTemplates(db, "rulesets"),
    listTemplates(db, "materials"),
    defaultRuleSet(db),
  ]);
  const d = (xs: { data: unknown }[]) => xs.map((x) => x.data);
  return (
    <>
      <h1 className="no-print">Hold planner</h1>
      <p className="lede no-print">Will this box, with these packs, keep this load inside its limits for the whole route — and with how much to spare?</p>
      {shippers.length === 0 || routes.length === 0 || rulesets.length === 0 || (products.length === 0 && packs.length === 0) ? (
        <p>Add a box, a route, a rule set and some products or packs to the library first.</p>
      ) : (
        <HoldPlanner
          products={d(products) as never}
          shippers={d(shippers) as never}
          packs={d(packs) as never}
          routes={d(routes) as never}
          ruleSets={d(rulesets) as never}
          materials={d(materials) as never}
          defaultRuleSet={def?.data.name ?? rulesets[0].data.name}
          initial={initial?.success ? (initial.data as never) : undefined}
          reopened={saved?.name}
        />
      )}
    </>
  );
}
