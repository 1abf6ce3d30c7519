/**
 * Input of the cooling planner: will cooked food cool through the rule set's two stages in time, and
 * how deep may the layer be? One schema for the page, the API, the CLI and `holdline schema cool`.
 * SI units with the unit in each name. Every default is stated here, once.
 */
import { z } from "zod";
import { productSchema, ruleSetSchema, temperatureField } from "./templates";

const temp = (what: string) => temperatureField(what, 150, "is not cooked food cooling");
const num = (what: string) => z.number({ error: `${what}: enter a number` });
const speed = (what: string, max: number) => num(what).min(0, { error: `${what} cannot be negative` }).max(max, { error: `${what} above ${max} m/s is not a kitchen` });
const positive = (what: string, max: number, tooLarge: string) => num(what).positive({ error: `${what} must be greater than zero` }).max(max, { error: `${what} ${tooLarge}` });
const humidity = (what: string) => num(what).min(0, { error: `${what} cannot be negative` }).max(1, { error: `${what} is a fraction between 0 and 1 (0.6 for 60 %)` });

/** Gastronorm sizes, length × width in metres [gastronormEN631]. */
export const GASTRONORM_SIZES = {
  "2/1": [0.65, 0.53],
  "1/1": [0.53, 0.325],
  "2/3": [0.354, 0.325],
  "1/2": [0.325, 0.265],
  "1/3": [0.325, 0.176],
  "1/4": [0.265, 0.162],
  "1/6": [0.176, 0.162],
  "1/9": [0.176, 0.108],
} as const satisfies Record<string, readonly [number, number]>;
export type GastronormSize = keyof typeof GASTRONORM_SIZES;
export const GASTRONORM_SIZE_NAMES = Object.keys(GASTRONORM_SIZES) as [GastronormSize, ...GastronormSize[]];
/** The usual gastronorm pan depths, m [gastronormEN631]. */
export const GASTRONORM_DEPTHS_M = [0.02, 0.04, 0.065, 0.1, 0.15, 0.2] as const;

export const PAN_MATERIAL_NAMES = ["stainless", "aluminium", "plastic"] as const;
export type PanMaterialName = (typeof PAN_MATERIAL_NAMES)[number];

/**
 * Pan materials: conductivity, density, specific heat, long-wave emissivity of the pan's outside and
 * the usual wall thickness (used when `wall_m` is not given).
 */
export const PAN_MATERIALS: Record<PanMaterialName, { label: string; k_W_mK: number; rho_kg_m3: number; c_J_kgK: number; emissivity: number; wall_m: number; source: string }> = {
  stainless: {
    label: "Stainless steel",
    k_W_mK: 14.9,
    rho_kg_m3: 7900,
    c_J_kgK: 477,
    emissivity: 0.3,
    wall_m: 0.0008,
    source: "AISI 304, Incropera 6th ed. Table A.1 (from memory) [incroperaSolids]; ε ≈ 0.3 for a brushed finish (from memory, uncertain); 0.8 mm wall: common practice for gastronorm pans",
  },
  aluminium: {
    label: "Aluminium",
    k_W_mK: 177,
    rho_kg_m3: 2770,
    c_J_kgK: 875,
    emissivity: 0.1,
    wall_m: 0.001,
    source: "alloy 2024-T6, Incropera 6th ed. Table A.1 [incroperaSolids]; ε ≈ 0.1 for plain aluminium (from memory, uncertain); 1 mm wall: common practice",
  },
  plastic: {
    label: "Plastic (polycarbonate)",
    k_W_mK: 0.2,
    rho_kg_m3: 1200,
    c_J_kgK: 1200,
    emissivity: 0.9,
    wall_m: 0.002,
    source: "polycarbonate, polymer handbooks (from memory); ε ≈ 0.9 (from memory); 2 mm wall: common practice",
  },
};

export const COOL_SETUPS = ["pan", "piece"] as const;

export const panSetupSchema = z.object({
  kind: z.literal("pan"),
  size: z.enum(GASTRONORM_SIZE_NAMES, { error: `Pan size: one of the gastronorm sizes ${GASTRONORM_SIZE_NAMES.join(", ")}` }).default("1/1"),
  /** Height of the pan (its gastronorm depth), m. */
  height_m: positive("Pan height", 0.3, "above 300 mm is not a pan").default(0.065),
  /** Depth of the food layer in the pan, m. */
  depth_m: positive("Food depth", 0.3, "above 300 mm is not a layer in a pan"),
  material: z.enum(PAN_MATERIAL_NAMES, { error: "Pan material: stainless, aluminium or plastic" }).default("stainless"),
  /** Wall thickness, m; null takes the material's usual wall (PAN_MATERIALS). */
  wall_m: positive("Wall thickness", 0.02, "above 20 mm is not a pan wall").nullable().default(null),
  lid: z.boolean({ error: "Lid: on (true) or off (false)" }).default(false),
  /** Contact conductance between the food and the pan wall, W/(m²·K): moist cooked food wets the pan (our assumption). */
  contact_W_m2K: positive("Food-to-pan contact conductance", 1e5, "above 100 000 W/(m²·K) is not a contact").default(1000),
});

export const pieceSetupSchema = z.object({ kind: z.literal("piece") });

export const coolSetupSchema = z.discriminatedUnion("kind", [panSetupSchema, pieceSetupSchema], { error: "How it sits: a layer in a pan (pan) or a whole piece (piece)" });

export const COOL_METHODS = ["walk_in", "blast_chiller", "ice_bath", "cold_plate", "ice_paddle"] as const;
export type CoolMethodKind = (typeof COOL_METHODS)[number];
export const COOL_METHOD_LABELS: Record<CoolMethodKind, string> = {
  walk_in: "Walk-in refrigerator",
  blast_chiller: "Blast chiller",
  ice_bath: "Ice-water bath",
  cold_plate: "Cold plate",
  ice_paddle: "Ice paddle",
};
export const SUPPORTS = ["rack", "shelf"] as const;
const support = z.enum(SUPPORTS, { error: "Support: a wire rack (rack) or a solid shelf (shelf)" });

/** Why the ice paddle is refused: shown as the field message. */
export const ICE_PADDLE_REFUSAL =
  "Ice paddle: stirring a liquid with a frozen paddle cools it by convection inside the food, which this conduction model does not cover, and we found no published heat-transfer correlation for a paddle in a stirred pot. Plan the batch as a layer in a pan (with the paddle used as well, the real cooling is faster than that estimate)";

export const coolMethodSchema = z.discriminatedUnion(
  "kind",
  [
    z.object({
      kind: z.literal("walk_in"),
      air_C: temp("Refrigerator air").default(3),
      speed_m_s: speed("Air speed", 20).default(0.5),
      relativeHumidity: humidity("Relative humidity of the refrigerator air").default(0.85),
      support: support.default("rack"),
    }),
    z.object({
      kind: z.literal("blast_chiller"),
      air_C: temp("Chiller air").default(-5),
      speed_m_s: speed("Air speed", 20).default(3),
      relativeHumidity: humidity("Relative humidity of the chiller air").default(0.85),
      support: support.default("rack"),
    }),
    z.object({
      kind: z.literal("ice_bath"),
      water_C: temp("Bath water").min(-2, { error: "Bath water below −2 °C is not an ice-water bath" }).default(0.5),
      /** Water level against the pan, from the pan's base, m; null: level with the food. */
      level_m: positive("Water level", 0.3, "above 300 mm is not a bath").nullable().default(null),
      air_C: temp("Room air above the bath").default(21),
      speed_m_s: speed("Air speed above the bath", 20).default(0.2),
      relativeHumidity: humidity("Relative humidity of the room").default(0.5),
    }),
    z.object({
      kind: z.literal("cold_plate"),
      plate_C: temp("Plate").default(-2),
      /** Contact conductance between the pan's base and the plate, W/(m²·K) (our assumption). */
      contact_W_m2K: positive("Pan-to-plate contact conductance", 1e5, "above 100 000 W/(m²·K) is not a contact").default(300),
      air_C: temp("Room air above the plate").default(21),
      speed_m_s: speed("Air speed", 20).default(0.2),
      relativeHumidity: humidity("Relative humidity of the room").default(0.5),
    }),
    z.object({ kind: z.literal("ice_paddle") }),
  ],
  { error: `Method: one of ${COOL_METHODS.join(", ")}` },
);
export type CoolMethod = z.output<typeof coolMethodSchema>;

export const coolInputSchema = z
  .object({
    product: productSchema,
    /** Where the food starts, °C: at most 100 °C (water in the food boils above). */
    start_C: temp("Starting temperature").max(100, { error: "Starting temperature above 100 °C: the water in the food would boil; the model starts at 100 °C or below" }),
    setup: coolSetupSchema,
    method: coolMethodSchema,
    ruleSet: ruleSetSchema,
    /** Long-wave emissivity of the food's open surface. */
    emissivity: num("Emissivity").min(0, { error: "Emissivity is between 0 and 1" }).max(1, { error: "Emissivity is between 0 and 1" }).default(0.9),
    horizon_s: positive("How long to look ahead", 48 * 3600, "is more than 48 h").default(10 * 3600),
    /** Search for the deepest layer that meets both stages (a layer in a pan only). */
    searchDepth: z.boolean().default(true),
    /** Also run the other methods with their usual settings. */
    compare: z.boolean().default(true),
    overrides: z
      .object({
        /** Combined coefficient of the open top, used as given: replaces convection, radiation and evaporation there (or the lid's path). */
        topH_W_m2K: positive("Top surface coefficient", 1e5, "above 100 000 W/(m²·K) is not a surface coefficient").nullable().default(null),
        /** Combined coefficient from the food at the pan's base to the medium, used as given: replaces contact, wall and outside. */
        bottomH_W_m2K: positive("Base coefficient", 1e5, "above 100 000 W/(m²·K) is not a surface coefficient").nullable().default(null),
      })
      .default({ topH_W_m2K: null, bottomH_W_m2K: null }),
  })
  .superRefine((v, ctx) => {
    if (v.method.kind === "ice_paddle") {
      ctx.addIssue({ code: "custom", path: ["method", "kind"], message: ICE_PADDLE_REFUSAL });
      return;
    }
    if (v.setup.kind === "pan") {
      const s = v.setup;
      if (s.depth_m > s.height_m) ctx.addIssue({ code: "custom", path: ["setup", "depth_m"], message: `Food depth: ${(s.depth_m * 1000).toFixed(0)} mm does not fit in a ${(s.height_m * 1000).toFixed(0)} mm pan` });
      if (v.method.kind === "ice_bath" && v.method.level_m !== null && v.method.level_m > s.height_m) {
        ctx.addIssue({ code: "custom", path: ["method", "level_m"], message: `Water level: above the pan's rim (${(s.height_m * 1000).toFixed(0)} mm), the bath would flood the pan` });
      }
    } else if (v.method.kind === "ice_bath" || v.method.kind === "cold_plate") {
      ctx.addIssue({ code: "custom", path: ["setup", "kind"], message: `A whole piece is planned in refrigerator or chiller air; for ${v.method.kind === "ice_bath" ? "an ice-water bath" : "a cold plate"} put it in a pan as a layer` });
    }
    const m = v.method;
    const coolant_C = m.kind === "ice_bath" ? m.water_C : m.kind === "cold_plate" ? m.plate_C : m.air_C;
    if (v.start_C <= coolant_C) ctx.addIssue({ code: "custom", path: ["start_C"], message: `Starting temperature: the food must start warmer than what cools it (${coolant_C} °C)` });
  });
export type CoolInput = z.input<typeof coolInputSchema>;
export type CoolParsed = z.output<typeof coolInputSchema>;
