/**
 * "Use what was measured": a hold plan's box saved again as a new template carrying the factors fitted from
 * a logged trip and where they came from (the log's name and date, each factor with its 95 % interval).
 * The hold planner applies a calibrated box's factors and draws its uncertainty band from the intervals
 * (lib/schemas/hold.ts effectiveHoldCalibration, lib/physics/hold.ts calibratedCorners).
 */
import type { CalibrationResult } from "../physics/calibrate";
import type { BoxCalibration, Shipper } from "../schemas/templates";
import { HOLD_FACTORS } from "../schemas/calibrate";

/** The longest template name (lib/schemas/templates.ts). */
const MAX_NAME = 120;

/** The date a calibration is known by: the log's first reading, else the day it was fitted (YYYY-MM-DD). */
export function calibrationDate(r: Pick<CalibrationResult, "log">, fittedOn: Date): string {
  return (r.log.start ?? fittedOn.toISOString()).slice(0, 10);
}

/** "Quillfield thin foam cooler — calibrated logger-trip.csv 2026-07-14", cut to fit a template name. */
export function calibratedBoxName(box: string, logName: string, date: string): string {
  const tail = ` — calibrated ${logName} ${date}`;
  if (box.length + tail.length <= MAX_NAME) return box + tail;
  const t = tail.length > MAX_NAME / 2 ? ` — calibrated ${date}` : tail;
  return box.slice(0, MAX_NAME - t.length - 1).trimEnd() + "…" + t;
}

/**
 * The box of a hold calibration as a new template: the same construction, a new name, and the fit's
 * provenance. Null when the log identified no factor (a box "calibrated" at 1 would claim what the log
 * could not tell).
 */
export function calibratedShipper(box: Shipper, r: CalibrationResult, opts: { name?: string; fittedOn: Date }): Shipper | null {
  if (r.planner !== "hold") return null;
  const fitted = r.factors.filter((f) => f.identifiable && f.low !== null && f.high !== null);
  if (!fitted.length) return null;
  const date = calibrationDate(r, opts.fittedOn);
  const factors: BoxCalibration["factors"] = {};
  for (const n of HOLD_FACTORS) {
    const f = r.factors.find((x) => x.name === n);
    if (f) factors[n] = { value: f.value, low: f.identifiable ? f.low : null, high: f.identifiable ? f.high : null };
  }
  const source = `${r.log.name}${r.log.start ? `, logged ${r.log.start.slice(0, 16).replace("T", " ")}` : `, fitted ${date}`}`;
  const notes = [
    box.notes,
    `Calibrated from ${source}: ${fitted.map((f) => `${f.label.toLowerCase()} ${f.value.toPrecision(3)} (95 % ${f.low!.toPrecision(3)}–${f.high!.toPrecision(3)})`).join("; ")}; RMS ${r.rms_K.toFixed(2)} K, largest residual ${r.maxResidual_K.toFixed(2)} K.`,
  ]
    .filter(Boolean)
    .join("\n")
    .slice(0, 4000);
  return {
    ...box,
    name: opts.name?.trim() || calibratedBoxName(box.name, r.log.name, date),
    notes,
    calibration: { source, logName: r.log.name, logStart: r.log.start, factors, rms_K: r.rms_K, maxResidual_K: r.maxResidual_K },
  };
}
