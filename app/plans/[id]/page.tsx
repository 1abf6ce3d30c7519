import { notFound } from "next/navigation";
import Link from "next/link";
import { getDb } from "@/app/_server/db";
import { currentUnits } from "@/app/_server/units";
import { getPlan } from "@/lib/db/plans";
import { isPlannerKind, plannerOf } from "@/lib/planners/registry";
import type { PlanView as View } from "@/lib/planners/types";
import { PlanView } from "@/app/_components/PlanView";
import { PrintButton } from "@/app/_components/PrintButton";
import { PlanRowActions } from "../PlanRowActions";

/** A saved plan as a record, in the user's units: what was planned, what the model estimated, the blanks to fill. */
export default async function PlanPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const plan = await getPlan(await getDb(), id);
  if (!plan) notFound();
  const units = await currentUnits();
  const entry = isPlannerKind(plan.kind) ? plannerOf(plan.kind) : null;
  let view: View | null = null;
  if (entry) {
    const parsed = entry.schema.safeParse(plan.input);
    if (parsed.success) {
      try {
        view = entry.view(parsed.data, plan.result, units);
      } catch {
        view = null; // a result kept by an earlier version, without the curves the record needs
      }
    }
  }
  return (
    <>
      <p className="muted no-print">
        <Link href="/plans">Saved plans</Link> › {entry?.title ?? plan.kind}
      </p>
      <h1 data-testid="plan-name">{plan.name}</h1>
      <p className="muted">
        {entry?.title ?? plan.kind}, saved {plan.createdAt.toISOString().slice(0, 16).replace("T", " ")} UTC{plan.createdByName ? ` by ${plan.createdByName}` : ""}.
      </p>
      <div className="save-row no-print">
        {entry ? (
          <Link className="button" href={`${entry.path}?plan=${plan.id}`}>
            Reopen in the {entry.title.toLowerCase()}
          </Link>
        ) : null}
        {plan.kind === "hold" ? (
          <Link className="button secondary" href={`/size/sheet/${plan.id}`}>
            Pack-out sheet
          </Link>
        ) : null}
        <PrintButton label="Print the record" />
        {view ? (
          <a className="button secondary" href={`/plans/${plan.id}/csv`} download>
            Download curves (CSV)
          </a>
        ) : null}
        <PlanRowActions id={plan.id} name={plan.name} after="list" />
      </div>
      {view ? (
        <PlanView view={view} record />
      ) : (
        <>
          <p className="banner check">This plan was saved by an earlier version of Holdline and keeps only a summary. Reopen it to compute it again, then save it anew.</p>
          <details>
            <summary>Inputs and summary as saved</summary>
            <pre className="snapshot">{JSON.stringify({ input: plan.input, result: plan.result }, null, 2)}</pre>
          </details>
        </>
      )}
    </>
  );
}
