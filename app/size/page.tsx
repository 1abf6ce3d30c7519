import { getDb } from "@/app/_server/db";
import { defaultRuleSet, listTemplates } from "@/lib/db/templates";
import { SizePlanner } from "./SizePlanner";

export default async function SizePage() {
  const db = await getDb();
  const [products, shippers, packs, routes, rulesets, materials, def] = await Promise.all([
    listTemplates(db, "products"),
    listTemplates(db, "shippers"),
    listTemplates(db, "packs"),
    listTemplates(db, "routes"),
    listTemplates(db, "rulesets"),
    listTemplates(db, "materials"),
    defaultRuleSet(db),
  ]);
  const d = <T,>(xs: { data: T }[]) => xs.map((x) => x.data);
  return (
    <>
      <h1>Pack-out sizer</h1>
      <p className="lede">Which box, and how many of which packs, hold this load for the whole route plus a margin — at the lowest weight, cost or size?</p>
      {shippers.length === 0 || packs.length === 0 || products.length === 0 || routes.length === 0 ? (
        <p>Add products, boxes, coolant packs and a route to the library first.</p>
      ) : (
        <SizePlanner
          products={d(products)}
          shippers={d(shippers)}
          packs={d(packs)}
          routes={d(routes)}
          ruleSets={d(rulesets)}
          materials={d(materials)}
          defaultRuleSet={def?.data.name ?? rulesets[0].data.name}
        />
      )}
    </>
  );
}
