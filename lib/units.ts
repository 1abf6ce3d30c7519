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
