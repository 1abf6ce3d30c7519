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
  let initialLog: { name: string; text: string } | undefined;
  let reopened: string | undefined;
  if (planId) {
    const p = await getPlan(db, planId);
    // A saved calibration reopens with its own plan and log (the log's layout is read from it again).
    const cal = p && p.kind === "calibrate" ? calibratePlanner.schema.safeParse(p.input) : null;
    if (p && cal?.success) {
      choices.push({ id: `calibration-${p.id}`, kind: cal.data.planner, label: `The plan of the saved calibration "${p.name}"`, input: cal.data.plan });
      initial = `calibration-${p.id}`;
      initialLog = { name: cal.data.log.name, text: cal.data.log.text };
      reopened = p.name;
    } else if (p && (p.kind === "hold" || p.kind === "thaw")) {
      if (!choices.some((c) => c.id === String(p.id))) choices.push({ id: String(p.id), kind: p.kind, label: `${p.name} (saved ${p.kind} plan ${p.id})`, input: p.input });
      initial = String(p.id);
    }
  }
  return (
    <>
      <h1 className="no-print">{calibratePlanner.title}</h1>
      <p className="lede no-print">{calibratePlanner.question}</p>
      {choices.length === 0 ? <p>Save a hold or thaw plan first, or restore the demo library&apos;s lunch-run templates.</p> : <>
          {reopened ? (
            <p className="banner ok no-print" role="status">
              Reopened the saved calibration &ldquo;{reopened}&rdquo; with its plan and log.
            </p>
          ) : null}
          <CalibratePlanner choices={choices} initial={initial} initialLog={initialLog} />
        </>}
    </>
  );
}
