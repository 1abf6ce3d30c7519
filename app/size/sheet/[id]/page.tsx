import { notFound } from "next/navigation";
import { getDb } from "@/app/_server/db";
import { currentUnits } from "@/app/_server/units";
import { getPlan } from "@/lib/db/plans";
import { holdInputSchema } from "@/lib/schemas/hold";
import { runHoldParsed } from "@/lib/physics/hold";
import { conditioningTime_s, canFreezeAt, CABINET_H_W_M2K, PACK_START_C } from "@/lib/physics/conditioning";
import { formatQuantity } from "@/lib/units";
import { formatDuration } from "@/lib/format";
import { LayerDiagram } from "@/app/_components/LayerDiagram";
import { placementSplit } from "@/lib/physics/placement";

/** The packs of a line where the model puts them, e.g. "2 on top, 1 underneath, 1 at the sides". */
function placedAs(placement: Parameters<typeof placementSplit>[0], count: number): string {
  const s = placementSplit(placement, count);
  return [s.top ? `${s.top} on top` : "", s.bottom ? `${s.bottom} underneath` : "", s.side ? `${s.side} at the sides` : ""].filter(Boolean).join(", ");
}
import { CautionBlock } from "@/app/_components/CautionBlock";
import { PrintButton } from "@/app/_components/PrintButton";

/** One printable page for the packer: what goes in, conditioned how long, in what order, and what to check. */
export default async function PackOutSheet({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const plan = await getPlan(await getDb(), id);
  if (!plan || plan.kind !== "hold") notFound();
  const parsed = holdInputSchema.safeParse(plan.input);
  if (!parsed.success) notFound();
  const inp = parsed.data;
  const units = await currentUnits();
  const r = runHoldParsed(inp);
  const s = inp.shipper;
  const wall = s.wallLayers.reduce((a, l) => a + l.thickness_m, 0);
  const lid = (s.lidLayers ?? s.wallLayers).reduce((a, l) => a + l.thickness_m, 0);
  const dryIce_kg = inp.packs.filter((p) => p.pack.kind === "dry_ice").reduce((a, p) => a + p.pack.mass_kg * p.count, 0);
  const band = (x: number | null) => (x === null ? `more than ${formatDuration(r.routeLength_s * (1 + inp.extendFraction))}` : formatDuration(x));
  return (
    <article className="sheet">
      <header className="sheet-head">
        <h1>Pack-out sheet</h1>
        <PrintButton />
      </header>
      <p>
        <strong>{plan.name}</strong> — route &ldquo;{inp.route.name}&rdquo; ({formatDuration(r.routeLength_s)}), rule set &ldquo;{inp.ruleSet.name}&rdquo;.
      </p>
      <section>
        <h2>Box</h2>
        <p>
          {s.name}: inside {formatQuantity("length", s.innerLength_m, units, 3)} × {formatQuantity("length", s.innerWidth_m, units, 3)} × {formatQuantity("length", s.innerHeight_m, units, 3)}; walls{" "}
          {s.wallLayers.map((l) => `${Math.round(l.thickness_m * 1000)} mm ${l.material}`).join(" + ")}.
        </p>
      </section>
      <section>
        <h2>Coolant packs</h2>
        <table className="list sheet-table">
          <thead>
            <tr>
              <th>Pack</th>
              <th>Count</th>
              <th>Conditioned at</th>
              <th>Condition for at least</th>
              <th>Placed</th>
            </tr>
          </thead>
          <tbody>
            {inp.packs.map((p) => {
              const t = conditioningTime_s(p.pack, p.conditioning_C);
              return (
                <tr key={p.pack.name}>
                  <td>{p.pack.name}</td>
                  <td>{p.count}</td>
                  <td>{p.pack.kind === "dry_ice" ? "as delivered" : formatQuantity("temperature", p.conditioning_C, units, 3)}</td>
                  <td>{p.pack.kind === "dry_ice" ? "—" : p.conditioning_C <= p.pack.phaseChange_C && !canFreezeAt(p.pack, p.conditioning_C) ? "a cabinet this warm cannot freeze it through: use a colder one" : t === null ? "over 14 days: check the cabinet" : formatDuration(t)}</td>
                  <td>{placedAs(p.placement, p.count)}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
        <p className="muted">
          Conditioning times: from {PACK_START_C} °C in still cabinet air at the conditioning temperature ({CABINET_H_W_M2K} W/(m²·K), common practice) until the centre is within 1 K of it.
        </p>
      </section>
      <section>
        <h2>Loading order (side view)</h2>
        <LayerDiagram
          inner={{ L: s.innerLength_m, H: s.innerHeight_m }}
          wall_m={wall}
          lid_m={lid}
          packs={inp.packs.map((p) => ({ name: p.pack.name, count: p.count, thickness_m: p.pack.thickness_m, placement: p.placement, touchesLoad: p.contactWith !== "none" }))}
          productLabel={inp.products.map((p) => `${p.count} × ${p.product.name}`).join(", ")}
        />
      </section>
      <section>
        <h2>Expected hold</h2>
        <p data-testid="sheet-hold">
          Estimated hold {band(r.band.central)} (range {band(r.band.low)} to {band(r.band.high)}) against a route of {formatDuration(r.routeLength_s)}
          {r.failsFirst ? `; first to leave its band: ${r.failsFirst.product} (${r.failsFirst.point})` : ""}.
        </p>
        <p>
          Limits from &ldquo;{inp.ruleSet.name}&rdquo;: chilled at most {formatQuantity("temperature", inp.ruleSet.chilledMax_C, units, 3)}, frozen at most {formatQuantity("temperature", inp.ruleSet.frozenMax_C, units, 3)}, hot at least{" "}
          {formatQuantity("temperature", inp.ruleSet.hotHoldMin_C, units, 3)}. {inp.ruleSet.reminder}
        </p>
      </section>
      <CautionBlock
        dryIce={dryIce_kg > 0}
        extra={
          dryIce_kg > 0
            ? [`Net mass of dry ice in this package: ${dryIce_kg.toFixed(1)} kg — mark it with UN 1845 and this mass when shipping; do not tape the box airtight.`, "In closed vans and cold rooms, carbon dioxide from dry ice can build up: ventilate before reaching in."]
            : []
        }
      />
      <section className="blanks">
        <h2>Packing record</h2>
        <p>Packed by: ______________________________ &nbsp; Date and time: ______________________</p>
        <p>Pack temperatures from the freezer: ________________________________________________</p>
        <p>Product probe readings when packed: _____________________________________________</p>
        <p>Probe readings on arrival: ______________________________ &nbsp; Checked by: ____________</p>
      </section>
    </article>
  );
}
