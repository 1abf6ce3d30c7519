/**
 * Input of the pack-out sizer. One schema for the page, the API, the CLI and `holdline schema size`.
 */
import { z } from "zod";
import { materialSchema, packSchema, routeSchema, ruleSetSchema, shipperSchema, temperatureField } from "./templates";
import { holdProductLineSchema, uncertaintySchema, PLACEMENTS } from "./hold";

import { MAX_CANDIDATES } from "./defaults";
/** The largest search the sizer accepts in one go. */
export { MAX_CANDIDATES } from "./defaults";

const temp = (what: string) => temperatureField(what, 100, "is not conditioning");

export const sizeBoxSchema = z.object({
  shipper: shipperSchema,
  /** Extra variants: the box's thickest insulation layer (walls and lid) at these thicknesses. */
  thicknessVariants_m: z.array(z.number().positive({ error: "A wall thickness must be greater than zero" }).max(0.3, { error: "Wall thickness above 300 mm is not a box" })).max(10).default([]),
  /** What a cubic metre more (or less) of its insulation costs in a thickness variant; null: the box's price over its shell volume. */
  extraInsulationCost_per_m3: z.number({ error: "Insulation cost: enter a number" }).min(0, { error: "Insulation cost cannot be negative" }).max(1e6).nullable().default(null),
});

export const sizePackSchema = z
  .object({
    pack: packSchema,
    minCount: z.number().int({ error: "Fewest: a whole number" }).min(0, { error: "Fewest cannot be negative" }).max(100).default(0),
    maxCount: z.number().int({ error: "Most: a whole number" }).min(0, { error: "Most cannot be negative" }).max(100, { error: "Most: at most 100" }),
    conditioning_C: z.array(temp("Conditioning")).min(1, { error: "Give at least one conditioning temperature" }).max(6),
    placement: z.enum(PLACEMENTS).default("around"),
    /** Whether the packs touch the load (false: kept apart from it, e.g. in their own compartment). */
    touchesLoad: z.boolean().default(true),
    unitCost: z.number().min(0, { error: "Cost cannot be negative" }).default(0),
  })
  .superRefine((p, ctx) => {
    if (p.maxCount < p.minCount) ctx.addIssue({ code: "custom", path: ["maxCount"], message: "Most must be at least Fewest" });
  });

/**
 * Without pruning every candidate runs the hold model (about 1 ms to 1 s each, depending on the route);
 * this many is a few seconds on a plain route.
 */
export const MAX_UNPRUNED_CANDIDATES = 5_000;

/** How many candidates a search has: box variants × pack count ranges × conditioning temperatures. */
export function candidateCount(inp: { boxes: { thicknessVariants_m: number[] }[]; packs: { minCount: number; maxCount: number; conditioning_C: number[] }[] }): number {
  let size = inp.boxes.reduce((a, b) => a + 1 + b.thicknessVariants_m.length, 0);
  for (const p of inp.packs) size *= (p.maxCount - p.minCount + 1) * p.conditioning_C.length;
  return size;
}

/** List lengths of one sizing input (also checked before any template look-up). */
export const MAX_SIZE_LINES = { products: 12, boxes: 20, packs: 6 } as const;

export const sizeInputSchema = z
  .object({
    products: z.array(holdProductLineSchema).min(1, { error: "Add at least one product to size for" }).max(MAX_SIZE_LINES.products, { error: `At most ${MAX_SIZE_LINES.products} product lines` }),
    route: routeSchema,
    ruleSet: ruleSetSchema,
    materials: z.array(materialSchema).min(1, { error: "The boxes' materials are needed" }),
    boxes: z.array(sizeBoxSchema).min(1, { error: "Choose at least one candidate box" }).max(MAX_SIZE_LINES.boxes, { error: `At most ${MAX_SIZE_LINES.boxes} candidate boxes` }),
    packs: z.array(sizePackSchema).min(1, { error: "Choose at least one candidate pack" }).max(MAX_SIZE_LINES.packs, { error: `At most ${MAX_SIZE_LINES.packs} candidate packs` }),
    margin: z.object({ kind: z.enum(["percent", "hours"]), value: z.number().min(0, { error: "Margin cannot be negative" }).max(1000) }).default({ kind: "percent", value: 20 }),
    judgeBy: z.enum(["low", "central"], { error: "Judge by the low end of the band or the central value" }).default("low"),
    uncertainty: uncertaintySchema.default({ outerH_frac: 0.3, insulationK_frac: 0.1, conditioning_K: 2 }),
    boxStart_C: temp("Box temperature when packed").nullable().default(null),
    maxCandidates: z.number().int().min(1).max(MAX_CANDIDATES).default(5000),
    /** Treat the inside air of every candidate as one well-mixed volume (no stratification), as hand formulas do. */
    wellMixedInside: z.boolean().default(false),
    /** Skip candidates that monotone physics already decides (never where a lower limit could be crossed). */
    prune: z.boolean().default(true),
  })
  .superRefine((s, ctx) => {
    if (s.prune) return;
    const n = candidateCount(s);
    if (n > MAX_UNPRUNED_CANDIDATES) {
      ctx.addIssue({
        code: "custom",
        path: ["prune"],
        message: `Without pruning at most ${MAX_UNPRUNED_CANDIDATES.toLocaleString("en")} candidates are run (this search has ${n.toLocaleString("en")}): turn pruning on (prune: true), or narrow the count ranges, conditioning temperatures or boxes`,
      });
    }
  });
export type SizeInput = z.input<typeof sizeInputSchema>;
export type SizeParsed = z.output<typeof sizeInputSchema>;
