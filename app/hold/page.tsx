import { getDb } from "@/app/_server/db";
import { loadLibrary } from "@/app/_server/library";
import { getPlan } from "@/lib/db/plans";
import { holdInputSchema } from "@/lib/schemas/hold";
import { HoldPlanner } from "./HoldPlanner";

export default async function HoldPage({ searchParams }: { searchParams: Promise<{ plan?: string }> }) {
  const { plan: planId } = await searchParams;
  const lib = await loadLibrary();
  // Reopening a saved plan: its own snapshot, not today's templates.
  const saved = planId ? await getPlan(await getDb(), Number(planId)) : null;
  const initial = saved && saved.kind === "hold" ? holdInputSchema.safeParse(saved.input) : null;
  return (
    <>
      <h1 className="no-print">Hold planner</h1>
      <p className="lede no-print">Will this box, with these packs, keep this load inside its limits for the whole route — and with how much to spare?</p>
      {lib.shippers.length === 0 || lib.routes.length === 0 || lib.ruleSets.length === 0 || (lib.products.length === 0 && lib.packs.length === 0) ? (
        <p>Add a box, a route, a rule set and some products or packs to the library first.</p>
      ) : (
        <HoldPlanner {...lib} initial={initial?.success ? (initial.data as never) : undefined} reopened={saved?.name} />
      )}
    </>
  );
}
