/**
 * How long a coolant pack needs in a freezer (or chiller) to reach its conditioning temperature:
 * the pack as a slab of its own thickness on the core's enthalpy solver, starting at room temperature
 * (20 °C) in still cabinet air at the conditioning temperature, until its centre is within 1 K of it.
 * The cabinet coefficient, 10 W/(m²·K) for still air plus radiation between packs on a shelf, and the
 * 20 °C start are common practice, stated with the answer. Dry ice is not conditioned.
 */
import type { Pack } from "../schemas/templates";
import { packMaterial } from "./hold";
import { solve1D } from "./solver1d";

export const CABINET_H_W_M2K = 10;
export const PACK_START_C = 20;

export function conditioningTime_s(p: Pack, conditioning_C: number): number | null {
  if (p.kind === "dry_ice") return null;
  const mat = packMaterial(p);
  const target = conditioning_C + 1;
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
