/**
 * The small pieces every planner's view is made of, in the person's units: temperatures, masses and
 * lengths through lib/units.ts, durations through lib/format.ts, SI sentences through localizeText.
 * One place, so a hold, a thaw and a cooling say "134.6 °F" the same way.
 */
import type { ComplianceLine } from "../physics/compliance";
import { formatQuantity, localizeText, roundForDisplay, toDisplay, unitLabel, type UnitPrefs } from "../units";
import { formatDuration } from "../format";
import type { ChartSpec } from "./types";

/** Line colours of the charts: distinct hues, readable on white and in greyscale print. */
export const PALETTE = ["#235a6b", "#b4641e", "#5a7d2a", "#7b4b94", "#9a3b3b", "#2f6fb0"];

export function kit(u: UnitPrefs) {
  const tUnit = unitLabel("temperature", u);
  return {
    u,
    tUnit,
    /** A temperature for a chart: display units, 5 significant figures. */
    T: (x: number) => roundForDisplay(toDisplay("temperature", x, u), 5),
    temp: (x: number | null | undefined) => formatQuantity("temperature", x, u),
    mass: (x: number | null | undefined) => formatQuantity("mass", x, u),
    length: (x: number | null | undefined) => formatQuantity("length", x, u),
    dur: formatDuration,
    text: (s: string) => localizeText(s, u),
    texts: (xs: string[]) => xs.map((s) => localizeText(s, u)),
    lines: (xs: ComplianceLine[]): ComplianceLine[] => xs.map((c) => ({ ...c, rule: localizeText(c.rule, u), detail: localizeText(c.detail, u) })),
    yTitle: `temperature (${tUnit})`,
  };
}
export type Kit = ReturnType<typeof kit>;

/** Limit lines without repeats, labelled in display units. */
export function limitLines(k: Kit, limits: { T_C: number | null; label: string }[]): ChartSpec["limits"] {
  const out: ChartSpec["limits"] = [];
  for (const l of limits) {
    if (l.T_C === null) continue;
    const y = k.T(l.T_C);
    if (!out.some((x) => x.y === y)) out.push({ y, label: `${l.label} ${roundForDisplay(y, 4)} ${k.tUnit}` });
  }
  return out;
}

/** Every n-th point so a chart or table stays readable (always keeps the last). */
export function thin<T>(xs: T[], max: number): T[] {
  if (xs.length <= max) return xs;
  const step = Math.ceil(xs.length / max);
  const out = xs.filter((_, i) => i % step === 0);
  if (out.at(-1) !== xs.at(-1)) out.push(xs.at(-1)!);
  return out;
}

/** CSV column name for a temperature: "inside_air_C" or "inside_air_F". */
export const tCol = (name: string, u: UnitPrefs) => `${name}_${u.temperatureUnit}`;
export const mCol = (name: string, u: UnitPrefs) => `${name}_${u.massUnit}`;
export const lCol = (name: string, u: UnitPrefs) => `${name}_${u.lengthUnit}`;

/** A number for CSV: display units, rounded to 3 decimals. */
export const csvT = (x: number, u: UnitPrefs) => Math.round(toDisplay("temperature", x, u) * 1000) / 1000;
export const csvM = (x: number, u: UnitPrefs) => Math.round(toDisplay("mass", x, u) * 1000) / 1000;
export const csvL = (x: number, u: UnitPrefs) => Math.round(toDisplay("length", x, u) * 1000) / 1000;
export const round3 = (x: number) => Math.round(x * 1000) / 1000;

/** The blanks every paper record ends with. */
export const SIGNATURE_LINE = "Checked by (initials): ________   Date and time: ____________________";
