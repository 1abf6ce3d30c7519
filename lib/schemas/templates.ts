/**
 * Input schemas for every template kind. These zod schemas are the single source of
 * truth: the forms (zodResolver), the server actions and API route handlers
 * (safeParse → field errors), the CLI import and the JSON Schema (`holdline schema`)
 * all use them. Every number is SI with its unit in the field name.
 */
import { z } from "zod";

/** Absolute zero, 0 K = −273.15 °C (BIPM, The International System of Units, 9th ed., 2019). */
export const ABSOLUTE_ZERO_C = -273.15;

const num = (what: string) => z.number({ error: `${what}: enter a number` });
const positive = (what: string) => num(what).positive({ error: `${what} must be greater than zero` });
const nonNegative = (what: string) => num(what).nonnegative({ error: `${what} cannot be negative` });
/** A temperature field in °C: never below absolute zero, and at most `max_C` (with the reason shown if exceeded). */
export const temperatureField = (what: string, max_C = 1000, tooHigh = "is not a food temperature") =>
  num(what)
    .min(ABSOLUTE_ZERO_C, { error: `${what} cannot be below absolute zero (−273.15 °C)` })
    .max(max_C, { error: `${what} above ${max_C} °C ${tooHigh}` });
const temperature = (what: string) => temperatureField(what);
const fraction = (what: string) =>
  num(what).min(0, { error: `${what} cannot be negative` }).max(1, { error: `${what} cannot exceed 1` });
const name = z
  .string({ error: "Name: enter a name" })
  .trim()
  .min(1, { error: "Name: enter a name" })
  .max(120, { error: "Name: at most 120 characters" });
const notes = z.string().max(4000, { error: "Notes: at most 4000 characters" }).default("");
const optionalPositive = (what: string) => positive(what).nullable().default(null);

// ---------------------------------------------------------------- materials
export const MATERIAL_CATEGORIES = ["insulation", "packaging", "tray", "finish"] as const;

export const materialSchema = z.object({
  name,
  category: z.enum(MATERIAL_CATEGORIES, { error: "Category: choose insulation, packaging, tray or finish" }),
  conductivity_W_mK: positive("Conductivity"),
  conductivitySource: z.string().trim().min(1, { error: "Give the published source of the conductivity" }),
  density_kg_m3: positive("Density"),
  densitySource: z.string().trim().min(1, { error: "Give the published source of the density" }),
  specificHeat_J_kgK: positive("Specific heat"),
  specificHeatSource: z.string().trim().min(1, { error: "Give the published source of the specific heat" }),
  emissivity: fraction("Emissivity"),
  emissivitySource: z.string().trim().min(1, { error: "Give the published source of the emissivity" }),
  solarAbsorptivity: fraction("Solar absorptivity"),
  solarAbsorptivitySource: z.string().trim().min(1, { error: "Give the published source of the solar absorptivity" }),
  notes,
});
export type MaterialInput = z.input<typeof materialSchema>;
export type Material = z.output<typeof materialSchema>;

// ---------------------------------------------------------------- products
export const PRODUCT_SHAPES = ["slab", "cylinder", "sphere", "block"] as const;
export type ProductShape = (typeof PRODUCT_SHAPES)[number];

/** What each dimension means for each shape (dimA_m, dimB_m, dimC_m). */
export const SHAPE_DIMENSIONS: Record<ProductShape, string[]> = {
  slab: ["Thickness", "Width", "Length"],
  cylinder: ["Diameter", "Length"],
  sphere: ["Diameter"],
  block: ["Height", "Width", "Length"],
};

/** Allowed gap between the sum of the mass fractions and 1. */
export const COMPOSITION_TOLERANCE = 0.01;

export const compositionSchema = z
  .object({
    water: fraction("Water"),
    protein: fraction("Protein"),
    fat: fraction("Fat"),
    carbohydrate: fraction("Carbohydrate"),
    fibre: fraction("Fibre"),
    ash: fraction("Ash"),
  })
  .superRefine((c, ctx) => {
    const sum = c.water + c.protein + c.fat + c.carbohydrate + c.fibre + c.ash;
    if (Number.isFinite(sum) && Math.abs(sum - 1) > COMPOSITION_TOLERANCE) {
      ctx.addIssue({
        code: "custom",
        message: `Mass fractions add up to ${sum.toFixed(3)}; they must add up to 1 (±${COMPOSITION_TOLERANCE})`,
        path: [],
      });
    }
  });
export type Composition = z.output<typeof compositionSchema>;

export const productSchema = z
  .object({
    name,
    category: z.string().trim().min(1, { error: "Category: enter a category" }).max(80),
    shape: z.enum(PRODUCT_SHAPES, { error: "Shape: choose slab, cylinder, sphere or block" }),
    // What each dimension means depends on the shape (SHAPE_DIMENSIONS).
    dimA_m: positive("This size"),
    dimB_m: positive("This size").nullable().default(null),
    dimC_m: positive("This size").nullable().default(null),
    /** Hollow sphere or cylinder (a whole bird with its body cavity): thickness of the solid wall around a closed cavity. */
    // Optional (absent = solid) so that products written before this field still type-check and load.
    wallThickness_m: positive("Wall thickness").nullable().optional(),
    mass_kg: positive("Mass"),
    composition: compositionSchema,
    compositionSource: z.string().max(400).default(""),
    initialFreezing_C: temperature("Initial freezing point")
      .max(0, { error: "Initial freezing point of a water-based food is at or below 0 °C" })
      .nullable()
      .default(null),
    density_kg_m3: optionalPositive("Density"),
    cpUnfrozen_J_kgK: optionalPositive("Specific heat above freezing"),
    cpFrozen_J_kgK: optionalPositive("Specific heat below freezing"),
    kUnfrozen_W_mK: optionalPositive("Conductivity above freezing"),
    kFrozen_W_mK: optionalPositive("Conductivity below freezing"),
    latentHeat_J_kg: nonNegative("Latent heat").nullable().default(null),
    freezeSensitive: z.boolean().default(false),
    // Ready to eat (cooked, or eaten as it is) or raw (cooked before eating): food codes treat them
    // differently while thawing (FDA Food Code 2022, §3-501.13(B)(3)–(4)).
    readyToEat: z.boolean({ error: "Ready to eat: yes or no" }).default(false),
    notes,
  })
  .superRefine((p, ctx) => {
    const need = SHAPE_DIMENSIONS[p.shape]?.length ?? 1;
    if (need >= 2 && (p.dimB_m === null || p.dimB_m === undefined)) {
      ctx.addIssue({ code: "custom", path: ["dimB_m"], message: `${SHAPE_DIMENSIONS[p.shape][1]}: required for a ${p.shape}` });
    }
    if (need >= 3 && (p.dimC_m === null || p.dimC_m === undefined)) {
      ctx.addIssue({ code: "custom", path: ["dimC_m"], message: `${SHAPE_DIMENSIONS[p.shape][2]}: required for a ${p.shape}` });
    }
    if (p.wallThickness_m !== null && p.wallThickness_m !== undefined && Number.isFinite(p.wallThickness_m)) {
      if (p.shape !== "sphere" && p.shape !== "cylinder") {
        ctx.addIssue({ code: "custom", path: ["wallThickness_m"], message: "Wall thickness: only a sphere or a cylinder can be hollow; leave it empty" });
      } else if (Number.isFinite(p.dimA_m) && p.wallThickness_m >= p.dimA_m / 2) {
        ctx.addIssue({ code: "custom", path: ["wallThickness_m"], message: "Wall thickness: must be less than half the diameter (leave it empty for a solid item)" });
      }
    }
  });
export type ProductInput = z.input<typeof productSchema>;
export type Product = z.output<typeof productSchema>;

// ---------------------------------------------------------------- shippers
export const layerSchema = z.object({
  material: z.string().trim().min(1, { error: "Layer: choose a material" }),
  thickness_m: positive("Thickness").max(0.5, { error: "Thickness above 500 mm is not a box wall" }),
});
export type Layer = z.output<typeof layerSchema>;

/** One factor fitted from a logged trip, with its 95 % interval (null ends: the log could not tell it, held at 1). */
export const fittedFactorSchema = z
  .object({
    value: num("Factor").min(0.05, { error: "Factor: at least 0.05" }).max(20, { error: "Factor: at most 20" }),
    low: num("Interval, low end").positive({ error: "Interval, low end: greater than zero" }).nullable().default(null),
    high: num("Interval, high end").positive({ error: "Interval, high end: greater than zero" }).nullable().default(null),
  })
  .refine((f) => (f.low === null) === (f.high === null) && (f.low === null || (f.low <= f.value && f.value <= f.high!)), {
    error: "Interval: give both ends, low ≤ value ≤ high",
    path: ["low"],
  });
export type FittedFactor = z.output<typeof fittedFactorSchema>;

/**
 * Where a calibrated box's factors came from (lib/physics/calibrate.ts): the log's name and first reading,
 * and each fitted factor with its interval. The hold planner applies the factors and draws its uncertainty
 * band from the intervals instead of the default spreads.
 */
export const boxCalibrationSchema = z.object({
  /** "logger-trip.csv, logged 2026-07-14 06:00": shown as "calibrated from …". */
  source: z.string().trim().min(1, { error: "Calibration: name its source" }).max(300),
  logName: z.string().trim().max(200).default(""),
  /** The log's first reading (ISO), null for an elapsed-time log. */
  logStart: z.string().max(40).nullable().default(null),
  factors: z.object({
    wallConductance: fittedFactorSchema.optional(),
    innerH: fittedFactorSchema.optional(),
    contact: fittedFactorSchema.optional(),
  }),
  /** Fit quality, K. */
  rms_K: num("RMS").nonnegative().nullable().default(null),
  maxResidual_K: num("Largest residual").nonnegative().nullable().default(null),
});
export type BoxCalibration = z.output<typeof boxCalibrationSchema>;

export const shipperSchema = z.object({
  name,
  innerLength_m: positive("Inner length"),
  innerWidth_m: positive("Inner width"),
  innerHeight_m: positive("Inner height"),
  wallLayers: z.array(layerSchema).min(1, { error: "Add at least one wall layer" }).max(8, { error: "At most 8 layers" }),
  // An empty list means "built like the walls", stored as null.
  lidLayers: z.preprocess(
    (v) => (Array.isArray(v) && v.length === 0 ? null : v),
    z.array(layerSchema).max(8, { error: "At most 8 layers" }).nullable().default(null),
  ),
  finishMaterial: z.string().trim().min(1, { error: "Outer finish: choose a surface" }),
  emptyMass_kg: nonNegative("Empty mass"),
  cost: nonNegative("Cost"),
  notes,
  /** Set on a box saved from a calibration (null: the box as built). */
  calibration: boxCalibrationSchema.nullish(),
});
export type ShipperInput = z.input<typeof shipperSchema>;
export type Shipper = z.output<typeof shipperSchema>;

// ---------------------------------------------------------------- coolant packs
export const PACK_KINDS = ["water_ice", "gel", "pcm", "dry_ice"] as const;
export type PackKind = (typeof PACK_KINDS)[number];
export const PACK_KIND_LABELS: Record<PackKind, string> = {
  water_ice: "Water ice",
  gel: "Gel pack",
  pcm: "Eutectic / phase-change pack",
  dry_ice: "Dry ice (solid CO₂)",
};

export const packSchema = z.object({
  name,
  kind: z.enum(PACK_KINDS, { error: "Kind: choose water ice, gel, phase-change or dry ice" }),
  mass_kg: positive("Mass"),
  length_m: positive("Length"),
  width_m: positive("Width"),
  thickness_m: positive("Thickness"),
  phaseChange_C: temperature("Melt or sublimation temperature"),
  latentHeat_J_kg: positive("Latent heat"),
  cpSolid_J_kgK: positive("Specific heat (frozen)"),
  cpLiquid_J_kgK: positive("Specific heat (melted)"),
  conditioning_C: temperature("Conditioning temperature"),
  notes,
});
export type PackInput = z.input<typeof packSchema>;
export type Pack = z.output<typeof packSchema>;

// ---------------------------------------------------------------- routes
/**
 * Lid openings bound the hold model's work (each opening is a change of conditions the solver steps
 * through; 500 openings cost about 1.5 s per hold run, and the sizer repeats the run per candidate).
 * 250 in one segment is an opening every two minutes for eight hours.
 */
export const MAX_LID_OPENINGS_PER_SEGMENT = 250;
export const MAX_LID_OPENINGS_PER_ROUTE = 500;

export const segmentSchema = z.object({
  label: z.string().trim().max(80).default(""),
  duration_s: positive("Duration").max(30 * 86400, { error: "Duration: at most 30 days per segment" }),
  airTemp_C: temperature("Air temperature").max(80, { error: "Air temperature above 80 °C is outside what a route can be" }),
  airSpeed_m_s: nonNegative("Air speed").max(60, { error: "Air speed above 60 m/s is not a route" }),
  sun_W_m2: nonNegative("Sun").max(1400, { error: "Sun above 1400 W/m² exceeds the solar constant" }),
  lidOpenings: z
    .number({ error: "Lid openings: enter a whole number" })
    .int({ error: "Lid openings: enter a whole number" })
    .nonnegative({ error: "Lid openings cannot be negative" })
    .max(MAX_LID_OPENINGS_PER_SEGMENT, { error: `Lid openings: at most ${MAX_LID_OPENINGS_PER_SEGMENT} in one segment (one every two minutes for eight hours); fewer, longer openings let in the same air` })
    .default(0),
  lidOpenDuration_s: nonNegative("Lid-open time").default(0),
});
export type Segment = z.output<typeof segmentSchema>;

export const routeSchema = z
  .object({
    name,
    segments: z.array(segmentSchema).min(1, { error: "A route needs at least one segment" }).max(100, { error: "A route has at most 100 segments" }),
    notes,
  })
  .superRefine((r, ctx) => {
    const openings = r.segments.reduce((a, s) => a + s.lidOpenings, 0);
    if (openings > MAX_LID_OPENINGS_PER_ROUTE) {
      ctx.addIssue({
        code: "custom",
        path: ["segments"],
        message: `At most ${MAX_LID_OPENINGS_PER_ROUTE} lid openings on a route (this one has ${openings}); fewer, longer openings let in the same air`,
      });
    }
  });
export type RouteInput = z.input<typeof routeSchema>;
export type Route = z.output<typeof routeSchema>;

// ---------------------------------------------------------------- rule sets
const optionalDuration = (what: string) =>
  positive(what).max(7 * 86400, { error: `${what}: at most 7 days` }).nullable().default(null);

/** How the second cooling stage's time is counted: from the start of stage 1 ("in all"), or from reaching the stage-1 end temperature ("a further …"). */
export const COOL_STAGE2_COUNTED = ["in_all", "after_stage1"] as const;
export type CoolStage2Counted = (typeof COOL_STAGE2_COUNTED)[number];
export const COOL_STAGE2_COUNTED_LABELS: Record<CoolStage2Counted, string> = {
  in_all: "from the start of cooling (in all)",
  after_stage1: "from reaching the stage-1 end temperature (a further …)",
};

/** The fields of the two-stage cooling limit: all given, or none. */
const COOLING_FIELDS = [
  ["coolFrom_C", "Cooling: starting temperature"],
  ["coolStage1To_C", "Cooling stage 1: end temperature"],
  ["coolStage1Max_s", "Cooling stage 1: time allowed"],
  ["coolStage2To_C", "Cooling stage 2: end temperature"],
  ["coolStage2Max_s", "Cooling stage 2: time allowed"],
] as const;

export const ruleSetSchema = z
  .object({
    name,
    jurisdiction: z.string().trim().min(1, { error: "Jurisdiction: enter a label" }).max(120),
    chilledMax_C: temperature("Chilled upper limit").max(20, { error: "Chilled upper limit above 20 °C is not a chill limit" }),
    frozenMax_C: temperature("Frozen upper limit").max(0, { error: "Frozen upper limit must be at or below 0 °C" }),
    hotHoldMin_C: temperature("Hot-holding lower limit").min(40, { error: "Hot-holding lower limit below 40 °C is not hot holding" }),
    thawWaterMax_C: temperature("Maximum thawing-water temperature").nullable().default(null),
    /** Time as a control, hot or cold food: the longest time out of temperature control before it is cooked, served or discarded. */
    outsideControlMax_s: optionalDuration("Time outside temperature control"),
    /** The longer allowance for cold food that starts at or below the chill limit and never rises above `outsideControlColdCeiling_C`. */
    outsideControlColdMax_s: optionalDuration("Cold food outside temperature control"),
    outsideControlColdCeiling_C: temperature("Cold food outside control: highest temperature").max(60, { error: "Cold food outside control: highest temperature above 60 °C is not cold food" }).nullable().default(null),
    /** A tolerance period: one period above the chill limit (e.g. for service or on display), once. */
    chillExcursionMax_s: optionalDuration("Chill tolerance period"),
    /** A tolerance period: one period below the hot-holding limit (e.g. for service or on display), once. */
    hotExcursionMax_s: optionalDuration("Hot tolerance period"),
    /** Thawing raw food (cooked before eating): longest time its surface may be above the chill limit. */
    thawSurfaceAboveMax_s: optionalDuration("Thawing raw food: time above the chill limit"),
    /** Thawing ready-to-eat food: longest time its surface may be above the chill limit (0 = never). */
    thawReadyToEatAboveMax_s: nonNegative("Thawing ready-to-eat food: time above the chill limit").max(7 * 86400, { error: "Thawing ready-to-eat food: at most 7 days" }).nullable().default(null),
    coolFrom_C: temperature("Cooling: starting temperature").nullable().default(null),
    coolStage1To_C: temperature("Cooling stage 1: end temperature").nullable().default(null),
    coolStage1Max_s: optionalDuration("Cooling stage 1: time allowed"),
    coolStage2To_C: temperature("Cooling stage 2: end temperature").nullable().default(null),
    coolStage2Max_s: optionalDuration("Cooling stage 2: time allowed"),
    coolStage2Counted: z.enum(COOL_STAGE2_COUNTED, { error: "Cooling stage 2 is counted in_all or after_stage1" }).default("in_all"),
    source: z.string().trim().min(1, { error: "Source: say where these limits come from" }).max(4000),
    reminder: z.string().trim().min(1, { error: "Reminder: keep a note to confirm with the local regulator" }).max(2000),
    isDefault: z.boolean().default(false),
  })
  .superRefine((r, ctx) => {
    if (r.frozenMax_C >= r.chilledMax_C) {
      ctx.addIssue({ code: "custom", path: ["frozenMax_C"], message: "Frozen upper limit must be below the chilled upper limit" });
    }
    // Cold-food time as a control: the allowance and its ceiling go together.
    if ((r.outsideControlColdMax_s === null) !== (r.outsideControlColdCeiling_C === null)) {
      const missing = r.outsideControlColdMax_s === null ? "outsideControlColdMax_s" : "outsideControlColdCeiling_C";
      ctx.addIssue({ code: "custom", path: [missing], message: "Cold food outside control: give both the time allowed and the highest temperature, or neither" });
    }
    if (r.outsideControlColdCeiling_C !== null && r.outsideControlColdCeiling_C <= r.chilledMax_C) {
      ctx.addIssue({ code: "custom", path: ["outsideControlColdCeiling_C"], message: "Cold food outside control: the highest temperature must be above the chilled upper limit" });
    }
    if (r.outsideControlColdMax_s !== null && r.outsideControlMax_s !== null && r.outsideControlColdMax_s <= r.outsideControlMax_s) {
      ctx.addIssue({ code: "custom", path: ["outsideControlColdMax_s"], message: "Cold food outside control: the allowance must be longer than the general time outside temperature control" });
    }
    if (r.thawReadyToEatAboveMax_s !== null && r.thawSurfaceAboveMax_s !== null && r.thawReadyToEatAboveMax_s > r.thawSurfaceAboveMax_s) {
      ctx.addIssue({ code: "custom", path: ["thawReadyToEatAboveMax_s"], message: "Thawing: ready-to-eat food cannot be allowed longer above the chill limit than raw food" });
    }
    // Two-stage cooling: all five values or none, in falling order.
    const given = COOLING_FIELDS.filter(([f]) => r[f] !== null);
    if (given.length > 0 && given.length < COOLING_FIELDS.length) {
      for (const [f, label] of COOLING_FIELDS) {
        if (r[f] === null) ctx.addIssue({ code: "custom", path: [f], message: `${label}: required when any cooling limit is given (or clear them all)` });
      }
      return;
    }
    if (given.length === 0) return;
    const from = r.coolFrom_C!;
    const to1 = r.coolStage1To_C!;
    const to2 = r.coolStage2To_C!;
    if (to1 >= from) ctx.addIssue({ code: "custom", path: ["coolStage1To_C"], message: "Cooling stage 1: the end temperature must be below the starting temperature" });
    if (to2 >= to1) ctx.addIssue({ code: "custom", path: ["coolStage2To_C"], message: "Cooling stage 2: the end temperature must be below the stage-1 end temperature" });
    if (r.coolStage2Counted === "in_all" && r.coolStage2Max_s! <= r.coolStage1Max_s!) {
      ctx.addIssue({ code: "custom", path: ["coolStage2Max_s"], message: "Cooling stage 2 counted from the start: the time allowed must be longer than stage 1's" });
    }
  });
export type RuleSetInput = z.input<typeof ruleSetSchema>;
export type RuleSet = z.output<typeof ruleSetSchema>;

// ---------------------------------------------------------------- settings
export const settingsSchema = z.object({
  temperatureUnit: z.enum(["C", "F"], { error: "Temperature unit: °C or °F" }),
  massUnit: z.enum(["kg", "lb"], { error: "Mass unit: kg or lb" }),
  lengthUnit: z.enum(["mm", "in"], { error: "Length unit: mm or in" }),
});
export type Settings = z.output<typeof settingsSchema>;

// ---------------------------------------------------------------- registry
export const TEMPLATE_KINDS = ["materials", "products", "shippers", "packs", "routes", "rulesets"] as const;
export type TemplateKind = (typeof TEMPLATE_KINDS)[number];

export const templateSchemas = {
  materials: materialSchema,
  products: productSchema,
  shippers: shipperSchema,
  packs: packSchema,
  routes: routeSchema,
  rulesets: ruleSetSchema,
} as const;

export type TemplateOutput = {
  materials: Material;
  products: Product;
  shippers: Shipper;
  packs: Pack;
  routes: Route;
  rulesets: RuleSet;
};

export const TEMPLATE_LABELS: Record<TemplateKind, { one: string; many: string }> = {
  materials: { one: "material", many: "Materials" },
  products: { one: "product", many: "Products" },
  shippers: { one: "box", many: "Boxes" },
  packs: { one: "coolant pack", many: "Coolant packs" },
  routes: { one: "route", many: "Routes" },
  rulesets: { one: "rule set", many: "Rule sets" },
};

export function isTemplateKind(x: string): x is TemplateKind {
  return (TEMPLATE_KINDS as readonly string[]).includes(x);
}

// ---------------------------------------------------------------- library file
/** The file written by `holdline export` and read by `holdline import`. */
export const libraryFileSchema = z.object({
  format: z.literal("holdline-library", { error: 'format must be "holdline-library"' }),
  formatVersion: z.literal(1, { error: "formatVersion must be 1" }),
  settings: settingsSchema.optional(),
  materials: z.array(materialSchema).default([]),
  products: z.array(productSchema).default([]),
  shippers: z.array(shipperSchema).default([]),
  packs: z.array(packSchema).default([]),
  routes: z.array(routeSchema).default([]),
  rulesets: z.array(ruleSetSchema).default([]),
});
export type LibraryFile = z.output<typeof libraryFileSchema>;
