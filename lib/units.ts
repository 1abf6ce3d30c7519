/**
 * Unit conversion at the edges (UI, CLI). Everything inside Holdline is SI;
 * these helpers turn SI values into the units a person chose and back.
 * Conversion factors are exact by definition (NIST SP 811, Appendix B):
 * 1 lb = 0.45359237 kg, 1 in = 0.0254 m, T_F = T_C × 9/5 + 32.
 */

export type TemperatureUnit = "C" | "F";
export type MassUnit = "kg" | "lb";
export type LengthUnit = "mm" | "in";

export interface UnitPrefs {
  temperatureUnit: TemperatureUnit;
  massUnit: MassUnit;
  lengthUnit: LengthUnit;
}

export const DEFAULT_UNIT_PREFS: UnitPrefs = { temperatureUnit: "C", massUnit: "kg", lengthUnit: "mm" };

/** What a number measures; decides how it is shown. SI storage unit in brackets. */
export type Quantity =
  | "temperature" // [°C]
  | "temperatureDifference" // [K], shown in K or °F (a difference: no offset)
  | "mass" // [kg]
  | "length" // [m]
  | "duration" // [s], shown in h
  | "shortDuration" // [s], shown in min
  | "seconds" // [s], shown in s
  | "speed" // [m/s]
  | "irradiance" // [W/m²]
  | "conductivity" // [W/(m·K)]
  | "density" // [kg/m³]
  | "specificHeat" // [J/(kg·K)], shown in kJ/(kg·K)
  | "latentHeat" // [J/kg], shown in kJ/kg
  | "fraction" // [-], a mass fraction
  | "ratio" // [-], e.g. emissivity
  | "count" // [-]
  | "volume" // [m³], shown in L
  | "conductance" // [W/(m²·K)]
  | "money"; // [currency units]

const LB_KG = 0.45359237;
const IN_M = 0.0254;

export function unitLabel(q: Quantity, p: UnitPrefs): string {
  switch (q) {
    case "temperature":
      return p.temperatureUnit === "C" ? "°C" : "°F";
    case "temperatureDifference":
      return p.temperatureUnit === "C" ? "K" : "°F";
    case "mass":
      return p.massUnit;
    case "length":
      return p.lengthUnit;
    case "duration":
      return "h";
    case "shortDuration":
      return "min";
    case "seconds":
      return "s";
    case "speed":
      return "m/s";
    case "irradiance":
      return "W/m²";
    case "conductivity":
      return "W/(m·K)";
    case "density":
      return "kg/m³";
    case "specificHeat":
      return "kJ/(kg·K)";
    case "latentHeat":
      return "kJ/kg";
    case "fraction":
      return "mass fraction";
    case "ratio":
      return "";
    case "count":
      return "";
    case "volume":
      return "L";
    case "conductance":
      return "W/(m²·K)";
    case "money":
      return "cost units";
  }
}

/** SI value → value in the chosen display unit. */
export function toDisplay(q: Quantity, si: number, p: UnitPrefs): number {
  switch (q) {
    case "temperature":
      return p.temperatureUnit === "C" ? si : (si * 9) / 5 + 32;
    case "temperatureDifference":
      return p.temperatureUnit === "C" ? si : (si * 9) / 5;
    case "mass":
      return p.massUnit === "kg" ? si : si / LB_KG;
    case "length":
      return p.lengthUnit === "mm" ? si * 1000 : si / IN_M;
    case "duration":
      return si / 3600;
    case "shortDuration":
      return si / 60;
    case "specificHeat":
    case "latentHeat":
      return si / 1000;
    case "volume":
      return si * 1000;
    default:
      return si;
  }
}

/** Display value → SI value (inverse of toDisplay). */
export function fromDisplay(q: Quantity, shown: number, p: UnitPrefs): number {
  switch (q) {
    case "temperature":
      return p.temperatureUnit === "C" ? shown : ((shown - 32) * 5) / 9;
    case "temperatureDifference":
      return p.temperatureUnit === "C" ? shown : (shown * 5) / 9;
    case "mass":
      return p.massUnit === "kg" ? shown : shown * LB_KG;
    case "length":
      return p.lengthUnit === "mm" ? shown / 1000 : shown * IN_M;
    case "duration":
      return shown * 3600;
    case "shortDuration":
      return shown * 60;
    case "specificHeat":
    case "latentHeat":
      return shown * 1000;
    case "volume":
      return shown / 1000;
    default:
      return shown;
  }
}

/** Rounds for display without trailing noise: up to `digits` significant figures. */
export function roundForDisplay(x: number, digits = 4): number {
  if (!Number.isFinite(x) || x === 0) return 0;
  return Number(x.toPrecision(digits));
}

/** "12.5 °C", "3.2 kg" … */
export function formatQuantity(q: Quantity, si: number | null | undefined, p: UnitPrefs, digits = 4): string {
  if (si === null || si === undefined || !Number.isFinite(si)) return "—";
  const label = unitLabel(q, p);
  const v = roundForDisplay(toDisplay(q, si, p), digits);
  return label ? `${v} ${label}` : `${v}`;
}

const NUM = String.raw`[−-]?\d+(?:\.\d+)?`;
const TEMP_RE = new RegExp(String.raw`(${NUM})(?:(\s?(?:–|to|and)\s?)(${NUM}))?\s?°C`, "g");
/** A temperature difference: "±1 K", "0.5 K", "(plus 0.5 K)", never the K of a unit such as W/(m²·K) (no digit before it). */
const DIFF_RE = new RegExp(String.raw`(±?)(\d+(?:\.\d+)?)\s?K(?![\w/·²])`, "g");
const MM_RE = new RegExp(String.raw`(\d+(?:\.\d+)?)(?:(\s?(?:–|to|and)\s?)(\d+(?:\.\d+)?))?\s?mm\b`, "g");
const KG_RE = new RegExp(String.raw`(\d+(?:\.\d+)?)\s?kg\b(?![/·])`, "g");
const num = (s: string) => Number(s.replace("−", "-"));
const shown = (x: number, digits: number) => String(roundForDisplay(x, digits)).replace(/^-/, "−");

/**
 * Puts a sentence written inside Holdline (an assumption, a warning, a compliance line, all in SI) into the
 * person's units: every "12.5 °C" (and "2–8 °C" ranges), "±1 K" difference, "50 mm" and "2.5 kg" becomes
 * °F, °F difference, in and lb. SI preferences leave the text as it is.
 */
export function localizeText(s: string, p: UnitPrefs): string {
  let out = s;
  if (p.temperatureUnit === "F") {
    out = out
      .replace(TEMP_RE, (_m, a: string, sep: string | undefined, b: string | undefined) =>
        b !== undefined ? `${shown(toDisplay("temperature", num(a), p), 4)}${sep}${shown(toDisplay("temperature", num(b), p), 4)} °F` : `${shown(toDisplay("temperature", num(a), p), 4)} °F`,
      )
      .replace(DIFF_RE, (_m, pm: string, a: string) => `${pm}${shown((num(a) * 9) / 5, 3)} °F`);
  }
  if (p.lengthUnit === "in") {
    out = out.replace(MM_RE, (_m, a: string, sep: string | undefined, b: string | undefined) =>
      b !== undefined ? `${shown(num(a) / 25.4, 3)}${sep}${shown(num(b) / 25.4, 3)} in` : `${shown(num(a) / 25.4, 3)} in`,
    );
  }
  if (p.massUnit === "lb") out = out.replace(KG_RE, (_m, a: string) => `${shown(num(a) / LB_KG, 3)} lb`);
  return out;
}
