/**
 * What every planner is to the rest of Holdline: one entry in the registry (./registry.ts). The pages, the
 * browser and server workers, `POST /api/v1/<kind>`, the CLI and saved plans all go through the entry, so
 * a new planner is one entry, its physics module and its tests.
 *
 * Pure: no React, Next, Prisma or I/O. Everything a person reads (`view`, `csv`) is made here in their
 * units, from the SI result, so the page, the print view and the saved-plan record say the same thing.
 */
import type { z } from "zod";
import type { TemplateKind } from "../schemas/templates";
import type { ComplianceLine } from "../physics/compliance";
import type { UnitPrefs } from "../units";

/** Where an input may name a template instead of spelling it out (resolved by lib/db/resolve.ts). */
export interface TemplateRefs {
  /** Top-level fields that may be a template name: `{ product: "products" }`. A missing rule set takes the default one. */
  top: Record<string, TemplateKind>;
  /** Lists of lines whose `field` may name a template; `max` lines at most (checked before any look-up). */
  lines?: { key: string; field: string; kind: TemplateKind; max: number; what: string; fill?: { field: string; from: string } }[];
  /** Nested fields (`method.tray`) that may name a template. */
  nested?: { path: [string, string]; kind: TemplateKind }[];
  /** Fill `materials` with the library materials the boxes name, when the input gives none. */
  materialsFrom?: { field: string } | { list: string; field: string };
  /** Another planner's input nested in this one (`plan` of a calibration), resolved with that planner's refs. */
  inner?: { field: string; by: string };
}

/** One line of the chart of a result: values are already in display units. */
export interface ChartSpec {
  testId: string;
  title: string;
  /** The y-axis title, with its unit: "temperature (°F)", "pack used (%)". */
  yTitle: string;
  unit: string;
  /** A chart of pack state on a fixed 0–100 % axis, of latent heat used or left; otherwise temperatures, whose range data, limits and band decide. */
  packState?: "used" | "left";
  data: Record<string, number>[];
  lines: { key: string; label: string; color: string; dashed?: boolean }[];
  limits: { y: number; label: string }[];
  /** The allowed range shaded, in display units (either order). */
  band?: { y1: number; y2: number } | null;
  markers?: { x: number; label: string; kind: "segment" | "stop" }[];
}

export interface RecordTable {
  title: string;
  testId?: string;
  columns: string[];
  rows: string[][];
  note?: string;
}

/** A result as a person reads it, in their units: the page, the print view and the saved-plan record. */
export interface PlanView {
  /** "Hold plan record" */
  title: string;
  /** One plain sentence: what the model estimates. */
  headline: string;
  headlineTestId: string;
  /** The key figures, label and value. */
  facts: { label: string; value: string; testId?: string }[];
  /** What was planned: the inputs in the user's units. */
  inputs: { label: string; value: string }[];
  charts: ChartSpec[];
  tables: RecordTable[];
  compliance: { title: string; lines: ComplianceLine[] };
  assumptions: string[];
  warnings: string[];
  /** Lines of the paper record with blanks to fill in (probe readings, initials). */
  signOff: { title: string; lines: string[] };
  cautions: { dryIce: boolean; extra: string[] };
  /** Set while a later stage (the uncertainty band, the depth search) is still being worked out. */
  pending?: string;
}

/**
 * A run prepared once on one thread, to be taken piece by piece: piece 0 (runLead) stays with the thread that
 * finishes, keeping whatever only the whole answer needs (the curves); pieces 1 … count − 1 each give one
 * number, on whichever thread takes them. `finish` with every piece's number (index 0 unread) gives exactly
 * what the entry's `run` gives.
 */
export interface PlannerPieces<R, P = unknown> {
  count: number;
  runLead(): void;
  runPiece(at: number): number;
  finish(values: ArrayLike<number>): R;
  /**
   * Once runLead has run: the answer to the entry's quick input (PlannerEntry.quick) from piece 0 alone,
   * exactly what `run` gives for it (that input leaves out only what pieces 1 … count − 1 add: the hold
   * planner's band). The page's lead shows it before taking pieces, instead of running it apart.
   */
  quick?(quickInput: P): R;
}

export type CsvRow = Record<string, string | number | null>;

export interface PlannerEntry<S extends z.ZodType = z.ZodType, R = unknown> {
  kind: string;
  /** "Hold planner" */
  title: string;
  /** The page: "/hold". */
  path: string;
  /** The question the page answers, one line. */
  question: string;
  schema: S;
  refs: TemplateRefs;
  /** The CLI's help lines for `holdline <kind> FILE|-` (first line, then continuation lines). */
  cliHelp: string[];
  /** Server time limit and what to change when it runs out. */
  timeLimit_s: number;
  tooLongHint: string;
  /** Computes the full result (throws PhysicsInputError for an impossible but well-formed input). */
  run: (parsed: z.output<S>) => R | Promise<R>;
  /**
   * The full run as independent pieces that several threads of one host may take side by side (the
   * server's pool), each thread preparing the run once: PlannerPieces. Absent: the run is one piece.
   */
  pieces?: {
    /** At most this many threads are worth it (the lead and its helpers). */
    threads: number;
    start: (parsed: z.output<S>) => PlannerPieces<R, z.output<S>>;
  };
  /**
   * A cheaper first answer shown while the full one is worked out (the central run without the
   * uncertainty band; one method without the comparison), with what is still to come. Null: the full
   * run is already quick (for this input).
   */
  quick: (parsed: z.output<S>) => { input: z.output<S>; pending: string } | null;
  /** The plan's suggested name. */
  defaultName: (parsed: z.output<S>) => string;
  /** `stage.quick`: the result is the quick first answer (what `quick` left out is still to come). */
  view: (parsed: z.output<S>, result: R, units: UnitPrefs, stage?: { quick: boolean }) => PlanView;
  csv: (parsed: z.output<S>, result: R, units: UnitPrefs) => CsvRow[];
}
