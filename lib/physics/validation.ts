/**
 * Shared checks. Non-physical input throws PhysicsInputError (a typed error naming the
 * field); a valid input outside a correlation's range is answered with a warning.
 */
export class PhysicsInputError extends Error {
  readonly field: string;
  constructor(field: string, message: string) {
    super(`${field}: ${message}`);
    this.name = "PhysicsInputError";
    this.field = field;
  }
}

export const ABSOLUTE_ZERO_C = -273.15;
/** 0 °C in kelvin, exact (BIPM SI Brochure, 9th ed.). */
export const KELVIN_OFFSET = 273.15;

export function requirePositive(field: string, x: number): number {
  if (!Number.isFinite(x) || x <= 0) throw new PhysicsInputError(field, `must be a finite number greater than zero (got ${x})`);
  return x;
}

export function requireNonNegative(field: string, x: number): number {
  if (!Number.isFinite(x) || x < 0) throw new PhysicsInputError(field, `must be a finite number, zero or more (got ${x})`);
  return x;
}

export function requireTemperature(field: string, T_C: number): number {
  if (!Number.isFinite(T_C)) throw new PhysicsInputError(field, `must be a finite temperature (got ${T_C})`);
  if (T_C < ABSOLUTE_ZERO_C) throw new PhysicsInputError(field, `cannot be below absolute zero, −273.15 °C (got ${T_C} °C)`);
  return T_C;
}

export function requireFraction(field: string, x: number): number {
  if (!Number.isFinite(x) || x < 0 || x > 1) throw new PhysicsInputError(field, `must be between 0 and 1 (got ${x})`);
  return x;
}

/** A result with the warnings raised while computing it. */
export interface Warned<T> {
  value: T;
  warnings: string[];
}

/** Adds a range warning once. */
export function warnRange(warnings: string[], what: string, value: number, lo: number, hi: number, unit: string, source: string): void {
  if (value < lo || value > hi) {
    const msg = `${what} = ${fmt(value)} ${unit} is outside the range ${fmt(lo)}–${fmt(hi)} ${unit} of ${source}; result extrapolated`;
    if (!warnings.includes(msg)) warnings.push(msg);
  }
}

function fmt(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  return a !== 0 && (a >= 1e5 || a < 1e-3) ? x.toExponential(2) : String(Number(x.toPrecision(4)));
}
