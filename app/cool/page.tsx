import { getDb } from "@/app/_server/db";
import { loadLibrary } from "@/app/_server/library";
import { getPlan } from "@/lib/db/plans";
import { coolInputSchema } from "@/lib/schemas/cool";
import { coolPlanner } from "@/lib/planners/cool";
import { CoolPlanner } from "./CoolPlanner";

export default async function CoolPage({ searchParams }: { searchParams: Promise<{ plan?: string }> }) {
  const { plan: planId } = await searchParams;
  const lib = await loadLibrary();
  // Reopening a saved plan: its own snapshot, not today's templates.
  const saved = planId ? await getPlan(await getDb(), planId) : null;
  const initial = saved && saved.kind === "cool" ? coolInputSchema.safeParse(saved.input) : null;
  return (
    <>
      <h1 className="no-print">{coolPlanner.title}</h1>
      <p className="lede no-print">{coolPlanner.question}</p>
      {lib.products.length === 0 || lib.ruleSets.length === 0 ? (
        <p>Add at least one product and one rule set to the library first.</p>
      ) : (
        <CoolPlanner products={lib.products} ruleSets={lib.ruleSets} defaultRuleSet={lib.defaultRuleSet} initial={initial?.success ? (initial.data as never) : undefined} reopened={initial?.success ? saved?.name : undefined} />
      )}
    </>
  );
}
