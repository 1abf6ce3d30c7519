/**
 * The pack-out sheet: one printable page for the packer — what goes in, conditioned how long, placed
 * where, the hold the model estimates and the limits it was judged against — for a hold input (a sizer
 * candidate, or a saved hold plan). Every figure goes through the one set of formatters (view-kit), so
 * the sheet says "134.6 °F" wherever it means 57 °C. Pure: the page supplies the hold result and the
 * conditioning times, both computed in browser workers.
 */
import type { HoldParsed } from "../schemas/hold";
import type { HoldResult } from "../physics/hold";
import { conditioningTime_s, canFreezeAt, CABINET_H_W_M2K, PACK_START_C } from "../physics/conditioning";
import { placementSplit } from "../physics/placement";
import { PACK_KIND_LABELS } from "../schemas/templates";
import type { UnitPrefs } from "../units";
import { kit } from "./view-kit";

/** How long each pack line needs in its cabinet (s): null for dry ice, a cabinet too warm to freeze it, or over 14 days. */
export function conditioningTimes(packs: HoldParsed["packs"]): (number | null)[] {
  return packs.map((p) => (p.pack.kind === "dry_ice" ? null : conditioningTime_s(p.pack, p.conditioning_C)));
}

/** The packs of a line where the model puts them, e.g. "2 on top, 1 underneath, 1 at the sides". */
export function placedAs(placement: HoldParsed["packs"][number]["placement"], count: number): string {
  const s = placementSplit(placement, count);
  return [s.top ? `${s.top} on top` : "", s.bottom ? `${s.bottom} underneath` : "", s.side ? `${s.side} at the sides` : ""].filter(Boolean).join(", ");
}

export interface PackOutSheet {
  box: string;
  packColumns: string[];
  packRows: string[][];
  conditioningNote: string;
  /** "lid 40 mm · walls 40 mm" for the diagram. */
  wallsLabel: string;
  loadLabel: string;
  /** Null while the hold is still being worked out. */
  hold: string | null;
  /** Set while only the central estimate is in (the range still to come). */
  holdPending: boolean;
  limits: string;
  reminder: string;
  route: string;
  dryIce: boolean;
  cautions: string[];
  signOff: string[];
}

/**
 * `result`: the hold planner's answer for `input` (null while it is worked out; `rangeKnown` false while
 * only the central run is in); `times_s`: conditioningTimes(input.packs), null while they are worked out,
 * "failed" when the solver refused.
 */
export function packOutSheet(input: HoldParsed, result: HoldResult | null, rangeKnown: boolean, times_s: (number | null)[] | null | "failed", units: UnitPrefs): PackOutSheet {
  const k = kit(units);
  const s = input.shipper;
  const thick = (ls: { thickness_m: number }[]) => ls.reduce((a, l) => a + l.thickness_m, 0);
  const wall_m = thick(s.wallLayers);
  const lid_m = thick(s.lidLayers ?? s.wallLayers);
  const dryIce_kg = input.packs.filter((p) => p.pack.kind === "dry_ice").reduce((a, p) => a + p.pack.mass_kg * p.count, 0);
  const dryIce = dryIce_kg > 0;
  const conditionFor = (p: HoldParsed["packs"][number], i: number): string => {
    if (p.pack.kind === "dry_ice") return "—";
    if (p.conditioning_C <= p.pack.phaseChange_C && !canFreezeAt(p.pack, p.conditioning_C)) return "a cabinet this warm cannot freeze it through: use a colder one";
    if (!times_s) return "working it out…";
    if (times_s === "failed") return "could not be worked out: check the pack's properties";
    const t = times_s[i];
    return t === null ? "over 14 days: check the cabinet" : k.dur(t);
  };
  let hold: string | null = null;
  if (result) {
    const simulated = result.routeLength_s * (1 + input.extendFraction);
    const band = (x: number | null) => (x === null ? `more than ${k.dur(simulated)}` : k.dur(x));
    const range = rangeKnown ? ` (range ${band(result.band.low)} to ${band(result.band.high)})` : "";
    const ff = result.failsFirst ? `; first to leave its band: ${result.failsFirst.product} (${result.failsFirst.point})` : "";
    hold = `Estimated hold ${band(result.band.central)}${range} against a route of ${k.dur(result.routeLength_s)}${ff}.`;
  }
  const r = input.ruleSet;
  return {
    box: `${s.name}: inside ${k.length(s.innerLength_m)} × ${k.length(s.innerWidth_m)} × ${k.length(s.innerHeight_m)}; walls ${s.wallLayers.map((l) => `${k.length(l.thickness_m)} ${l.material}`).join(" + ")}${s.lidLayers ? `; lid ${s.lidLayers.map((l) => `${k.length(l.thickness_m)} ${l.material}`).join(" + ")}` : ""}.`,
    packColumns: ["Pack", "Kind", "Count", "Conditioned at", "Condition for at least", "Placed"],
    packRows: input.packs.map((p, i) => [
      p.pack.name,
      PACK_KIND_LABELS[p.pack.kind],
      String(p.count),
      p.pack.kind === "dry_ice" ? "as delivered" : k.temp(p.conditioning_C),
      conditionFor(p, i),
      placedAs(p.placement, p.count) + (p.contactWith === "none" ? ", kept apart from the load" : ""),
    ]),
    conditioningNote: k.text(`Conditioning times: from ${PACK_START_C} °C in still cabinet air at the conditioning temperature (${CABINET_H_W_M2K} W/(m²·K), common practice) until the centre is within 1 K of it, and frozen through where it is meant to start frozen.`),
    wallsLabel: `lid ${k.length(lid_m)} · walls ${k.length(wall_m)}`,
    loadLabel: input.products.map((p) => `${p.count} × ${p.product.name}`).join(", "),
    hold,
    holdPending: !!result && !rangeKnown,
    limits: `Limits from “${r.name}”: chilled at most ${k.temp(r.chilledMax_C)}, frozen at most ${k.temp(r.frozenMax_C)}, hot at least ${k.temp(r.hotHoldMin_C)}.`,
    reminder: k.text(r.reminder),
    route: `route “${input.route.name}”${result ? ` (${k.dur(result.routeLength_s)})` : ""}, rule set “${r.name}”`,
    dryIce,
    cautions: dryIce
      ? [`Net mass of dry ice in this package: ${k.mass(dryIce_kg)} — mark it with UN 1845 and this mass when shipping; do not tape the box airtight.`, "In closed vans and cold rooms, carbon dioxide from dry ice can build up: ventilate before reaching in."]
      : [],
    signOff: [
      "Packed by: ______________________________   Date and time: ______________________",
      `Pack temperatures from the freezer (${k.tUnit}): ________________________________________`,
      `Product probe readings when packed (${k.tUnit}): _____________________________________`,
      `Probe readings on arrival (${k.tUnit}): ______________________________   Checked by: ____________`,
    ],
  };
}
