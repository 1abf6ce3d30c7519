/**
 * Values the input schemas default to, and the calibration a hold plan runs with, without zod: the
 * model's workers (the sizer's threads, the planner worker) import these and so load no schema library.
 * The schema modules re-export them.
 */
import type { HoldCalibration, HoldParsed } from "./hold";

/** Contact conductance between a pack and what it rests on or against: 50 W/(m²·K) (common practice, packaging films and air gaps). */
export const DEFAULT_CONTACT_W_M2K = 50;

/** The hold input's overrides when none are given: every coefficient from the model, sun on the sides 25 %, 6 air changes a minute while the lid is open. */
export const HOLD_OVERRIDE_DEFAULTS = { outerH_W_m2K: null, innerH_W_m2K: null, wallUA_W_K: null, sunShareSides: 0.25, lidOpenAirChangesPerMinute: 6, wellMixedInside: false };

/** The most candidates one sizing may hold. */
export const MAX_CANDIDATES = 20_000;

/**
 * The calibration a hold plan runs with: its own, or else the one its box was saved with (a box calibrated
 * from a logged trip: its factors, source and intervals); undefined for a box as built.
 */
export function effectiveHoldCalibration(inp: Pick<HoldParsed, "calibration" | "shipper">): HoldCalibration | undefined {
  if (inp.calibration) return inp.calibration;
  const c = inp.shipper.calibration;
  if (!c) return undefined;
  const f = c.factors;
  const iv = (x: typeof f.wallConductance) => (x && x.low !== null && x.high !== null ? { low: x.low, high: x.high } : undefined);
  return {
    wallConductance: f.wallConductance?.value ?? 1,
    innerH: f.innerH?.value ?? 1,
    contact: f.contact?.value ?? 1,
    source: c.source,
    intervals: { wallConductance: iv(f.wallConductance), innerH: iv(f.innerH), contact: iv(f.contact) },
  };
}
