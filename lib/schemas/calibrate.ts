/**
 * Input of calibration from a logged trip: a hold or thaw plan, the logger's CSV text, how to read it
 * (delimiter, decimal mark, unit, the time column and its form), which columns are which channel, and
 * which physical factors to fit. One schema for the page, the API, the CLI and `holdline schema calibrate`.
 */
import { z } from "zod";
import { holdInputSchema } from "./hold";
import { thawInputSchema } from "./thaw";

/** A column by its header text, or by its position (0 = the first column). */
export const logColumnSchema = z.union([z.string().trim().min(1, { error: "Column: name it as in the header row" }).max(200), z.number().int().min(0).max(999)], {
  error: "Column: its header text or its position (0 = first)",
});
export type LogColumn = z.output<typeof logColumnSchema>;

export const DATE_ORDERS = ["iso", "day_first", "month_first"] as const;
export type DateOrder = (typeof DATE_ORDERS)[number];
export const ELAPSED_UNITS = ["s", "min", "h"] as const;

export const logTimeSchema = z.discriminatedUnion("kind", [
  z.object({
    kind: z.literal("datetime"),
    column: logColumnSchema,
    /** How the file writes dates: ISO 8601 (2026-07-14T09:30:00), day first (14/07/2026 09:30) or month first (07/14/2026 09:30). */
    order: z.enum(DATE_ORDERS, { error: "Date order: iso, day_first or month_first" }),
  }),
  z.object({
    kind: z.literal("elapsed"),
    column: logColumnSchema,
    /** Elapsed time since the logger started, in seconds, minutes or hours (or h:mm:ss). */
    unit: z.enum(ELAPSED_UNITS, { error: "Elapsed time unit: s, min or h" }),
  }),
]);

export const CHANNEL_ROLES = ["inside_air", "product", "pack", "outside_air"] as const;
export type ChannelRole = (typeof CHANNEL_ROLES)[number];
export const CHANNEL_ROLE_LABELS: Record<ChannelRole, string> = {
  inside_air: "Inside air",
  product: "Product probe",
  pack: "Coolant pack",
  outside_air: "Outside air",
};

export const logChannelSchema = z.object({
  column: logColumnSchema,
  role: z.enum(CHANNEL_ROLES, { error: "Channel: inside_air, product, pack or outside_air" }),
  /** For a product probe or a pack: which line of the plan (0 = the first). */
  line: z.number().int().min(0).max(11).default(0),
  /** For a product probe: whether it sits at the centre or on the surface. */
  point: z.enum(["centre", "surface"]).default("centre"),
});
export type LogChannel = z.output<typeof logChannelSchema>;

export const logFormatSchema = z.object({
  /** Field separator; "auto" lets the parser detect it. */
  delimiter: z.enum(["auto", ",", ";", "\t"], { error: "Delimiter: auto, comma, semicolon or tab" }).default("auto"),
  /** Decimal mark in number columns ("," is common in semicolon-separated files). */
  decimal: z.enum([".", ","]).default("."),
  unit: z.enum(["C", "F"], { error: "Temperature unit: C or F" }).default("C"),
  /** Lines before the header row (a logger's preamble). */
  skipRows: z.number().int().min(0).max(100).default(0),
  time: logTimeSchema,
  channels: z.array(logChannelSchema).min(1, { error: "Map at least one column to a channel" }).max(16),
});
export type LogFormat = z.output<typeof logFormatSchema>;
export type LogFormatInput = z.input<typeof logFormatSchema>;

export const HOLD_FACTORS = ["wallConductance", "innerH", "contact"] as const;
export const THAW_FACTORS = ["surfaceH"] as const;
export type HoldFactor = (typeof HOLD_FACTORS)[number];
export type ThawFactor = (typeof THAW_FACTORS)[number];
export type FactorName = HoldFactor | ThawFactor;
export const FACTOR_LABELS: Record<FactorName, string> = {
  wallConductance: "Wall conductance factor (walls, lid, edges)",
  innerH: "Inside surface coefficient factor",
  contact: "Pack contact factor",
  surfaceH: "Surface coefficient factor",
};

/** Starting guess of a factor, and the range it may take. */
const guess = z.number({ error: "Starting guess: enter a number" }).min(0.05, { error: "Starting guess: at least 0.05" }).max(20, { error: "Starting guess: at most 20" });

const common = {
  log: z.object({
    /** The file's name, kept as provenance. */
    name: z.string().trim().max(200).default("log.csv"),
    text: z.string().min(1, { error: "The log file is empty" }).max(900_000, { error: "The log file is larger than 900 kB (the largest request the server reads is 1 MiB): export a shorter period or a longer logging interval" }),
  }),
  format: logFormatSchema,
  /**
   * Where the plan starts on the log's clock: an ISO date-time (date-time logs) or seconds after the first
   * reading (either kind). Null: the first reading is the plan's start.
   */
  planStart: z.union([z.iso.datetime({ local: true, offset: true }), z.number().min(0).max(30 * 86400)], { error: "Plan start: a date-time or seconds after the first reading" }).nullable().default(null),
};

export const calibrateInputSchema = z.discriminatedUnion("planner", [
  z.object({
    planner: z.literal("hold"),
    plan: holdInputSchema,
    ...common,
    fit: z.array(z.enum(HOLD_FACTORS, { error: "Factor: wallConductance, innerH or contact" })).min(1).max(3).default(["wallConductance", "innerH", "contact"]),
    initial: z.object({ wallConductance: guess.default(1), innerH: guess.default(1), contact: guess.default(1) }).default({ wallConductance: 1, innerH: 1, contact: 1 }),
    /** Use a logged outside-air channel in place of the route's air temperatures. */
    useLoggedOutsideAir: z.boolean().default(true),
  }),
  z.object({
    planner: z.literal("thaw"),
    plan: thawInputSchema,
    ...common,
    fit: z.array(z.enum(THAW_FACTORS, { error: "Factor: surfaceH" })).min(1).max(1).default(["surfaceH"]),
    initial: z.object({ surfaceH: guess.default(1) }).default({ surfaceH: 1 }),
    useLoggedOutsideAir: z.boolean().default(false),
  }),
]);
export type CalibrateInput = z.input<typeof calibrateInputSchema>;
export type CalibrateParsed = z.output<typeof calibrateInputSchema>;
