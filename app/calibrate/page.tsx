import { getDb } from "@/app/_server/db";
import { listPlans, getPlan } from "@/lib/db/plans";
import { resolvePlannerInput } from "@/lib/db/resolve";
import { EXAMPLE_PLAN } from "@/lib/calibration/example";
import { calibratePlanner } from "@/lib/planners/calibrate";
import { CalibratePlanner, type PlanChoice } from "./CalibratePlanner";

/** Plans offered in the picker: the newest hold and thaw plans. */
const MAX_CHOICES = 30;

export default async function CalibratePage({ searchParams }: { searchParams: Promise<{ plan?: string }> }) {
  const { plan: planId } = await searchParams;
  const db = await getDb();
  const choices: PlanChoice[] = [];
  const demo = await resolvePlannerInput(db, "hold", EXAMPLE_PLAN);
  if (demo.ok) choices.push({ id: "demo", kind: "hold", label: "Demo: roast chicken thighs in the thin cooler on the summer lunch run", input: demo.value });
  const saved = (await listPlans(db)).filter((p) => p.kind === "hold" || p.kind === "thaw").slice(0, MAX_CHOICES);
  for (const p of saved) choices.push({ id: String(p.id), kind: p.kind as "hold" | "thaw", label: `${p.name} (saved ${p.kind} plan ${p.id})`, input: p.input });
  // ?plan=ID: that saved plan, even if older than the newest shown.
  let initial = choices[0]?.id ?? "";
  if (planId) {
    const p = await getPlan(db, planId);
    if (p && (p.kind === "hold" || p.kind === "thaw")) {
      if (!choices.some((c) => c.id === String(p.id))) choices.push({ id: String(p.id), kind: p.kind, label: `${p.name} (saved ${p.kind} plan ${p.id})`, input: p.input });
      initial = String(p.id);
    }
  }
  return (
    <>
      <h1 className="no-print">{calibratePlanner.title}</h1>
      <p className="lede no-print">{calibratePlanner.question}</p>
      {choices.length === 0 ? <p>Save a hold or thaw plan first, or restore the demo library&apos;s lunch-run templates.</p> : <CalibratePlanner choices={choices} initial={initial} />}
    </>
  );
}
