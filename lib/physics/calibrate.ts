/**
 * Calibration from a logged trip: the few physical factors of a hold plan (wall conductance, inside
 * coefficient, pack contact) or a thaw plan (surface coefficient) that make the model follow a data
 * logger's readings, by nonlinear least squares (Levenberg–Marquardt, ml-levenberg-marquardt), each with
 * a confidence interval from the Jacobian at the optimum, and a verdict on whether the log can tell it
 * apart at all.
 *
 * Factors are fitted as their logarithms (they are positive scale factors, and a factor of 2 too high is
 * as wrong as one of 2 too low). At the optimum, with residuals r (n readings) and the Jacobian J of the
 * modelled readings over the p log-factors (central differences), s² = rᵀr/(n − p) and
 * cov = s²(JᵀJ)⁻¹ [batesWatts1988]; the 95 % interval of ln f is ±t·√cov_kk, mapped back through exp.
 * A logger's residuals are serially correlated, which makes that interval too narrow: it is widened by
 * (1 + ρ)/(1 − ρ), ρ the lag-1 autocorrelation of the residuals (effective sample size of an AR(1)
 * series, [bayleyHammersley1946]); with independent errors ρ ≈ 0 and nothing changes.
 * A factor is not identifiable when the logged channels barely respond to it, when its 95 % interval spans
 * more than a factor of 4, or when it is almost perfectly correlated (|r| > 0.98) with another; it is then
 * held at 1 (the model as built) and the rest are refitted, rather than reported at a meaningless value.
 */
import { levenbergMarquardt } from "ml-levenberg-marquardt";
import { EigenvalueDecomposition, Matrix, inverse } from "ml-matrix";
import { calibrateInputSchema, FACTOR_LABELS, type CalibrateInput, type CalibrateParsed, type FactorName, type LogChannel } from "../schemas/calibrate";
import { effectiveHoldCalibration, type HoldParsed } from "../schemas/hold";
import type { ThawParsed } from "../schemas/thaw";
import { runHoldParsed, type HoldResult } from "./hold";
import { runThawParsed, type ThawResult } from "./thaw";
import { PhysicsInputError } from "./validation";
import { describeLogProblems, parseLogCsv, type LogProblem, type ParsedLog } from "../calibration/log-csv";
import { compareLog, holdCurve, interpolate, resolvePlanStart, thawCurve, type LogComparison } from "../calibration/align";

/** A log that cannot be read: every problem with its row and column. */
export class LogFileError extends PhysicsInputError {
  readonly problems: LogProblem[];
  constructor(problems: LogProblem[]) {
    super("log.text", describeLogProblems(problems).join("; "));
    this.name = "LogFileError";
    this.problems = problems;
  }
}

export interface FittedFactor {
  name: FactorName;
  label: string;
  /** The fitted factor; 1 (the model as built) when it is not identifiable. */
  value: number;
  /** 95 % confidence interval; null when not identifiable. */
  low: number | null;
  high: number | null;
  identifiable: boolean;
  /** Why it is not identifiable, or how it was fitted. */
  note: string;
  initial: number;
}

export interface CalibrationResult {
  planner: "hold" | "thaw";
  factors: FittedFactor[];
  /** Over every compared reading at the fitted factors. */
  rms_K: number;
  maxResidual_K: number;
  maxResidualAt: { label: string; t_s: number } | null;
  /** The plan as built (every factor 1) against the log. */
  before: { rms_K: number; maxResidual_K: number };
  /** The fitted plan against the log, channel by channel (for the chart). */
  comparison: LogComparison;
  /** The plan as built against the log, channel by channel. */
  comparisonBefore: LogComparison;
  /** Residual standard deviation s, K, and the widening of the intervals for serially correlated residuals. */
  noise_K: number;
  serialCorrelation: number;
  intervalWidening: number;
  /** Correlation between the fitted factors' estimates (identifiable ones, in `factors` order). */
  correlation: number[][];
  readings: number;
  iterations: number;
  modelRuns: number;
  /** The factors as a plan's `calibration` field: paste into a hold or thaw input to plan with what was measured. */
  calibration: Record<string, number | string>;
  log: { name: string; start: string | null; readings: number; duration_s: number };
  warnings: string[];
  assumptions: string[];
}

const LN_MIN = Math.log(0.05);
const LN_MAX = Math.log(20);
/** A factor whose 95 % interval spans more than this ratio (high/low) is reported as not identifiable. */
export const MAX_INTERVAL_RATIO = 4;
/** Estimates this correlated cannot be told apart. */
export const MAX_CORRELATION = 0.98;
/** Below this RMS response (K per unit of ln f) the log does not respond to a factor. */
const MIN_RESPONSE_K = 0.01;
/** The model's step error target during a fit, relative to the planner's (NetworkSpec.errorScale). */
const FIT_ERROR_SCALE = 1 / 8;
/** Relative step of the central differences of the final Jacobian (in ln f). */
const JAC_STEP = 0.1;
/** Inside-air readings this long after a lid opening closes are not fitted (the model's air at an opening depends on its time steps). */
export const AFTER_OPENING_S = 120;

/** Two-sided 95 % Student t quantile for ν degrees of freedom (table values; 1.96 beyond 120). */
export function t95(nu: number): number {
  const table: [number, number][] = [[1, 12.706], [2, 4.303], [3, 3.182], [4, 2.776], [5, 2.571], [6, 2.447], [8, 2.306], [10, 2.228], [15, 2.131], [20, 2.086], [30, 2.042], [60, 2.0], [120, 1.98]];
  if (nu >= 120) return 1.96;
  for (let i = table.length - 1; i >= 0; i--) if (nu >= table[i][0]) return table[i][1];
  return table[0][1];
}

interface Problem {
  names: FactorName[];
  /** The modelled value at every compared reading for the given factors (all of them, in `names` order). */
  model: (factors: number[]) => { values: number[]; extra: ModelExtra };
  /** The logged value at every compared reading. */
  y: number[];
  /** Channel of each reading, for the serial correlation. */
  channelOf: number[];
  compare: (factors: number[]) => LogComparison;
  warnings: string[];
  assumptions: string[];
  calibration: (factors: number[]) => Record<string, number | string>;
}

interface ModelExtra {
  /** Pack lines' latent heat left at the end of the log (hold plans). */
  packLatentLeftAtEnd: number[];
}

export function runCalibration(raw: CalibrateInput): CalibrationResult {
  const parsed = calibrateInputSchema.safeParse(raw);
  if (!parsed.success) throw new PhysicsInputError(parsed.error.issues[0].path.join("."), parsed.error.issues[0].message);
  return runCalibrationParsed(parsed.data);
}

/** Reads the log of a calibrate input (throws LogFileError with rows and columns when it cannot). */
export function readLog(inp: CalibrateParsed): ParsedLog {
  const r = parseLogCsv(inp.log.text, inp.format);
  if (!r.ok) throw new LogFileError(r.problems);
  return r.log;
}

export function runCalibrationParsed(inp: CalibrateParsed): CalibrationResult {
  const log = readLog(inp);
  const planStart_s = resolvePlanStart(log, inp.planStart);
  const source = `${inp.log.name}${log.start ? `, logged ${log.start.slice(0, 16).replace("T", " ")}` : ""}`;
  const pb = inp.planner === "hold" ? holdProblem(inp.plan, inp.fit, inp.useLoggedOutsideAir, log, planStart_s, source) : thawProblem(inp.plan, log, planStart_s, source);
  const initial = pb.names.map((n) => (inp.initial as Record<string, number>)[n] ?? 1);
  const requested = new Set<FactorName>(inp.fit as FactorName[]);
  return fit(pb, initial, requested, log, inp.log.name);
}

/** Every factor at 1 except those being fitted; x holds the fitted ones' logarithms. */
function expand(all: number[], free: number[], x: number[]): number[] {
  const f = all.slice();
  free.forEach((k, i) => (f[k] = Math.exp(x[i])));
  return f;
}

function fit(pb: Problem, initial: number[], requested: Set<FactorName>, log: ParsedLog, logName: string): CalibrationResult {
  const warnings = [...pb.warnings];
  const p = pb.names.length;
  const n = pb.y.length;
  if (n < 3) throw new PhysicsInputError("log.text", `only ${n} reading${n === 1 ? "" : "s"} of the log fall within the plan: nothing to fit`);
  let runs = 0;
  const cache = new Map<string, number[]>();
  let lastExtra: ModelExtra = { packLatentLeftAtEnd: [] };
  const evalAt = (factors: number[]) => {
    const key = factors.map((f) => f.toPrecision(12)).join(",");
    const hit = cache.get(key);
    if (hit) return hit;
    runs++;
    const m = pb.model(factors);
    lastExtra = m.extra;
    cache.set(key, m.values);
    return m.values;
  };
  const sse = (v: number[]) => v.reduce((a, m, i) => a + (pb.y[i] - m) ** 2, 0);

  const ones = pb.names.map(() => 1);
  const before = evalAt(ones);
  const beforeRes = before.map((m, i) => pb.y[i] - m);
  const beforeStats = { rms_K: Math.sqrt(sse(before) / n), maxResidual_K: Math.max(...beforeRes.map(Math.abs)) };

  // Which factors to fit: those asked for that the log responds to at all (checked at the starting guess).
  const status: { identifiable: boolean; note: string }[] = pb.names.map((name) => ({ identifiable: requested.has(name), note: requested.has(name) ? "" : "not asked for: held at 1" }));
  let free = pb.names.map((_, k) => k).filter((k) => status[k].identifiable);
  const start = pb.names.map((name, k) => (status[k].identifiable ? initial[k] : 1));
  {
    const base = evalAt(start);
    for (const k of free.slice()) {
      const up = start.slice();
      up[k] *= Math.exp(JAC_STEP);
      const v = evalAt(up);
      const resp = Math.sqrt(v.reduce((a, m, i) => a + (m - base[i]) ** 2, 0) / n) / JAC_STEP;
      if (resp < MIN_RESPONSE_K) {
        status[k] = { identifiable: false, note: `not identifiable: the logged channels barely respond to it (${resp.toExponential(1)} K per unit of ln f); held at 1` };
        free = free.filter((j) => j !== k);
      }
    }
  }

  let x = free.map((k) => Math.log(start[k]));
  let iterations = 0;
  let J: Matrix | null = null;
  let res: number[] = [];
  let cov: Matrix | null = null;
  let s2 = 0;
  let rho = 0;
  let widen = 1;
  const all = start.map((v, k) => (free.includes(k) ? v : 1));
  for (let pass = 0; pass < p + 1; pass++) {
    if (free.length) {
      const r = minimise(pb, all, free, x, evalAt);
      x = r.x;
      iterations += r.iterations;
    }
    const f = expand(all, free, x);
    const m = evalAt(f);
    res = m.map((v, i) => pb.y[i] - v);
    if (!free.length) break;
    // Central-difference Jacobian of the modelled readings over ln f at the optimum.
    J = new Matrix(n, free.length);
    free.forEach((k, j) => {
      const up = f.slice();
      const dn = f.slice();
      up[k] = f[k] * Math.exp(JAC_STEP);
      dn[k] = f[k] * Math.exp(-JAC_STEP);
      const a = evalAt(up);
      const b = evalAt(dn);
      for (let i = 0; i < n; i++) J!.set(i, j, (a[i] - b[i]) / (2 * JAC_STEP));
    });
    const dof = Math.max(1, n - free.length);
    s2 = res.reduce((a, r) => a + r * r, 0) / dof;
    rho = lag1(res, pb.channelOf);
    widen = Math.min(100, Math.max(1, (1 + rho) / (1 - rho)));
    const JtJ = J.transpose().mmul(J);
    const eig = new EigenvalueDecomposition(JtJ, { assumeSymmetric: true }).realEigenvalues;
    const cond = Math.max(...eig) / Math.max(Math.min(...eig), 1e-300);
    cov = cond > 1e12 ? null : inverse(JtJ).mul(s2 * widen);
    // The worst factor that cannot be told apart, if any: drop it (held at 1) and refit the rest.
    let drop = -1;
    let why = "";
    const t = t95(dof);
    if (!cov) {
      const col = free.map((_, j) => Math.sqrt(JtJ.get(j, j)));
      drop = col.indexOf(Math.min(...col));
      why = `not identifiable: the log cannot tell it apart from the other factors (JᵀJ near-singular, condition ${cond.toExponential(1)}); held at 1`;
    } else {
      let worstRatio = 0;
      free.forEach((k, j) => {
        const ratio = Math.exp(2 * t * Math.sqrt(Math.max(0, cov!.get(j, j))));
        if (ratio > MAX_INTERVAL_RATIO && ratio > worstRatio) {
          worstRatio = ratio;
          drop = j;
          why = `not identifiable: its 95 % interval would span a factor of ${ratio > 1e3 ? "more than 1000" : ratio.toFixed(1)}; held at 1`;
        }
      });
      if (drop < 0) {
        for (let a = 0; a < free.length && drop < 0; a++)
          for (let b = a + 1; b < free.length && drop < 0; b++) {
            const c = cov.get(a, b) / Math.sqrt(cov.get(a, a) * cov.get(b, b));
            if (Math.abs(c) > MAX_CORRELATION) {
              drop = cov.get(a, a) >= cov.get(b, b) ? a : b;
              const other = free[drop === a ? b : a];
              why = `not identifiable: the log cannot tell it apart from the ${FACTOR_LABELS[pb.names[other]].toLowerCase()} (correlation ${c.toFixed(3)}); held at 1`;
            }
          }
      }
      if (drop < 0) {
        // Pinned at a bound of the search: the data push it outside any plausible value.
        free.forEach((k, j) => {
          if (drop < 0 && (x[j] <= LN_MIN + 1e-6 || x[j] >= LN_MAX - 1e-6)) {
            drop = j;
            why = `not identifiable: the fit runs to the end of the range (${Math.exp(x[j]).toPrecision(2)}), a sign the model is missing something else; held at 1`;
          }
        });
      }
    }
    if (drop < 0) break;
    status[free[drop]] = { identifiable: false, note: why };
    all[free[drop]] = 1;
    free = free.filter((_, j) => j !== drop);
    x = x.filter((_, j) => j !== drop);
    J = null;
    cov = null;
  }

  const f = expand(all, free, x);
  const dof = Math.max(1, n - free.length);
  const t = t95(dof);
  const factors: FittedFactor[] = pb.names.map((name, k) => {
    const j = free.indexOf(k);
    if (j < 0 || !cov) return { name, label: FACTOR_LABELS[name], value: 1, low: null, high: null, identifiable: false, note: status[k].note || "not identifiable; held at 1", initial: initial[k] };
    const sd = Math.sqrt(Math.max(0, cov.get(j, j)));
    return { name, label: FACTOR_LABELS[name], value: f[k], low: Math.exp(x[j] - t * sd), high: Math.exp(x[j] + t * sd), identifiable: true, note: `fitted; 95 % interval from the Jacobian (ln f ± ${t.toFixed(2)}·${sd.toPrecision(2)})`, initial: initial[k] };
  });
  const correlation = cov ? free.map((_, a) => free.map((_, b) => cov!.get(a, b) / Math.sqrt(cov!.get(a, a) * cov!.get(b, b)))) : [];
  for (const fc of factors) if (!fc.identifiable && requested.has(fc.name)) warnings.push(`${fc.label}: ${fc.note}`);
  if (rho > 0.5) warnings.push(`The residuals are strongly serially correlated (lag-1 correlation ${rho.toFixed(2)}): the model misses a systematic part of the log, and the intervals are widened ×${Math.sqrt(widen).toFixed(1)} for it`);
  evalAt(f);
  const left = lastExtra.packLatentLeftAtEnd;
  left.forEach((l, i) => {
    if (l > 0.05) warnings.push(`The log ends before pack line ${i + 1} has melted (${Math.round(l * 100)} % still frozen in the fitted model): how long the packs last is not in the log, so the factors are judged from the melting phase only`);
  });
  const comparison = pb.compare(f);
  const comparisonBefore = pb.compare(ones);
  const maxResidual = Math.max(...res.map(Math.abs));
  return {
    planner: pb.names.includes("surfaceH") ? "thaw" : "hold",
    factors,
    rms_K: Math.sqrt(res.reduce((a, r) => a + r * r, 0) / n),
    maxResidual_K: maxResidual,
    maxResidualAt: comparison.maxResidualAt,
    before: beforeStats,
    comparison,
    comparisonBefore,
    noise_K: Math.sqrt(s2 || res.reduce((a, r) => a + r * r, 0) / dof),
    serialCorrelation: rho,
    intervalWidening: Math.sqrt(widen),
    correlation,
    readings: n,
    iterations,
    modelRuns: runs,
    calibration: pb.calibration(f),
    log: { name: logName, start: log.start, readings: log.t_s.length, duration_s: log.t_s[log.t_s.length - 1] },
    warnings: [...warnings, ...comparison.warnings.filter((w) => !warnings.includes(w))],
    assumptions: [
      ...pb.assumptions,
      "Least squares over every compared reading of every mapped channel, each weighted alike (K); the factors are fitted as logarithms by Levenberg–Marquardt (ml-levenberg-marquardt)",
      `95 % intervals: covariance s²(JᵀJ)⁻¹ at the optimum with a central-difference Jacobian, Student t with ${dof} degrees of freedom, widened for serially correlated residuals (lag-1 correlation ${rho.toFixed(2)}). They assume the model's structure is right; they do not cover an error in the box's dimensions, the packs' state or the load`,
      `A factor is reported as not identifiable, and held at 1, when the log barely responds to it, its interval spans more than a factor of ${MAX_INTERVAL_RATIO}, or it correlates above ${MAX_CORRELATION} with another`,
    ],
  };
}

/**
 * Whether a logged trace is flat: it moves less than 0.5 K, or less than 8 times its reading-to-reading
 * scatter (σ ≈ rms(Δ)/√2, which a slow trend hardly affects; white noise alone spans about 5σ over a log).
 * Returns a description when flat, else null.
 */
export function flatTrace(T: number[]): string | null {
  if (T.length < 2) return "a single reading";
  const range = Math.max(...T) - Math.min(...T);
  let d2 = 0;
  for (let i = 1; i < T.length; i++) d2 += (T[i] - T[i - 1]) ** 2;
  const sigma = Math.sqrt(d2 / (T.length - 1) / 2);
  if (range < 0.5) return `it moves ${range.toFixed(2)} K over the log`;
  if (range < 8 * sigma) return `it moves ${range.toFixed(2)} K over the log, hardly more than its reading-to-reading scatter of ${sigma.toFixed(2)} K`;
  return null;
}

/** Lag-1 autocorrelation of residuals, pooled over channels (pairs within one channel only). */
function lag1(res: number[], channelOf: number[]): number {
  let num = 0;
  let den = 0;
  const mean = res.reduce((a, r) => a + r, 0) / res.length;
  for (let i = 0; i < res.length; i++) {
    den += (res[i] - mean) ** 2;
    if (i > 0 && channelOf[i] === channelOf[i - 1]) num += (res[i] - mean) * (res[i - 1] - mean);
  }
  return den > 0 ? Math.max(-0.99, Math.min(0.99, num / den)) : 0;
}

/**
 * Levenberg–Marquardt on the free log-factors, one library step at a time: ml-levenberg-marquardt stops only
 * on an absolute error threshold or its iteration count, so convergence (relative change of the sum of
 * squares below 10⁻⁶, or steps below 10⁻⁴ in ln f) is judged here, and the damping carried between steps.
 */
function minimise(pb: Problem, all: number[], free: number[], x0: number[], evalAt: (f: number[]) => number[]): { x: number[]; iterations: number } {
  const n = pb.y.length;
  const idx = Array.from({ length: n }, (_, i) => i);
  const sse = (x: number[]) => evalAt(expand(all, free, x)).reduce((a, m, i) => a + (pb.y[i] - m) ** 2, 0);
  let x = x0.slice();
  let err = sse(x);
  let damping = 1e-2;
  let it = 0;
  for (; it < 25; it++) {
    const r = levenbergMarquardt(
      { x: idx, y: pb.y },
      (params) => {
        const v = evalAt(expand(all, free, params));
        return (i) => v[i];
      },
      {
        initialValues: x,
        damping,
        dampingStepUp: 1,
        dampingStepDown: 1,
        gradientDifference: free.map(() => JAC_STEP),
        centralDifference: true,
        minValues: free.map(() => LN_MIN),
        maxValues: free.map(() => LN_MAX),
        maxIterations: 1,
        errorTolerance: 0,
      },
    );
    const xn = r.parameterValues;
    const en = sse(xn);
    const step = Math.max(...xn.map((v, i) => Math.abs(v - x[i])));
    if (en < err) {
      const rel = (err - en) / Math.max(err, 1e-30);
      x = xn;
      err = en;
      damping = Math.max(damping / 9, 1e-7);
      if (rel < 1e-6 || step < 1e-4) break;
    } else {
      // No improvement (the library then hands back the point it started from): damp harder and retry.
      damping = Math.min(damping * 11, 1e7);
      if (damping >= 1e7) break;
    }
  }
  return { x, iterations: it + 1 };
}

/** Runs a planner; an input error it finds names its field under `plan.` of the calibrate input. */
function inPlan<T>(run: () => T): T {
  try {
    return run();
  } catch (e) {
    if (e instanceof PhysicsInputError) {
      const prefix = `${e.field}: `;
      throw new PhysicsInputError(`plan.${e.field}`, e.message.startsWith(prefix) ? e.message.slice(prefix.length) : e.message);
    }
    throw e;
  }
}

// ---------------------------------------------------------------- hold plans

/**
 * A route whose air temperatures are the logged outside air: the log's readings over the plan averaged into
 * at most 100 equal blocks (the route's limit), each block keeping the air speed and sun of the route at its
 * middle and the route's lid openings that fall in it.
 */
export function routeFromOutsideAir(route: HoldParsed["route"], t_s: number[], T_C: number[], end_s: number): HoldParsed["route"] {
  const blocks = Math.max(1, Math.min(100, t_s.length - 1));
  const len = end_s / blocks;
  const routeEnd = route.segments.reduce((a, s) => a + s.duration_s, 0);
  const segAt = (t: number) => {
    let t0 = 0;
    for (const s of route.segments) {
      if (t < t0 + s.duration_s) return s;
      t0 += s.duration_s;
    }
    return route.segments[route.segments.length - 1];
  };
  // The route's opening times (the middle of each), to place them in the new blocks.
  const openings: { t: number; d: number }[] = [];
  let t0 = 0;
  for (const s of route.segments) {
    for (let k = 0; k < s.lidOpenings; k++) openings.push({ t: t0 + ((k + 0.5) * s.duration_s) / s.lidOpenings, d: s.lidOpenDuration_s });
    t0 += s.duration_s;
  }
  const curve = { t_s, T_C };
  const segments = [];
  for (let b = 0; b < blocks; b++) {
    const a = b * len;
    const e = (b + 1) * len;
    let sum = 0;
    const k = 8;
    for (let i = 0; i < k; i++) sum += interpolate(curve, a + ((i + 0.5) * (e - a)) / k) ?? T_C[T_C.length - 1];
    const mid = segAt(Math.min((a + e) / 2, routeEnd - 1e-6));
    const ops = openings.filter((o) => o.t >= a && o.t < e);
    segments.push({
      label: `Logged air ${b + 1}`,
      duration_s: e - a,
      airTemp_C: Math.round((sum / k) * 1000) / 1000,
      airSpeed_m_s: mid.airSpeed_m_s,
      sun_W_m2: mid.sun_W_m2,
      lidOpenings: ops.length,
      lidOpenDuration_s: ops.length ? Math.max(...ops.map((o) => o.d)) : 0,
    });
  }
  return { ...route, name: `${route.name} (logged outside air)`, segments };
}

function holdProblem(plan0: HoldParsed, fitNames: string[], useOutside: boolean, log: ParsedLog, planStart_s: number, source: string): Problem {
  const names: FactorName[] = ["wallConductance", "innerH", "contact"];
  const warnings: string[] = [...log.warnings];
  const assumptions: string[] = [
    `Plan aligned with the log at ${planStart_s.toFixed(0)} s after its first reading`,
    "The wall conductance factor scales the conduction of the walls, lid and edges; an error in the outer surface coefficient or the sun on the route is absorbed into it (a log from inside the box cannot tell them apart), and its interval does not cover that",
  ];
  const logEnd = log.t_s[log.t_s.length - 1] - planStart_s;
  let plan: HoldParsed = { ...plan0, uncertainty: { outerH_frac: 0, insulationK_frac: 0, conditioning_K: 0 }, calibration: undefined };
  const prior = effectiveHoldCalibration(plan0);
  if (prior) warnings.push(`The plan already carries a calibration${prior.source ? ` (${prior.source})` : ""}: it is refitted from 1`);
  const outside = log.series.findIndex((s) => s.channel.role === "outside_air");
  const drives = useOutside && outside >= 0;
  if (drives) {
    const s = log.series[outside];
    const t: number[] = [];
    const T: number[] = [];
    s.T_C.forEach((v, i) => {
      if (v !== null && log.t_s[i] - planStart_s >= -1e-9) {
        t.push(log.t_s[i] - planStart_s);
        T.push(v);
      }
    });
    if (t.length < 2) throw new PhysicsInputError("format.channels", `the outside-air column "${s.label}" has fewer than two readings within the plan`);
    if (t[0] > 0) {
      t.unshift(0);
      T.unshift(T[0]);
    }
    plan = { ...plan, route: routeFromOutsideAir(plan.route, t, T, Math.max(logEnd, t[t.length - 1])) };
    assumptions.push(`The route's air temperatures are replaced by the logged outside air ("${s.label}"), averaged into ${plan.route.segments.length} blocks; air speed, sun and lid openings stay the route's`);
  }
  const routeLen = plan.route.segments.reduce((a, s) => a + s.duration_s, 0);
  // Run the model at least as long as the log (the planner runs the route plus extendFraction of it, at most 3).
  const ext = Math.min(3, Math.max(plan.extendFraction, logEnd / routeLen - 1 + 0.01));
  if (logEnd > routeLen * 4) warnings.push(`The log runs ${(logEnd / 3600).toFixed(1)} h, more than four times the route (${(routeLen / 3600).toFixed(1)} h): readings after ${((routeLen * 4) / 3600).toFixed(1)} h are left out`);
  plan = { ...plan, extendFraction: ext };
  const skip = (ch: LogChannel) => drives && ch.role === "outside_air";
  const withFactors = (f: number[]): HoldParsed => ({ ...plan, calibration: { wallConductance: f[0], innerH: f[1], contact: f[2], source } });
  // A finer step error than the planner's, so that the curve is smooth in the factors its differences are taken over.
  const runAt = (f: number[]) => inPlan(() => runHoldParsed(withFactors(f), { errorScale: FIT_ERROR_SCALE }));
  // The compared readings are fixed once, from the plan as built: a reading is in or out by its time only.
  const first = runAt([1, 1, 1]);
  const cmp0 = compareLog(log, planStart_s, (ch, fld) => holdCurve(plan, first, ch, fld), skip);
  if (!cmp0.channels.length) throw new PhysicsInputError("format.channels", "no channel is compared with the plan: map a column to inside air, a product probe or a pack");
  if (plan.packs.length === 0 && fitNames.includes("contact")) warnings.push("The plan has no packs: the pack contact factor has nothing to act on");
  for (const c of cmp0.channels) {
    const flat = flatTrace(c.log_C);
    if (flat) warnings.push(`"${c.label}" is a flat trace (${flat}): it says little about any factor`);
  }
  // Inside air during and just after a lid opening is not fitted: there the model's air swings within one
  // time step, and a logger's probe lags; the factors are fitted on the rest.
  // The openings where the planner puts them (their starts), each taken as long as the longest the route names.
  const longest = Math.max(0, ...plan.route.segments.map((g) => (g.lidOpenings > 0 ? g.lidOpenDuration_s : 0)));
  const windows: [number, number][] = first.openings_s.map((t0) => [t0, t0 + longest + Math.max(AFTER_OPENING_S, 2 * longest)]);
  const keep = cmp0.channels.map((c) => c.t_s.map((t) => c.role !== "inside_air" || !windows.some(([a, b]) => t >= a && t <= b)));
  const dropped = keep.flat().filter((k) => !k).length;
  if (dropped) assumptions.push(`${dropped} inside-air reading${dropped === 1 ? "" : "s"} during or within ${AFTER_OPENING_S} s after a lid opening ${dropped === 1 ? "is" : "are"} shown but not fitted`);
  const y: number[] = [];
  const channelOf: number[] = [];
  cmp0.channels.forEach((c, k) => c.log_C.forEach((v, i) => keep[k][i] && (y.push(v), channelOf.push(k))));
  const chans = log.series.map((s, k) => ({ s, k })).filter(({ s }) => !skip(s.channel));
  const valuesOf = (r: HoldResult): number[] => {
    const out: number[] = [];
    chans.forEach(({ s, k }, ci) => {
      const { curve } = holdCurve(plan, r, s.channel, `format.channels.${k}`);
      cmp0.channels[ci].t_s.forEach((t, i) => keep[ci][i] && out.push(interpolate(curve, t) ?? curve.T_C[curve.T_C.length - 1]));
    });
    return out;
  };
  const latentAt = (r: HoldResult) => {
    const t = Math.min(logEnd, r.series[r.series.length - 1].t_s);
    const pt = r.series.find((p) => p.t_s >= t) ?? r.series[r.series.length - 1];
    return pt.packs.map((p) => p.latentLeft);
  };
  return {
    names,
    y,
    channelOf,
    model: (f) => {
      const r = runAt(f);
      return { values: valuesOf(r), extra: { packLatentLeftAtEnd: latentAt(r) } };
    },
    compare: (f) => {
      const r = runAt(f);
      return compareLog(log, planStart_s, (ch, fld) => holdCurve(plan, r, ch, fld), skip);
    },
    warnings,
    assumptions,
    calibration: (f) => ({ wallConductance: f[0], innerH: f[1], contact: f[2], source }),
  };
}

// ---------------------------------------------------------------- thaw plans

function thawProblem(plan0: ThawParsed, log: ParsedLog, planStart_s: number, source: string): Problem {
  const warnings: string[] = [...log.warnings];
  const logEnd = log.t_s[log.t_s.length - 1] - planStart_s;
  if (plan0.calibration) warnings.push(`The plan already carries a calibration${plan0.calibration.source ? ` (${plan0.calibration.source})` : ""}: it is refitted from 1`);
  // Run the thaw for the whole log, past the usual end point (the centre reaching thawed stops the planner).
  const plan: ThawParsed = { ...plan0, compare: false, readyBy: null, endPoint_C: 99, horizon_s: Math.min(30 * 86400, Math.max(60, logEnd * 1.01)), calibration: undefined };
  const runAt = (f: number[]): ThawResult => inPlan(() => runThawParsed({ ...plan, calibration: { surfaceH: f[0], source } }));
  log.series.forEach((s, k) => {
    if (s.channel.role === "pack") throw new PhysicsInputError(`format.channels.${k}.role`, "a thaw plan has no coolant pack");
  });
  const first = runAt([1]);
  const skip = (ch: LogChannel) => ch.role !== "product";
  const cmp0 = compareLog(log, planStart_s, (ch, fld) => thawCurve(first, ch, fld), skip);
  if (!cmp0.channels.length) throw new PhysicsInputError("format.channels", "no product channel: map a column to the item's centre or surface probe");
  for (const c of cmp0.channels) {
    const flat = flatTrace(c.log_C);
    if (flat) warnings.push(`"${c.label}" is a flat trace (${flat}): it says little about the surface coefficient`);
  }
  const y: number[] = [];
  const channelOf: number[] = [];
  cmp0.channels.forEach((c, k) => c.log_C.forEach((v) => (y.push(v), channelOf.push(k))));
  const chans = log.series.map((s, k) => ({ s, k })).filter(({ s }) => !skip(s.channel));
  const valuesOf = (r: ThawResult) => {
    const out: number[] = [];
    chans.forEach(({ s, k }, ci) => {
      const { curve } = thawCurve(r, s.channel, `format.channels.${k}`);
      for (const t of cmp0.channels[ci].t_s) out.push(interpolate(curve, t) ?? curve.T_C[curve.T_C.length - 1]);
    });
    return out;
  };
  return {
    names: ["surfaceH"],
    y,
    channelOf,
    model: (f) => ({ values: valuesOf(runAt(f)), extra: { packLatentLeftAtEnd: [] } }),
    compare: (f) => compareLog(log, planStart_s, (ch, fld) => thawCurve(runAt(f), ch, fld), skip),
    warnings,
    assumptions: [`Plan aligned with the log at ${planStart_s.toFixed(0)} s after its first reading; the thaw model runs for the whole log`, "Only product probes are fitted; the medium's temperature is the method's"],
    calibration: (f) => ({ surfaceH: f[0], source }),
  };
}
