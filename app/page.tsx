import Link from "next/link";
import { getDb } from "./_server/db";
import { TEMPLATE_KINDS, TEMPLATE_LABELS } from "@/lib/schemas/templates";
import { delegateFor } from "@/lib/db/templates";
import { PLANNERS } from "@/lib/planners/registry";

export default async function Home() {
  const db = await getDb();
  const counts = await Promise.all(TEMPLATE_KINDS.map(async (k) => [k, await delegateFor(db, k).count()] as const));
  return (
    <>
      <h1>Holdline</h1>
      <p className="lede">
        Plan chilled, frozen and hot deliveries and defrosts from the heat transfer of your own boxes, packs and food. Start by keeping your
        products, boxes, coolant packs, routes and food-code limits in the library; every plan is built from them.
      </p>
      <h2>Plan</h2>
      <ul className="tiles">
        {Object.values(PLANNERS).map((e) => (
          <li key={e.kind}>
            <Link href={e.path}>
              <strong>{e.title}</strong>
              <span>{e.question}</span>
            </Link>
          </li>
        ))}
      </ul>
      <h2>Your library</h2>
      <ul className="tiles">
        {counts
          .filter(([k]) => k !== "materials")
          .map(([k, n]) => (
            <li key={k}>
              <Link href={`/library/${k}`}>
                <strong>{TEMPLATE_LABELS[k].many}</strong>
                <span>{n} saved</span>
              </Link>
            </li>
          ))}
      </ul>
      <p>
        Materials for box walls, trays and outer surfaces, each value with its published source, are under{" "}
        <Link href="/library/materials">Materials</Link>.
      </p>
    </>
  );
}
