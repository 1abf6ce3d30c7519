import Link from "next/link";
import { getDb } from "@/app/_server/db";
import { listPlans } from "@/lib/db/plans";
import { isPlannerKind, plannerOf } from "@/lib/planners/registry";
import { PlanRowActions } from "./PlanRowActions";

export default async function PlansPage() {
  const plans = await listPlans(await getDb());
  return (
    <>
      <h1>Saved plans</h1>
      <p className="muted">A saved plan keeps a full copy of the templates it used, so later edits to the library never change it.</p>
      {plans.length === 0 ? (
        <p>No saved plans yet.</p>
      ) : (
        <table className="list">
          <thead>
            <tr>
              <th>Name</th>
              <th>Kind</th>
              <th>Saved (UTC)</th>
              <th>By</th>
              <th>
                <span className="visually-hidden">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {plans.map((p) => (
              <tr key={p.id}>
                <td>
                  <Link href={`/plans/${p.id}`}>{p.name}</Link>
                </td>
                <td>{isPlannerKind(p.kind) ? plannerOf(p.kind).title : p.kind}</td>
                <td>{p.createdAt.toISOString().slice(0, 16).replace("T", " ")}</td>
                <td>{p.createdByName ?? "single user"}</td>
                <td>
                  <PlanRowActions id={p.id} name={p.name} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </>
  );
}
