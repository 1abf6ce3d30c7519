/**
 * Input of the warm-up / cool-down check: one schema for the page, the API, the CLI and
 * `holdline schema warmup`. SI units with the unit in each name.
 */
import { z } from "zod";
import { productSchema, ruleSetSchema, temperatureField } from "./templates";

export const LIMIT_KINDS = ["chilledMax", "hotHoldMin", "frozenMax"] as const;
export type LimitKind = (typeof LIMIT_KINDS)[number];
export const LIMIT_LABELS: Record<LimitKind, string> = {
  chilledMax: "Chilled upper limit (food warming up)",
  hotHoldMin: "Hot-holding lower limit (hot food cooling down)",
  frozenMax: "Frozen upper limit (frozen food warming up)",
};

export const METHODS = ["auto", "lumped", "series", "numerical"] as const;

const temp = (what: string) => temperatureField(what, 400, "is outside this tool");

export const surroundingsSchema = z.object({
  medium: z.enum(["air", "water"], { error: "Surroundings: air or water" }),
  T_C: temp("Surroundings temperature"),
  speed_m_s: z.number({ error: "Speed: enter a number" }).min(0, { error: "Speed cannot be negative" }).max(60, { error: "Speed above 60 m/s is not a kitchen or a van" }),
  /** Long-wave emissivity of the item's surface (air only). */
  emissivity: z.number({ error: "Emissivity: enter a number" }).min(0, { error: "Emissivity is between 0 and 1" }).max(1, { error: "Emissivity is between 0 and 1" }).default(0.9),
  /** Override: combined surface coefficient, used as given. */
  h_W_m2K: z.number({ error: "h: enter a number" }).positive({ error: "h must be greater than zero" }).max(1e5, { error: "h above 100 000 W/(m²·K) is not a surface coefficient" }).nullable().default(null),
});

export const warmupInputSchema = z.object({
  product: productSchema,
  start_C: temp("Starting temperature"),
  surroundings: surroundingsSchema,
  ruleSet: ruleSetSchema,
  limit: z.enum(LIMIT_KINDS, { error: "Limit: chilledMax, hotHoldMin or frozenMax" }),
  horizon_s: z
    .number({ error: "How long to look ahead: enter a number" })
    .positive({ error: "How long to look ahead must be greater than zero" })
    .max(30 * 86400, { error: "At most 30 days ahead" })
    .default(12 * 3600),
  method: z.enum(METHODS, { error: "Method: auto, lumped, series or numerical" }).default("auto"),
});
export type WarmupInput = z.input<typeof warmupInputSchema>;
export type WarmupParsed = z.output<typeof warmupInputSchema>;
