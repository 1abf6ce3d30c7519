/**
 * The one planner registry: every planner is one entry (./types.ts). Pages, workers (browser and server),
 * `POST /api/v1/<kind>`, the CLI and saved plans look their planner up here and nowhere else.
 * To add a planner: write its physics module and schema, then its entry file here, and add it below.
 */
import type { PlannerEntry } from "./types";
import { holdPlanner } from "./hold";
import { thawPlanner } from "./thaw";
import { warmupPlanner } from "./warmup";
import { sizePlanner } from "./size";
import { coolPlanner } from "./cool";
import { calibratePlanner } from "./calibrate";

/** In the order the pages list them. */
export const PLANNERS = {
  hold: holdPlanner,
  size: sizePlanner,
  thaw: thawPlanner,
  warmup: warmupPlanner,
  cool: coolPlanner,
  calibrate: calibratePlanner,
} as const;

export type PlannerKind = keyof typeof PLANNERS;
export const PLANNER_KINDS = Object.keys(PLANNERS) as [PlannerKind, ...PlannerKind[]];

export function isPlannerKind(x: unknown): x is PlannerKind {
  return typeof x === "string" && Object.hasOwn(PLANNERS, x);
}

/** The entry, typed loosely for code that serves every planner alike (workers, routes, the CLI). */
export function plannerOf(kind: PlannerKind): PlannerEntry {
  return PLANNERS[kind] as unknown as PlannerEntry;
}
