import Papa from "papaparse";
import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { currentUnits } from "@/app/_server/units";
import { getPlan } from "@/lib/db/plans";
import { isPlannerKind, plannerOf } from "@/lib/planners/registry";

/** GET /plans/{id}/csv: a saved plan's curves as CSV, in the units of the settings (columns say which). */
export async function GET(_req: Request, { params }: { params: Promise<{ id: string }> }) {
  const plan = await getPlan(await getDb(), (await params).id);
  if (!plan || !isPlannerKind(plan.kind)) return NextResponse.json({ error: "No saved plan with that id" }, { status: 404 });
  const entry = plannerOf(plan.kind);
  const parsed = entry.schema.safeParse(plan.input);
  let rows: ReturnType<typeof entry.csv> | null = null;
  if (parsed.success) {
    try {
      rows = entry.csv(parsed.data, plan.result, await currentUnits());
    } catch {
      rows = null;
    }
  }
  if (!rows) return NextResponse.json({ error: "This plan keeps no curves (saved by an earlier version); reopen and save it again" }, { status: 404 });
  const file = `holdline-${plan.kind}-plan-${plan.id}.csv`;
  return new NextResponse(Papa.unparse(rows), { headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${file}"` } });
}
