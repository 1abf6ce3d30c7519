/** The pack-out sizer's registry entry: the smallest box and pack count that holds the route with a margin. */
import { sizeInputSchema, MAX_SIZE_LINES, type SizeParsed } from "../schemas/size";
import { runSizing, evaluateHere, type SizingResult, type CandidateRow } from "../physics/sizing";
import type { PlannerEntry } from "./types";
import { kit, mCol, csvM, SIGNATURE_LINE } from "./view-kit";

/** How a candidate reads: "Thick cooler (40 mm) with 3 × Gel pack at −18 °C". */
export function candidateLabel(c: CandidateRow, k: ReturnType<typeof kit>): string {
  const packs = c.packs.filter((p) => p.count > 0).map((p) => `${p.count} × ${p.name} at ${k.temp(p.conditioning_C)}`).join(" + ") || "no packs";
  return `${c.boxName} with ${packs}`;
}

const holdText = (c: CandidateRow, k: ReturnType<typeof kit>) => (c.hold_s === null ? "past the time simulated" : `${c.holdIsUpperBound ? "at most " : ""}${k.dur(c.hold_s)}`);

export const sizePlanner: PlannerEntry<typeof sizeInputSchema, SizingResult> = {
  kind: "size",
  title: "Pack-out sizer",
  path: "/size",
  question: "What is the smallest pack-out that holds this load on this route with a margin?",
  schema: sizeInputSchema,
  refs: {
    top: { route: "routes", ruleSet: "rulesets" },
    lines: [
      { key: "products", field: "product", kind: "products", max: MAX_SIZE_LINES.products, what: "product lines" },
      { key: "boxes", field: "shipper", kind: "shippers", max: MAX_SIZE_LINES.boxes, what: "candidate boxes" },
      { key: "packs", field: "pack", kind: "packs", max: MAX_SIZE_LINES.packs, what: "candidate packs" },
    ],
    materialsFrom: { list: "boxes", field: "shipper" },
  },
  cliHelp: ["pack-out sizer: every candidate box and pack count through", "the hold model, on both cores; prints candidates, the", "Pareto front and near misses"],
  timeLimit_s: 120,
  tooLongHint: "narrow the count ranges, use fewer conditioning temperatures or boxes, or keep pruning on",
  run: (p: SizeParsed) => runSizing(p, evaluateHere(p)),
  quick: () => null,
  defaultName: (p) => `Pack-out for ${p.route.name}`,
  view(input, r, u) {
    const k = kit(u);
    const holding = r.candidates.filter((c) => c.holds);
    const front = r.pareto.map((i) => r.candidates.find((c) => c.index === i)).filter((c): c is CandidateRow => !!c);
    const lightest = [...holding].sort((a, b) => a.mass_kg - b.mass_kg)[0];
    return {
      title: "Pack-out sizing record",
      headline: lightest ? `Lightest pack-out estimated to hold ${k.dur(r.required_s)}: ${candidateLabel(lightest, k)}` : `No candidate is estimated to hold the ${k.dur(r.required_s)} asked for`,
      headlineTestId: "size-headline",
      facts: [
        { label: "Hold required", value: `${k.dur(r.required_s)} (route ${k.dur(r.routeLength_s)} plus the margin)` },
        { label: "Judged by", value: input.judgeBy === "low" ? "the low end of the uncertainty band" : "the central value" },
        { label: "Candidates", testId: "size-counts", value: `${r.evaluated} run, ${r.pruned} decided by monotonicity, ${r.doesNotFit} do not fit; ${holding.length} hold` },
        ...(r.message ? [{ label: "Note", value: k.text(r.message) }] : []),
      ],
      inputs: [
        { label: "Route", value: input.route.name },
        { label: "Rule set", value: input.ruleSet.name },
        { label: "Load", value: input.products.map((p) => `${p.count} × ${p.product.name} packed at ${k.temp(p.start_C)}`).join("; ") },
        { label: "Boxes", value: input.boxes.map((b) => b.shipper.name + (b.thicknessVariants_m.length ? ` (also at ${b.thicknessVariants_m.map((t) => k.length(t)).join(", ")})` : "")).join("; ") },
        { label: "Packs", value: input.packs.map((p) => `${p.pack.name}: ${p.minCount}–${p.maxCount}, conditioned at ${p.conditioning_C.map((t) => k.temp(t)).join(" or ")}`).join("; ") },
        { label: "Margin", value: input.margin.kind === "percent" ? `${input.margin.value} % of the route` : `${input.margin.value} h` },
      ],
      charts: [],
      tables: [
        {
          title: "Best trade-offs (Pareto front: no other holding candidate is lighter, cheaper and smaller at once)",
          testId: "size-front",
          columns: ["Pack-out", "Hold", `Mass (${k.u.massUnit})`, "Cost", "Outer volume (L)"],
          rows: front.map((c) => [candidateLabel(c, k), holdText(c, k), k.mass(c.mass_kg), c.cost.toFixed(2), (c.outerVolume_m3 * 1000).toFixed(0)]),
        },
        ...(r.nearMisses.length
          ? [
              {
                title: "Near misses",
                testId: "size-near-misses",
                columns: ["Pack-out", "Hold", "Why"],
                rows: r.nearMisses.map((n) => {
                  const c = r.candidates.find((x) => x.index === n.index);
                  return [c ? candidateLabel(c, k) : `candidate ${n.index}`, n.hold_s === null ? "—" : k.dur(n.hold_s), k.text(n.reason)];
                }),
              },
            ]
          : []),
      ],
      compliance: { title: "", lines: [] },
      assumptions: [
        "Every candidate is run through the hold planner's model with the same uncertainty sample as the hold planner's band",
        `Uncertainty: outer coefficient ±${Math.round(input.uncertainty.outerH_frac * 100)} %, insulation conductivity ±${Math.round(input.uncertainty.insulationK_frac * 100)} %, conditioning ±${k.text(`${input.uncertainty.conditioning_K} K`)}`,
      ],
      warnings: [],
      signOff: { title: "Pack-out chosen", lines: ["Pack-out chosen: ____________________________________________", SIGNATURE_LINE] },
      cautions: { dryIce: input.packs.some((p) => p.pack.kind === "dry_ice" && p.maxCount > 0), extra: [] },
    };
  },
  csv: (_i, r, u) =>
    r.candidates.map((c) => ({
      index: c.index,
      box: c.boxName,
      packs: c.packs.map((p) => `${p.count} × ${p.name}`).join(" + "),
      verdict: c.verdict,
      hold_s: c.hold_s === null ? null : Math.round(c.hold_s),
      hold_is_upper_bound: c.holdIsUpperBound ? "yes" : "no",
      [mCol("mass", u)]: csvM(c.mass_kg, u),
      cost: Math.round(c.cost * 100) / 100,
      outer_volume_L: Math.round(c.outerVolume_m3 * 1e6) / 1000,
      pareto: r.pareto.includes(c.index) ? "yes" : "no",
    })),
};
