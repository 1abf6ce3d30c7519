/**
 * `holdline calibrate --plan FILE --log CSV`: the calibrate input built from a plan file (a hold or thaw
 * input, or the `plans show ID --json` of a saved one), the logger's CSV text and a column mapping from the
 * options or the default (lib/calibration/guess-format.ts). The result goes through the registry's path like
 * every other planner input.
 */
import { readFileSync } from "node:fs";
import path from "node:path";
import { guessLogFormat, TIME_CHOICES, type TimeChoice } from "../lib/calibration/guess-format";
import { CliError } from "./errors";

export interface CalibrateArgs {
  plan?: string;
  log?: string;
  planner?: string;
  columns?: string;
  time?: string;
  unit?: string;
  delimiter?: string;
  decimal?: string;
  fit?: string;
}

const oneOf = <T extends string>(what: string, v: string | undefined, allowed: readonly T[]): T | undefined => {
  if (v === undefined) return undefined;
  if (!(allowed as readonly string[]).includes(v)) throw new CliError(`holdline calibrate: --${what} takes ${allowed.join(", ")}, not "${v}"`, 2);
  return v as T;
};

export function calibrateInputFromFiles(a: CalibrateArgs, readJson: (file: string) => unknown): unknown {
  if (!a.plan || !a.log) throw new CliError("holdline calibrate: give both --plan FILE (a hold or thaw input) and --log CSV (the logger's file)", 2);
  const plan = readJson(a.plan);
  let text: string;
  try {
    text = readFileSync(a.log, "utf8");
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new CliError(`holdline calibrate: cannot read ${a.log}: ${code === "ENOENT" ? "no such file" : code === "EISDIR" ? "it is a folder" : (e as Error).message}. Nothing was changed.`);
  }
  const isObj = (x: unknown): x is Record<string, unknown> => typeof x === "object" && x !== null && !Array.isArray(x);
  const planner = oneOf("planner", a.planner, ["hold", "thaw"] as const) ?? (isObj(plan) && "method" in plan ? "thaw" : "hold");
  const delimiter = a.delimiter === "tab" ? "\t" : oneOf("delimiter", a.delimiter, ["auto", ",", ";"] as const);
  const g = guessLogFormat(text, planner, {
    delimiter,
    decimal: oneOf("decimal", a.decimal, [".", ","] as const),
    unit: oneOf("unit", a.unit, ["C", "F"] as const),
    time: oneOf<TimeChoice>("time", a.time, TIME_CHOICES),
    columns: a.columns?.split(","),
  });
  if (!g.ok) throw new CliError(`holdline calibrate: ${a.log}: ${g.message}`);
  return {
    planner,
    plan,
    log: { name: path.basename(a.log), text },
    format: g.format,
    ...(a.fit ? { fit: a.fit.split(",").map((s) => s.trim()) } : {}),
  };
}
