import type { Quantity } from "@/lib/units";
import type { TemplateKind } from "@/lib/schemas/templates";
import { COOL_STAGE2_COUNTED, COOL_STAGE2_COUNTED_LABELS, MATERIAL_CATEGORIES, PACK_KINDS, PACK_KIND_LABELS, PRODUCT_SHAPES } from "@/lib/schemas/templates";

/** How one field of a template form is shown. Validation lives in the zod schema, not here. */
export type FieldSpec =
  | { kind: "text"; name: string; label: string; help?: string; multiline?: boolean }
  | { kind: "number"; name: string; label: string; quantity: Quantity; nullable?: boolean; help?: string }
  | { kind: "select"; name: string; label: string; options: { value: string; label: string }[]; help?: string }
  | { kind: "materialSelect"; name: string; label: string; category?: string; help?: string }
  | { kind: "checkbox"; name: string; label: string; help?: string }
  | { kind: "group"; name: string; label: string; fields: FieldSpec[]; help?: string }
  | { kind: "layers"; name: string; label: string; nullable?: boolean; help?: string }
  | { kind: "segments"; name: string; label: string; help?: string };

export const SEGMENT_FIELDS: FieldSpec[] = [
  { kind: "text", name: "label", label: "What happens" },
  { kind: "number", name: "duration_s", label: "Duration", quantity: "shortDuration" },
  { kind: "number", name: "airTemp_C", label: "Air temperature", quantity: "temperature" },
  { kind: "number", name: "airSpeed_m_s", label: "Air speed", quantity: "speed" },
  { kind: "number", name: "sun_W_m2", label: "Sun on the box", quantity: "irradiance" },
  { kind: "number", name: "lidOpenings", label: "Lid openings", quantity: "count" },
  { kind: "number", name: "lidOpenDuration_s", label: "Each opening", quantity: "seconds" },
];

export const TEMPLATE_FIELDS: Record<TemplateKind, FieldSpec[]> = {
  products: [
    { kind: "text", name: "name", label: "Name" },
    { kind: "text", name: "category", label: "Category", help: "Your own grouping, e.g. cooked meat, fresh produce" },
    { kind: "select", name: "shape", label: "Shape", options: PRODUCT_SHAPES.map((s) => ({ value: s, label: s })) },
    { kind: "number", name: "dimA_m", label: "Dimension 1", quantity: "length" },
    { kind: "number", name: "dimB_m", label: "Dimension 2", quantity: "length", nullable: true },
    { kind: "number", name: "dimC_m", label: "Dimension 3", quantity: "length", nullable: true },
    {
      kind: "number",
      name: "wallThickness_m",
      label: "Wall thickness (hollow items)",
      quantity: "length",
      nullable: true,
      help: "A sphere or cylinder around a closed cavity, such as a whole bird: the average thickness of meat and bone around the cavity. Leave empty for a solid item",
    },
    { kind: "number", name: "mass_kg", label: "Mass", quantity: "mass" },
    {
      kind: "group",
      name: "composition",
      label: "Composition (mass fractions, must add up to 1)",
      fields: [
        { kind: "number", name: "water", label: "Water", quantity: "fraction" },
        { kind: "number", name: "protein", label: "Protein", quantity: "fraction" },
        { kind: "number", name: "fat", label: "Fat", quantity: "fraction" },
        { kind: "number", name: "carbohydrate", label: "Carbohydrate (without fibre)", quantity: "fraction" },
        { kind: "number", name: "fibre", label: "Fibre", quantity: "fraction" },
        { kind: "number", name: "ash", label: "Ash", quantity: "fraction" },
      ],
    },
    { kind: "text", name: "compositionSource", label: "Composition source", help: "Where the fractions come from, e.g. a food composition table" },
    { kind: "number", name: "initialFreezing_C", label: "Initial freezing point", quantity: "temperature", nullable: true, help: "Leave empty to estimate it from the composition" },
    { kind: "checkbox", name: "freezeSensitive", label: "Freeze-sensitive (must not freeze; adds a lower limit)" },
    { kind: "checkbox", name: "readyToEat", label: "Ready to eat (eaten without further cooking)", help: "While thawing, food codes allow raw food some time above the chill limit and ready-to-eat food none or less" },
    {
      kind: "group",
      name: "",
      label: "Property overrides (leave empty to compute from the composition)",
      fields: [
        { kind: "number", name: "density_kg_m3", label: "Density", quantity: "density", nullable: true },
        { kind: "number", name: "cpUnfrozen_J_kgK", label: "Specific heat above freezing", quantity: "specificHeat", nullable: true },
        { kind: "number", name: "cpFrozen_J_kgK", label: "Specific heat below freezing", quantity: "specificHeat", nullable: true },
        { kind: "number", name: "kUnfrozen_W_mK", label: "Conductivity above freezing", quantity: "conductivity", nullable: true },
        { kind: "number", name: "kFrozen_W_mK", label: "Conductivity below freezing", quantity: "conductivity", nullable: true },
        { kind: "number", name: "latentHeat_J_kg", label: "Latent heat", quantity: "latentHeat", nullable: true },
      ],
    },
    { kind: "text", name: "notes", label: "Notes", multiline: true },
  ],
  shippers: [
    { kind: "text", name: "name", label: "Name" },
    { kind: "number", name: "innerLength_m", label: "Inside length", quantity: "length" },
    { kind: "number", name: "innerWidth_m", label: "Inside width", quantity: "length" },
    { kind: "number", name: "innerHeight_m", label: "Inside height", quantity: "length" },
    { kind: "layers", name: "wallLayers", label: "Wall layers, outside first" },
    { kind: "layers", name: "lidLayers", label: "Lid layers, outside first", nullable: true, help: "Only if the lid is built differently from the walls" },
    { kind: "materialSelect", name: "finishMaterial", label: "Outer surface", category: "finish", help: "Sets how much sun it absorbs and how it radiates" },
    { kind: "number", name: "emptyMass_kg", label: "Empty mass", quantity: "mass" },
    { kind: "number", name: "cost", label: "Cost", quantity: "money" },
    { kind: "text", name: "notes", label: "Notes", multiline: true },
  ],
  packs: [
    { kind: "text", name: "name", label: "Name" },
    { kind: "select", name: "kind", label: "Kind", options: PACK_KINDS.map((k) => ({ value: k, label: PACK_KIND_LABELS[k] })) },
    { kind: "number", name: "mass_kg", label: "Mass", quantity: "mass" },
    { kind: "number", name: "length_m", label: "Length", quantity: "length" },
    { kind: "number", name: "width_m", label: "Width", quantity: "length" },
    { kind: "number", name: "thickness_m", label: "Thickness", quantity: "length" },
    { kind: "number", name: "phaseChange_C", label: "Melt or sublimation temperature", quantity: "temperature" },
    { kind: "number", name: "latentHeat_J_kg", label: "Latent heat", quantity: "latentHeat" },
    { kind: "number", name: "cpSolid_J_kgK", label: "Specific heat, frozen", quantity: "specificHeat" },
    { kind: "number", name: "cpLiquid_J_kgK", label: "Specific heat, melted (gas for dry ice)", quantity: "specificHeat" },
    { kind: "number", name: "conditioning_C", label: "Usual conditioning temperature", quantity: "temperature" },
    { kind: "text", name: "notes", label: "Notes", multiline: true },
  ],
  routes: [
    { kind: "text", name: "name", label: "Name" },
    { kind: "segments", name: "segments", label: "Segments, in order" },
    { kind: "text", name: "notes", label: "Notes", multiline: true },
  ],
  rulesets: [
    { kind: "text", name: "name", label: "Name" },
    { kind: "text", name: "jurisdiction", label: "Jurisdiction" },
    { kind: "number", name: "chilledMax_C", label: "Chilled food, upper limit", quantity: "temperature" },
    { kind: "number", name: "frozenMax_C", label: "Frozen food, upper limit", quantity: "temperature" },
    { kind: "number", name: "hotHoldMin_C", label: "Hot holding, lower limit", quantity: "temperature" },
    { kind: "number", name: "thawWaterMax_C", label: "Thawing water, highest temperature", quantity: "temperature", nullable: true },
    {
      kind: "group",
      name: "",
      label: "Thawing: longest time the surface may be above the chill limit",
      fields: [
        { kind: "number", name: "thawSurfaceAboveMax_s", label: "Raw food (cooked before eating)", quantity: "duration", nullable: true },
        { kind: "number", name: "thawReadyToEatAboveMax_s", label: "Ready-to-eat food (0 = never)", quantity: "duration", nullable: true },
      ],
    },
    {
      kind: "group",
      name: "",
      label: "Time as a control (food out of temperature control, then cooked, served or discarded)",
      fields: [
        { kind: "number", name: "outsideControlMax_s", label: "Hot or cold food, longest time", quantity: "duration", nullable: true },
        { kind: "number", name: "outsideControlColdMax_s", label: "Cold food that stays below a ceiling, longest time", quantity: "duration", nullable: true },
        { kind: "number", name: "outsideControlColdCeiling_C", label: "Cold food: ceiling it may not pass", quantity: "temperature", nullable: true },
      ],
    },
    {
      kind: "group",
      name: "",
      label: "Tolerance periods (one period, once; e.g. for service or on display)",
      fields: [
        { kind: "number", name: "chillExcursionMax_s", label: "Above the chill limit", quantity: "duration", nullable: true },
        { kind: "number", name: "hotExcursionMax_s", label: "Below the hot-holding limit", quantity: "duration", nullable: true },
      ],
    },
    {
      kind: "group",
      name: "",
      label: "Two-stage cooling of cooked food (all five values, or none)",
      fields: [
        { kind: "number", name: "coolFrom_C", label: "Cooling starts at", quantity: "temperature", nullable: true },
        { kind: "number", name: "coolStage1To_C", label: "Stage 1 ends at", quantity: "temperature", nullable: true },
        { kind: "number", name: "coolStage1Max_s", label: "Stage 1 within", quantity: "duration", nullable: true },
        { kind: "number", name: "coolStage2To_C", label: "Stage 2 ends at", quantity: "temperature", nullable: true },
        { kind: "number", name: "coolStage2Max_s", label: "Stage 2 within", quantity: "duration", nullable: true },
        { kind: "select", name: "coolStage2Counted", label: "Stage 2 time counted", options: COOL_STAGE2_COUNTED.map((c) => ({ value: c, label: COOL_STAGE2_COUNTED_LABELS[c] })) },
      ],
    },
    { kind: "text", name: "source", label: "Where these limits come from", multiline: true },
    { kind: "text", name: "reminder", label: "Reminder to confirm locally", multiline: true },
    { kind: "checkbox", name: "isDefault", label: "Use this rule set unless I choose another" },
  ],
  materials: [
    { kind: "text", name: "name", label: "Name" },
    { kind: "select", name: "category", label: "Category", options: MATERIAL_CATEGORIES.map((c) => ({ value: c, label: c })) },
    { kind: "number", name: "conductivity_W_mK", label: "Conductivity", quantity: "conductivity" },
    { kind: "text", name: "conductivitySource", label: "Source of the conductivity" },
    { kind: "number", name: "density_kg_m3", label: "Density", quantity: "density" },
    { kind: "text", name: "densitySource", label: "Source of the density" },
    { kind: "number", name: "specificHeat_J_kgK", label: "Specific heat", quantity: "specificHeat" },
    { kind: "text", name: "specificHeatSource", label: "Source of the specific heat" },
    { kind: "number", name: "emissivity", label: "Long-wave emissivity", quantity: "ratio" },
    { kind: "text", name: "emissivitySource", label: "Source of the emissivity" },
    { kind: "number", name: "solarAbsorptivity", label: "Solar absorptivity", quantity: "ratio" },
    { kind: "text", name: "solarAbsorptivitySource", label: "Source of the solar absorptivity" },
    { kind: "text", name: "notes", label: "Notes", multiline: true },
  ],
};

/** Columns of the list page: [label, field path, quantity]. */
export const LIST_COLUMNS: Record<TemplateKind, { label: string; path: string; quantity?: Quantity }[]> = {
  products: [
    { label: "Category", path: "category" },
    { label: "Shape", path: "shape" },
    { label: "Mass", path: "mass_kg", quantity: "mass" },
    { label: "Water", path: "composition.water", quantity: "fraction" },
  ],
  shippers: [
    { label: "Inside length", path: "innerLength_m", quantity: "length" },
    { label: "Inside width", path: "innerWidth_m", quantity: "length" },
    { label: "Inside height", path: "innerHeight_m", quantity: "length" },
    { label: "Cost", path: "cost", quantity: "money" },
  ],
  packs: [
    { label: "Kind", path: "kind" },
    { label: "Mass", path: "mass_kg", quantity: "mass" },
    { label: "Melts at", path: "phaseChange_C", quantity: "temperature" },
    { label: "Conditioned at", path: "conditioning_C", quantity: "temperature" },
  ],
  routes: [{ label: "Segments", path: "segments.length" }],
  rulesets: [
    { label: "Chilled ≤", path: "chilledMax_C", quantity: "temperature" },
    { label: "Frozen ≤", path: "frozenMax_C", quantity: "temperature" },
    { label: "Hot ≥", path: "hotHoldMin_C", quantity: "temperature" },
    { label: "Default", path: "isDefault" },
  ],
  materials: [
    { label: "Category", path: "category" },
    { label: "Conductivity", path: "conductivity_W_mK", quantity: "conductivity" },
    { label: "Emissivity", path: "emissivity", quantity: "ratio" },
    { label: "Solar absorptivity", path: "solarAbsorptivity", quantity: "ratio" },
  ],
};

export function getPath(obj: unknown, path: string): unknown {
  return path.split(".").reduce<unknown>((o, k) => (o && typeof o === "object" ? (o as Record<string, unknown>)[k] : undefined), obj);
}
