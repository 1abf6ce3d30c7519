import { notFound } from "next/navigation";
import { getDb } from "@/app/_server/db";
import { getPlan } from "@/lib/db/plans";

export default async function PlanPage({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const plan = await getPlan(await getDb(), id);
  if (!plan) notFound();
  return (
    <>
      <h1>{plan.name}</h1>
      <p className="muted">
        {plan.kind} plan, saved {plan.createdAt.toISOString().slice(0, 16).replace("T", " ")} UTC.
      </p>
      {plan.kind === "hold" ? (
        <p>
          <a className="button" href={`/hold?plan=${plan.id}`}>
            Reopen in the hold planner
          </a>
        </p>
      ) : null}
      <h2>Inputs as saved</h2>
      <pre className="snapshot">{JSON.stringify(plan.input, null, 2)}</pre>
      <h2>Result summary as saved</h2>
      <pre className="snapshot">{JSON.stringify(plan.result, null, 2)}</pre>
    </>
  );
}
