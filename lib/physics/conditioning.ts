/**
 * How long a coolant pack needs in a freezer (or chiller) to reach its conditioning temperature:
 * the pack as a slab of its own thickness on the core's enthalpy solver, starting at room temperature
 * (20 °C) in still cabinet air at the conditioning temperature, until its centre is within 1 K of it.
 * The cabinet coefficient, 10 W/(m²·K) for still air plus radiation between packs on a shelf, and the
 * 20 °C start are common practice, stated with the answer. Dry ice is not conditioned.
 * The hold model starts a pack conditioned at or below its melt point fully frozen, so conditioning
 * must freeze it through: the target is also below the model's melting band, and a cabinet that is not
 * colder than that band cannot freeze the pack at all (canFreezeAt).
 */
import type { Pack } from "../schemas/templates";
import { packMaterial, packMeltBand_K } from "./hold";
import { solve1D } from "./solver1d";

export const CABINET_H_W_M2K = 10;
export const PACK_START_C = 20;

/** Whether a cabinet at this temperature can freeze the pack through (colder than the bottom of its melting band). */
export function canFreezeAt(p: Pack, conditioning_C: number): boolean {
  return p.kind === "dry_ice" || conditioning_C < p.phaseChange_C - packMeltBand_K(p) / 2;
}

export function conditioningTime_s(p: Pack, conditioning_C: number): number | null {
  if (p.kind === "dry_ice") return null;
  const mat = packMaterial(p);
  const frozen = conditioning_C <= p.phaseChange_C;
  if (frozen && !canFreezeAt(p, conditioning_C)) return null;
  // Within 1 K of the cabinet, and frozen through when it is meant to start frozen.
  const target = frozen ? Math.min(conditioning_C + 1, p.phaseChange_C - packMeltBand_K(p) / 2 - 0.05) : conditioning_C + 1;
  if (PACK_START_C <= target) return 0;
  const r = solve1D({
    shape: "slab",
    halfSize_m: p.thickness_m / 2,
    nodes: 21,
    material: mat,
    initial_C: PACK_START_C,
    boundary: { kind: "convective", h_W_m2K: () => CABINET_H_W_M2K, fluid_C: () => conditioning_C },
    tEnd_s: 14 * 86400,
    dt_s: 60,
    adaptive: { target_K: 1, dtMax_s: 1800 },
    stopWhen: (s) => s.center_C <= target,
  });
  return r.stoppedEarly ? r.t_s[r.t_s.length - 1] : null;
}
