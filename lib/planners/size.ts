/** The pack-out sizer's registry entry: the smallest box and pack count that holds the route with a margin. */
import { sizeInputSchema, MAX_SIZE_LINES, type SizeParsed } from "../schemas/size";
import { z } from "zod";
import { holdInputSchema, type HoldParsed } from "../schemas/hold";
import { PACK_KIND_LABELS } from "../schemas/templates";
import { runSizing, evaluateHere, candidateHoldInput, NEAR_MISS_FRACTION, type Candidate, type SizingResult, type CandidateRow } from "../physics/sizing";
import type { PlannerEntry } from "./types";
import { kit, mCol, csvM, SIGNATURE_LINE, type Kit } from "./view-kit";
import { PLACEMENT_LABELS } from "./hold";

/** A candidate box's name in the person's units: a wall-thickness variant is named "Thin cooler (40 mm)" by the model. */
export const boxLabel = (boxName: string, k: Kit) => boxName.replace(/\((\d+) mm\)$/, (m) => k.text(m));

/** How a candidate reads: "Thick cooler (40 mm) with 3 × Gel pack at −18 °C". */
export function candidateLabel(c: CandidateRow, k: Kit): string {
  const packs = c.packs.filter((p) => p.count > 0).map((p) => `${p.count} × ${p.name} at ${k.temp(p.conditioning_C)}`).join(" + ") || "no packs";
  return `${boxLabel(c.boxName, k)} with ${packs}`;
}

/**
 * The hold planner's input of one candidate, as the sizer judged it: its box (variant), packs, load,
 * route, rule set and uncertainty, with only the materials its box is made of (what the template
 * resolver fills in for a hold input), so it travels compactly to the hold planner or the pack-out sheet.
 */
export function candidateHold(inp: SizeParsed, c: Candidate): HoldParsed {
  const h = candidateHoldInput(inp, c, 0.5);
  const used = new Set([...h.shipper.wallLayers, ...(h.shipper.lidLayers ?? [])].map((l) => l.material).concat(h.shipper.finishMaterial));
  const materials = h.materials.filter((m) => used.has(m.name));
  return { ...h, materials: materials.length ? materials : h.materials };
}

/**
 * A candidate carried to the hold planner (`/hold?from=…`) or its pack-out sheet (`/size/sheet?from=…`)
 * without saving: its hold input (lib/planners/handoff.ts packs it into the address). How it reads is
 * made where it is read (carriedLabel), in that page's units.
 */
export const candidateHandoffSchema = z.object({ input: holdInputSchema });
export type CandidateHandoff = z.input<typeof candidateHandoffSchema>;

/** A carried candidate as it reads, like candidateLabel: "Thin cooler (1.575 in) with 3 × Gel pack at −0.4 °F". */
export function carriedLabel(h: HoldParsed, k: Kit): string {
  const packs = h.packs.map((p) => `${p.count} × ${p.pack.name}${p.pack.kind === "dry_ice" ? "" : ` at ${k.temp(p.conditioning_C)}`}`).join(" + ") || "no packs";
  return `${boxLabel(h.shipper.name, k)} with ${packs}`;
}

/** A candidate's judged hold as it reads: "at most 9.5 h", "more than 21.6 h", "holds (decided without a run)", "at most 9.5 h (decided without a run)". */
export function candidateHoldText(c: CandidateRow, required_s: number, k: Kit): string {
  if (c.pruned && c.verdict === "holds") return "holds (decided without a run)";
  if (c.pruned) return c.hold_s === null ? "fails (decided without a run)" : `at most ${k.dur(c.hold_s)} (decided without a run)`;
  if (c.hold_s === null) return `more than ${k.dur(required_s)}`;
  return `${c.holdIsUpperBound ? "at most " : ""}${k.dur(c.hold_s)}`;
}

/** Outer volume in litres, as every table of the sizer shows it. */
export const litres = (v_m3: number) => `${(v_m3 * 1000).toFixed(1)} L`;

/** What the sizer assumed, in the person's units (the page, the print view and the saved record). */
export function sizingAssumptions(input: SizeParsed, k: Kit): string[] {
  return [
    input.judgeBy === "low"
      ? "Every candidate is run through the hold model at the low end of the uncertainty band: the shortest hold over the central run and every corner of the outer coefficient, insulation conductivity and conditioning spreads (the hold planner's own range)"
      : "Every candidate is run through the hold model at its central estimate",
    k.text(`Uncertainty: outer coefficient ±${Math.round(input.uncertainty.outerH_frac * 100)} %, insulation conductivity ±${Math.round(input.uncertainty.insulationK_frac * 100)} %, conditioning ±${input.uncertainty.conditioning_K} K`),
    `A candidate already short of ${Math.round(NEAR_MISS_FRACTION * 100)} % of the required hold is not run at its remaining corners: its hold reads "at most"`,
    "With no lower limit in play, more of a pack at the same conditioning never shortens the hold, so a candidate with at least as many of each pack as one that holds is marked as holding without a run",
    "The best trade-offs (Pareto front) keep each candidate that no other beats on packed mass, cost and outer volume at once",
    "A wall-thickness variant adds (or saves) its insulation's mass, and its cost at the box's insulation cost per cubic metre where given, else at the box's price spread over its shell volume",
    "Packs are placed as each line says (around: shared over top, underneath and sides) and touch the load unless kept apart, as in the hold planner",
    input.wellMixedInside ? "The inside air is one well-mixed volume (no layering)" : "The inside air is modelled in a lower and an upper half, as in the hold planner",
  ];
}

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
    const best = (key: "mass_kg" | "cost" | "outerVolume_m3") => [...holding].sort((a, b) => a[key] - b[key] || a.index - b.index)[0];
    const lightest = best("mass_kg");
    const hasDryIce = input.packs.some((p) => p.pack.kind === "dry_ice" && p.maxCount > 0);
    return {
      title: "Pack-out sizing record",
      headline: r.cancelled
        ? `Stopped part-way: ${holding.length} of the candidates run so far are estimated to hold ${k.dur(r.required_s)}`
        : lightest
          ? `${holding.length} of ${r.candidates.length} candidates are estimated to hold ${k.dur(r.required_s)}; the lightest: ${candidateLabel(lightest, k)}`
          : `No candidate is estimated to hold the ${k.dur(r.required_s)} asked for`,
      headlineTestId: "size-headline",
      facts: [
        { label: "Hold required", testId: "size-required", value: `${k.dur(r.required_s)} (route ${k.dur(r.routeLength_s)} plus the margin)` },
        { label: "Judged by", value: input.judgeBy === "low" ? "the low end of the uncertainty band (more cautious)" : "the central estimate" },
        { label: "Candidates", testId: "size-counts", value: `${r.evaluated} run through the hold model, ${r.pruned} decided without a run, ${r.doesNotFit} do not fit; ${holding.length} hold` },
        ...(lightest
          ? [
              { label: "Lightest", testId: "size-lightest", value: `${candidateLabel(lightest, k)}: ${k.mass(lightest.mass_kg)} packed` },
              { label: "Cheapest", value: `${candidateLabel(best("cost"), k)}: ${best("cost").cost.toFixed(2)} cost units` },
              { label: "Smallest", value: `${candidateLabel(best("outerVolume_m3"), k)}: ${litres(best("outerVolume_m3").outerVolume_m3)} outside` },
            ]
          : []),
        ...(r.message ? [{ label: "Note", value: k.text(r.message) }] : []),
      ],
      inputs: [
        { label: "Route", value: input.route.name },
        { label: "Rule set", value: input.ruleSet.name },
        { label: "Load", value: input.products.map((p) => `${p.count} × ${p.product.name} packed at ${k.temp(p.start_C)}`).join("; ") },
        { label: "Boxes", value: input.boxes.map((b) => b.shipper.name + (b.thicknessVariants_m.length ? ` (also with insulation ${b.thicknessVariants_m.map((t) => k.length(t)).join(", ")})` : "")).join("; ") },
        {
          label: "Packs",
          value: input.packs
            .map((p) => `${p.pack.name} (${PACK_KIND_LABELS[p.pack.kind]}): ${p.minCount}–${p.maxCount}, ${p.pack.kind === "dry_ice" ? "as delivered" : `conditioned at ${p.conditioning_C.map((t) => k.temp(t)).join(" or ")}`}, ${PLACEMENT_LABELS[p.placement]}${p.touchesLoad ? "" : ", kept apart from the load"}, ${p.unitCost.toFixed(2)} cost units each`)
            .join("; "),
        },
        { label: "Margin", value: input.margin.kind === "percent" ? `${input.margin.value} % of the route` : `${input.margin.value} h` },
        { label: "Box temperature when packed", value: input.boxStart_C === null ? "the first segment's air" : k.temp(input.boxStart_C) },
      ],
      charts: [],
      tables: [
        {
          title: "Best trade-offs (no other candidate that holds is lighter, cheaper and smaller at once)",
          testId: "size-front",
          columns: ["Pack-out", "Hold", `Packed mass (${k.u.massUnit})`, "Cost", "Outer volume"],
          rows: front.map((c) => [candidateLabel(c, k), candidateHoldText(c, r.required_s, k), k.mass(c.mass_kg), c.cost.toFixed(2), litres(c.outerVolume_m3)]),
        },
        ...(r.nearMisses.length
          ? [
              {
                title: "Near misses",
                testId: "size-near-misses",
                columns: ["Pack-out", "Hold", "Why it falls short"],
                rows: r.nearMisses.map((n) => {
                  const c = r.candidates.find((x) => x.index === n.index);
                  return [c ? candidateLabel(c, k) : `candidate ${n.index}`, n.hold_s === null ? "—" : k.dur(n.hold_s), k.text(n.reason)];
                }),
              },
            ]
          : []),
      ],
      compliance: { title: "", lines: [] },
      assumptions: sizingAssumptions(input, k),
      warnings: [],
      signOff: { title: "Pack-out chosen", lines: ["Pack-out chosen: ____________________________________________", SIGNATURE_LINE] },
      cautions: {
        dryIce: hasDryIce,
        extra: ["Open the chosen pack-out in the hold planner to see its curves and range before relying on it."],
      },
    };
  },
  csv: (_i, r, u) =>
    r.candidates.map((c) => ({
      index: c.index,
      box: boxLabel(c.boxName, kit(u)),
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
