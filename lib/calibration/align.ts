/**
 * Plan against log: a logger's readings set beside a hold or thaw plan's curves, aligned at the plan's
 * start, with the residual (logged − modelled) of every channel and the largest gap.
 */
import { interpolateAt } from "../physics/numerics";
import type { HoldResult } from "../physics/hold";
import type { ThawResult } from "../physics/thaw";
import type { HoldParsed } from "../schemas/hold";
import type { ChannelRole, LogChannel } from "../schemas/calibrate";
import { PhysicsInputError } from "../physics/validation";
import { parseLogDateTime, type ParsedLog } from "./log-csv";

export interface ChannelComparison {
  label: string;
  role: ChannelRole;
  line: number;
  point: "centre" | "surface";
  /** What the channel is compared with, in words ("inside air", "Roast chicken … centre"). */
  comparedWith: string;
  /** Plan time of each compared reading (s from the plan's start). */
  t_s: number[];
  log_C: number[];
  model_C: number[];
  /** Logged minus modelled, K. */
  residual_K: number[];
  rms_K: number;
  maxAbs_K: number;
  /** Plan time of the largest gap. */
  maxAt_s: number;
  /** Readings left out: before the plan's start, after the model's end, or empty cells. */
  leftOut: number;
}

export interface LogComparison {
  /** Seconds on the log's clock (after its first reading) where the plan starts. */
  planStart_s: number;
  channels: ChannelComparison[];
  /** Over every compared reading of every channel (null when none was compared). */
  rms_K: number | null;
  maxResidual_K: number | null;
  maxResidualAt: { label: string; t_s: number } | null;
  warnings: string[];
}

/** A curve to compare with: times and temperatures. */
export interface Curve {
  t_s: ArrayLike<number>;
  T_C: ArrayLike<number>;
}

/**
 * The log's clock time (s after its first reading) where the plan starts: null → the first reading; a number
 * → that many seconds after it; an ISO date-time → that moment (only for a log with date-times).
 */
export function resolvePlanStart(log: ParsedLog, planStart: string | number | null): number {
  if (planStart === null) return 0;
  if (typeof planStart === "number") return planStart;
  if (log.start_ms === null) throw new PhysicsInputError("planStart", "the log counts elapsed time, not dates: give the plan's start as seconds after the first reading");
  const ms = parseLogDateTime(planStart, "iso");
  if (ms === null) throw new PhysicsInputError("planStart", `"${planStart}" is not an ISO date-time`);
  const s = (ms - log.start_ms) / 1000;
  const end = log.t_s[log.t_s.length - 1];
  if (s < 0 || s >= end) throw new PhysicsInputError("planStart", `the plan's start ${planStart} is outside the log (${log.start} plus ${(end / 3600).toFixed(2)} h)`);
  return s;
}

/** Linear interpolation of a curve at t (null outside it). */
export function interpolate(c: Curve, t: number): number | null {
  return interpolateAt(c.t_s, c.T_C, t, false);
}

/** Outside air of a route as a step curve (each segment's air temperature over its length). */
function routeAirCurve(route: HoldParsed["route"]): Curve {
  const t: number[] = [];
  const T: number[] = [];
  let t0 = 0;
  for (const s of route.segments) {
    t.push(t0, t0 + s.duration_s - 1e-6);
    T.push(s.airTemp_C, s.airTemp_C);
    t0 += s.duration_s;
  }
  return { t_s: t, T_C: T };
}

/** Which modelled curve a hold plan's channel is compared with, or a message saying why none is. */
export function holdCurve(inp: HoldParsed, r: HoldResult, ch: LogChannel, field: string): { curve: Curve; what: string; extends: boolean } {
  const t = r.series.map((p) => p.t_s);
  switch (ch.role) {
    case "inside_air":
      return { curve: { t_s: t, T_C: r.series.map((p) => p.air_C) }, what: "the modelled inside air (mean of its two halves)", extends: false };
    case "product": {
      if (ch.line >= inp.products.length) throw new PhysicsInputError(`${field}.line`, `the plan has no product line ${ch.line + 1}`);
      const pick = (p: HoldResult["series"][number]) => (ch.point === "centre" ? p.products[ch.line].center_C : p.products[ch.line].surface_C);
      return { curve: { t_s: t, T_C: r.series.map(pick) }, what: `${inp.products[ch.line].product.name}, ${ch.point}`, extends: false };
    }
    case "pack":
      if (ch.line >= inp.packs.length) throw new PhysicsInputError(`${field}.line`, `the plan has no pack line ${ch.line + 1}`);
      return { curve: { t_s: t, T_C: r.series.map((p) => p.packs[ch.line].T_C) }, what: `${inp.packs[ch.line].pack.name} (surface)`, extends: false };
    case "outside_air":
      return { curve: routeAirCurve(inp.route), what: "the route's air temperature", extends: true };
  }
}

/** Which modelled curve a thaw plan's channel is compared with. */
export function thawCurve(r: ThawResult, ch: LogChannel, field: string): { curve: Curve; what: string; extends: boolean } {
  const t = r.series.map((p) => p.t_s);
  if (ch.role === "product") {
    if (ch.line !== 0) throw new PhysicsInputError(`${field}.line`, "a thaw plan has one product: line 0");
    return { curve: { t_s: t, T_C: r.series.map((p) => (ch.point === "centre" ? p.center_C : p.surface_C)) }, what: `the item's ${ch.point}`, extends: false };
  }
  if (ch.role === "outside_air" || ch.role === "inside_air") {
    const s = r.settings;
    const medium = "air_C" in s ? s.air_C : s.water_C;
    return { curve: { t_s: [0, t[t.length - 1]], T_C: [medium, medium] }, what: `the method's ${"air_C" in s ? "air" : "water"} temperature`, extends: false };
  }
  throw new PhysicsInputError(`${field}.role`, "a thaw plan has no coolant pack");
}

/**
 * Sets a log beside modelled curves: each channel's readings at plan time (log time − plan start), the
 * curve interpolated there, the residual, its RMS and largest gap. Readings before the start, after the
 * curve's end, or empty, are left out and counted. `skip` names roles compared with nothing (an
 * outside-air channel that drives the model).
 */
export function compareLog(
  log: ParsedLog,
  planStart_s: number,
  curveOf: (ch: LogChannel, field: string) => { curve: Curve; what: string },
  skip: (ch: LogChannel) => boolean = () => false,
): LogComparison {
  const channels: ChannelComparison[] = [];
  const warnings: string[] = [];
  let ss = 0;
  let n = 0;
  let worst: { label: string; t_s: number; abs: number } | null = null;
  log.series.forEach((s, k) => {
    if (skip(s.channel)) return;
    const { curve, what } = curveOf(s.channel, `format.channels.${k}`);
    const out: ChannelComparison = { label: s.label, role: s.channel.role, line: s.channel.line, point: s.channel.point, comparedWith: what, t_s: [], log_C: [], model_C: [], residual_K: [], rms_K: 0, maxAbs_K: 0, maxAt_s: 0, leftOut: 0 };
    let css = 0;
    for (let i = 0; i < log.t_s.length; i++) {
      const T = s.T_C[i];
      const t = log.t_s[i] - planStart_s;
      const m = T === null || t < -1e-9 ? null : interpolate(curve, t);
      if (T === null || m === null) {
        out.leftOut++;
        continue;
      }
      const r = T - m;
      out.t_s.push(t);
      out.log_C.push(T);
      out.model_C.push(m);
      out.residual_K.push(r);
      css += r * r;
      if (Math.abs(r) >= out.maxAbs_K) {
        out.maxAbs_K = Math.abs(r);
        out.maxAt_s = t;
      }
    }
    if (out.t_s.length) {
      out.rms_K = Math.sqrt(css / out.t_s.length);
      ss += css;
      n += out.t_s.length;
      if (worst === null || out.maxAbs_K > worst.abs) worst = { label: s.label, t_s: out.maxAt_s, abs: out.maxAbs_K };
    } else warnings.push(`"${s.label}": no reading falls within the plan`);
    if (out.leftOut && out.t_s.length) warnings.push(`"${s.label}": ${out.leftOut} reading${out.leftOut === 1 ? "" : "s"} outside the plan's time or empty, left out`);
    channels.push(out);
  });
  const w = worst as { label: string; t_s: number; abs: number } | null;
  return {
    planStart_s,
    channels,
    rms_K: n ? Math.sqrt(ss / n) : null,
    maxResidual_K: w ? w.abs : null,
    maxResidualAt: w ? { label: w.label, t_s: w.t_s } : null,
    warnings,
  };
}

/** A hold plan against a log (the plan's own route air for an outside-air channel). */
export function compareHoldWithLog(inp: HoldParsed, r: HoldResult, log: ParsedLog, planStart_s: number): LogComparison {
  return compareLog(log, planStart_s, (ch, f) => holdCurve(inp, r, ch, f));
}

/** A thaw plan against a log. */
export function compareThawWithLog(r: ThawResult, log: ParsedLog, planStart_s: number): LogComparison {
  return compareLog(log, planStart_s, (ch, f) => thawCurve(r, ch, f));
}
