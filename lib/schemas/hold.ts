/**
 * Input of the hold planner: products with counts, a box, packs with counts and conditioning,
 * a route and a rule set. One schema for the page, the API, the CLI and `holdline schema hold`.
 */
import { z } from "zod";
import { DEFAULT_CONTACT_W_M2K, HOLD_OVERRIDE_DEFAULTS } from "./defaults";
export { DEFAULT_CONTACT_W_M2K, HOLD_OVERRIDE_DEFAULTS, effectiveHoldCalibration } from "./defaults";
import { materialSchema, packSchema, productSchema, routeSchema, ruleSetSchema, shipperSchema, temperatureField } from "./templates";

const temp = (what: string) => temperatureField(what, 400, "is outside this tool");
const count = (what: string) =>
  z
    .number({ error: `${what}: enter a whole number` })
    .int({ error: `${what}: enter a whole number` })
    .min(1, { error: `${what}: at least 1` })
    .max(500, { error: `${what}: at most 500` });
const optionalPositive = (what: string, max: number) =>
  z.number({ error: `${what}: enter a number` }).positive({ error: `${what} must be greater than zero` }).max(max, { error: `${what} is implausibly large` }).nullable().default(null);

export const PLACEMENTS = ["around", "top", "bottom", "side"] as const;
export type Placement = (typeof PLACEMENTS)[number];

export const holdProductLineSchema = z.object({
  product: productSchema,
  count: count("Count"),
  start_C: temp("Packed at"),
});

export const holdPackLineSchema = z.object({
  pack: packSchema,
  count: count("Count"),
  conditioning_C: temp("Conditioned at"),
  placement: z.enum(PLACEMENTS, { error: "Placement: around, top, bottom or side" }).default("around"),
  /**
   * What the packs touch besides the box face they lie against: the whole load (null, the default), one
   * product line (its index), or "none" (kept apart from the load, e.g. in their own compartment).
   */
  contactWith: z.union([z.number().int().min(0), z.literal("none")], { error: "Touching: a product line, the whole load or none" }).nullable().default(null),
  /** Contact coefficient between packs and what they touch (load and box face), W/(m²·K). */
  contact_W_m2K: z.number().positive().max(1e4).default(DEFAULT_CONTACT_W_M2K),
});

export const uncertaintySchema = z.object({
  outerH_frac: z.number().min(0).max(0.9).default(0.3),
  insulationK_frac: z.number().min(0).max(0.9).default(0.1),
  conditioning_K: z.number().min(0).max(20).default(2),
});

/** Product lines and pack lines in one hold plan, each (also checked before any template look-up). */
export const MAX_HOLD_LINES = 12;
const factor = (what: string) =>
  z.number({ error: `${what}: enter a number` }).min(0.05, { error: `${what}: at least 0.05` }).max(20, { error: `${what}: at most 20` }).default(1);

/**
 * Scale factors fitted from a logged trip (lib/physics/calibrate.ts), 1 = the model as built: every wall,
 * lid and edge conductivity; the inside surface coefficient; every pack line's contact coefficient.
 */
const fittedInterval = z.object({ low: z.number().min(0.01).max(50), high: z.number().min(0.01).max(50) });

export const holdCalibrationSchema = z.object({
  wallConductance: factor("Wall conductance factor"),
  innerH: factor("Inside coefficient factor"),
  contact: factor("Pack contact factor"),
  /** Where the factors came from (the log's name and date), shown in the assumptions. */
  source: z.string().trim().max(300).default(""),
  /**
   * The fitted factors' 95 % intervals (a calibrated box's): with them, the uncertainty band is drawn from
   * these intervals instead of the default outer-coefficient and insulation spreads.
   */
  intervals: z
    .object({
      wallConductance: fittedInterval.optional(),
      innerH: fittedInterval.optional(),
      contact: fittedInterval.optional(),
    })
    .optional(),
});
export type HoldCalibration = z.output<typeof holdCalibrationSchema>;

export const holdInputSchema = z
  .object({
    products: z.array(holdProductLineSchema).max(MAX_HOLD_LINES, { error: `At most ${MAX_HOLD_LINES} product lines` }).default([]),
    shipper: shipperSchema,
    /** Materials the box names (copied in from the library by the page, API and CLI). */
    materials: z.array(materialSchema).min(1, { error: "The box's materials are needed" }),
    packs: z.array(holdPackLineSchema).max(MAX_HOLD_LINES, { error: `At most ${MAX_HOLD_LINES} pack lines` }).default([]),
    route: routeSchema,
    ruleSet: ruleSetSchema,
    /** Box and inside air temperature when packing; defaults to the first segment's air. */
    boxStart_C: temp("Box temperature when packed").nullable().default(null),
    overrides: z
      .object({
        outerH_W_m2K: optionalPositive("Outer surface coefficient", 1000),
        innerH_W_m2K: optionalPositive("Inner surface coefficient", 1000),
        wallUA_W_K: optionalPositive("Wall UA", 1000),
        sunShareSides: z.number().min(0).max(1).default(0.25),
        lidOpenAirChangesPerMinute: z.number().positive().max(600).default(6),
        /** Treat the inside air as one well-mixed volume (no stratification), as hand formulas do. */
        wellMixedInside: z.boolean().default(false),
      })
      .default(HOLD_OVERRIDE_DEFAULTS),
    uncertainty: uncertaintySchema.default({ outerH_frac: 0.3, insulationK_frac: 0.1, conditioning_K: 2 }),
    /** Absent: the model as built. */
    calibration: holdCalibrationSchema.optional(),
    /** Keep simulating the last segment after the route ends, to measure the margin (fraction of the route length). */
    extendFraction: z.number().min(0).max(3).default(0.5),
  })
  .superRefine((h, ctx) => {
    if (h.products.length === 0 && h.packs.length === 0) ctx.addIssue({ code: "custom", path: ["products"], message: "Add at least one product or one pack" });
    h.packs.forEach((p, i) => {
      if (typeof p.contactWith === "number" && p.contactWith >= h.products.length) {
        ctx.addIssue({ code: "custom", path: ["packs", i, "contactWith"], message: `There is no product line ${p.contactWith + 1}` });
      }
    });
  });
export type HoldInput = z.input<typeof holdInputSchema>;
export type HoldParsed = z.output<typeof holdInputSchema>;
