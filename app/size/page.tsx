import { getDb } from "@/app/_server/db";
import { loadLibrary } from "@/app/_server/library";
import { getPlan } from "@/lib/db/plans";
import { sizeInputSchema } from "@/lib/schemas/size";
import type { SizingResult } from "@/lib/physics/sizing";
import { SizePlanner } from "./SizePlanner";

/** The stored result of a saved sizing, when it has the shape the sizer writes (else the page searches again). */
function storedResult(x: unknown): SizingResult | undefined {
  const r = x as Partial<SizingResult> | null;
  return r && typeof r === "object" && Array.isArray(r.candidates) && Array.isArray(r.pareto) && Array.isArray(r.nearMisses) && typeof r.required_s === "number" ? (r as SizingResult) : undefined;
}

export default async function SizePage({ searchParams }: { searchParams: Promise<{ plan?: string }> }) {
  const { plan: planId } = await searchParams;
  const lib = await loadLibrary();
  // Reopening a saved sizing: its own snapshot of the templates, and the result the server stored.
  const saved = planId ? await getPlan(await getDb(), planId) : null;
  const initial = saved && saved.kind === "size" ? sizeInputSchema.safeParse(saved.input) : null;
  return (
    <>
      <h1 className="no-print">Pack-out sizer</h1>
      <p className="lede no-print">Which box, and how many of which packs, hold this load for the whole route plus a margin — at the lowest weight, cost or size?</p>
      {lib.shippers.length === 0 || lib.packs.length === 0 || lib.products.length === 0 || lib.routes.length === 0 ? (
        <p>Add products, boxes, coolant packs and a route to the library first.</p>
      ) : (
        <SizePlanner {...lib} initial={initial?.success ? initial.data : undefined} initialResult={initial?.success ? storedResult(saved?.result) : undefined} reopened={initial?.success ? saved?.name : undefined} />
      )}
    </>
  );
}
