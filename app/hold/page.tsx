import { getDb } from "@/app/_server/db";
import { loadLibrary } from "@/app/_server/library";
import { getPlan } from "@/lib/db/plans";
import { holdInputSchema } from "@/lib/schemas/hold";
import { decodeHandoff } from "@/lib/planners/handoff";
import { candidateHandoffSchema } from "@/lib/planners/size";
import { HoldPlanner } from "./HoldPlanner";

export default async function HoldPage({ searchParams }: { searchParams: Promise<{ plan?: string; from?: string | string[] }> }) {
  const { plan: planId, from } = await searchParams;
  const lib = await loadLibrary();
  // Reopening a saved plan: its own snapshot, not today's templates.
  const saved = planId ? await getPlan(await getDb(), Number(planId)) : null;
  const initial = saved && saved.kind === "hold" ? holdInputSchema.safeParse(saved.input) : null;
  // A sizer candidate carried in the address (`?from=…`): its inputs, not saved until the person saves them.
  const carried = !initial?.success && from ? candidateHandoffSchema.safeParse(await decodeHandoff(from)) : null;
  return (
    <>
      <h1 className="no-print">Hold planner</h1>
      <p className="lede no-print">Will this box, with these packs, keep this load inside its limits for the whole route — and with how much to spare?</p>
      {lib.shippers.length === 0 || lib.routes.length === 0 || lib.ruleSets.length === 0 || (lib.products.length === 0 && lib.packs.length === 0) ? (
        <p>Add a box, a route, a rule set and some products or packs to the library first.</p>
      ) : (
        <>
          {carried ? (
            <p className={carried.success ? "banner ok no-print" : "banner error no-print"} role="status" data-testid="hold-from">
              {carried.success ? "Opened from the pack-out sizer with that candidate's inputs. Not saved: use “Save plan” to keep it." : "The candidate in this address could not be read; the planner starts from the library instead."}
            </p>
          ) : null}
          <HoldPlanner {...lib} initial={initial?.success ? (initial.data as never) : carried?.success ? (carried.data.input as never) : undefined} reopened={saved?.name} />
        </>
      )}
    </>
  );
}
