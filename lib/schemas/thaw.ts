/**
 * Input of the thaw planner. One schema for the page, the API, the CLI and `holdline schema thaw`.
 */
import { z } from "zod";
import { materialSchema, productSchema, ruleSetSchema, temperatureField } from "./templates";

const temp = (what: string) => temperatureField(what, 100, "is not thawing");
const speed = (what: string, max: number) => z.number({ error: `${what}: enter a number` }).min(0, { error: `${what} cannot be negative` }).max(max, { error: `${what} above ${max} m/s is not a kitchen` });
const positive = (what: string, max: number) => z.number({ error: `${what}: enter a number` }).positive({ error: `${what} must be greater than zero` }).max(max, { error: `${what} is implausibly large` });

/**
 * Still water: each change restarts the bath model, so the work grows with the number of changes. The
 * shortest interval is a minute (water changed more often is running water in effect); at most
 * MAX_WATER_CHANGES changes in the time looked at (the default 10 days at one-minute changes; about 4 s of
 * computing in the worst case, an item that never thaws).
 */
export const MIN_WATER_CHANGE_S = 60;
export const MAX_WATER_CHANGES = 14_400;

export const THAW_METHODS = ["fridge_air", "tray", "running_water", "still_water", "room_air"] as const;
export type ThawMethodKind = (typeof THAW_METHODS)[number];
export const THAW_METHOD_LABELS: Record<ThawMethodKind, string> = {
  fridge_air: "Refrigerator, on a rack",
  tray: "On a tray",
  running_water: "Cold running water",
  still_water: "Cold water, changed on a schedule",
  room_air: "Room air",
};

export const packagingSchema = z.object({
  thickness_m: positive("Packaging thickness", 0.05),
  k_W_mK: positive("Packaging conductivity", 10),
});

export const thawMethodSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("fridge_air"), air_C: temp("Refrigerator air"), speed_m_s: speed("Air speed", 20) }),
  z.object({
    kind: z.literal("tray"),
    air_C: temp("Air around the tray"),
    speed_m_s: speed("Air speed", 20),
    tray: materialSchema,
    trayThickness_m: positive("Tray thickness", 0.1),
    trayLength_m: positive("Tray length", 3),
    trayWidth_m: positive("Tray width", 3),
    /** Whether the tray's underside is in the air (a rack) or on a bench (insulated). */
    undersideExposed: z.boolean().default(true),
    contact_W_m2K: positive("Contact conductance", 1e5).default(200),
  }),
  z.object({ kind: z.literal("running_water"), water_C: temp("Water"), speed_m_s: speed("Water speed", 5), packaging: packagingSchema.nullable().default(null) }),
  z.object({
    kind: z.literal("still_water"),
    water_C: temp("Water"),
    bath_m3: positive("Bath volume", 2),
    changeEvery_s: positive("Change the water every", 86400).min(MIN_WATER_CHANGE_S, {
      error: `Change the water every: at least ${MIN_WATER_CHANGE_S} s; water changed more often than that is running water in effect, so choose that method`,
    }),
    room_C: temp("Room air").default(21),
    packaging: packagingSchema.nullable().default(null),
  }),
  z.object({ kind: z.literal("room_air"), air_C: temp("Room air"), speed_m_s: speed("Air speed", 20) }),
]);
export type ThawMethod = z.output<typeof thawMethodSchema>;

export const thawInputSchema = z.object({
  product: productSchema,
  start_C: temp("Starting temperature").default(-18),
  /** The centre counts as thawed at the initial freezing point plus this margin. */
  endMargin_K: z.number({ error: "End-point margin: enter a number" }).min(0).max(10).default(0.5),
  /** Or an explicit end point for the centre. */
  endPoint_C: temp("End point").nullable().default(null),
  ruleSet: ruleSetSchema,
  method: thawMethodSchema,
  /** Also run every other method with its usual settings. */
  compare: z.boolean().default(false),
  /** When the food must be ready (ISO date-time); gives "start by" for each method. */
  readyBy: z.iso.datetime({ local: true, offset: true, error: "Ready by: a date and time" }).nullable().default(null),
  overrides: z
    .object({
      h_W_m2K: positive("Surface coefficient", 1e5).nullable().default(null),
      emissivity: z.number().min(0).max(1).default(0.9),
    })
    .default({ h_W_m2K: null, emissivity: 0.9 }),
  horizon_s: positive("Longest thaw looked at", 30 * 86400).default(10 * 86400),
}).superRefine((t, ctx) => {
  if (t.method.kind !== "still_water") return;
  const changes = t.horizon_s / t.method.changeEvery_s;
  if (changes > MAX_WATER_CHANGES) {
    ctx.addIssue({
      code: "custom",
      path: ["method", "changeEvery_s"],
      message: `At most ${MAX_WATER_CHANGES} water changes in the time looked at (this is ${Math.ceil(changes)}): change the water every ${Math.ceil(t.horizon_s / MAX_WATER_CHANGES)} s or more, or look at a shorter time (horizon_s)`,
    });
  }
});
export type ThawInput = z.input<typeof thawInputSchema>;
export type ThawParsed = z.output<typeof thawInputSchema>;
