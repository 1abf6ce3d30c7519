/**
 * The calculation worker: runs in a worker thread of the server's pool (app/_server/calc-pool.ts), never
 * on the request thread. It is bundled to dist/calc-worker.mjs by scripts/bundle.mjs, so it must stay
 * free of Next- and Prisma-only imports: the input arrives with its templates already copied in, is
 * checked here with the one zod schema of its kind and computed.
 */
import { fieldErrorsOf, type FieldErrors } from "../../lib/schemas/errors";
import { PhysicsInputError } from "../../lib/physics/validation";
import { holdInputSchema } from "../../lib/schemas/hold";
import { thawInputSchema } from "../../lib/schemas/thaw";
import { warmupInputSchema } from "../../lib/schemas/warmup";
import { sizeInputSchema } from "../../lib/schemas/size";
import { runHoldParsed } from "../../lib/physics/hold";
import { runThawParsed } from "../../lib/physics/thaw";
import { runWarmup } from "../../lib/physics/warmup";
import { runSizing, evaluateHere } from "../../lib/physics/sizing";

export const CALCULATIONS = ["hold", "thaw", "warmup", "size"] as const;
export type Calculation = (typeof CALCULATIONS)[number];

export interface CalcJob {
  kind: Calculation;
  input: unknown;
}

export type CalcAnswer =
  /** The result as JSON text: serialised here, so the request thread only passes a string on. */
  | { ok: true; json: string }
  | { ok: false; status: 422; message: string; fieldErrors: FieldErrors }
  | { ok: false; status: 500; message: string; fieldErrors: FieldErrors };

const JOBS: { [K in Calculation]: (input: unknown) => Promise<CalcAnswer> } = {
  hold: (i) => checked(holdInputSchema, i, runHoldParsed),
  thaw: (i) => checked(thawInputSchema, i, runThawParsed),
  warmup: (i) => checked(warmupInputSchema, i, runWarmup),
  size: (i) => checked(sizeInputSchema, i, (p) => runSizing(p, evaluateHere(p))),
};

async function checked<P, T>(schema: { safeParse(x: unknown): { success: true; data: P } | { success: false; error: import("zod").ZodError } }, input: unknown, compute: (p: P) => T | Promise<T>): Promise<CalcAnswer> {
  const parsed = schema.safeParse(input);
  if (!parsed.success) return { ok: false, status: 422, message: "Some fields are not valid", fieldErrors: fieldErrorsOf(parsed.error) };
  try {
    const result = await compute(parsed.data);
    const bad = nonFinitePath(result);
    if (bad !== null) return { ok: false, status: 500, message: `The model produced a number that is not finite (at ${bad || "the top"}); this is a defect, please report it with the input`, fieldErrors: {} };
    return { ok: true, json: JSON.stringify(result) };
  } catch (e) {
    if (e instanceof PhysicsInputError) return { ok: false, status: 422, message: e.message, fieldErrors: { [e.field]: [e.message] } };
    throw e;
  }
}

/** The path of the first NaN or ±Infinity in a result (JSON would silently turn it into null), else null. */
export function nonFinitePath(x: unknown, path = ""): string | null {
  if (typeof x === "number") return Number.isFinite(x) ? null : path;
  if (Array.isArray(x)) {
    for (let i = 0; i < x.length; i++) {
      const p = nonFinitePath(x[i], `${path}.${i}`);
      if (p !== null) return p;
    }
    return null;
  }
  if (x && typeof x === "object") {
    for (const [k, v] of Object.entries(x)) {
      const p = nonFinitePath(v, path ? `${path}.${k}` : k);
      if (p !== null) return p;
    }
  }
  return null;
}

/** Piscina calls the default export with each job. */
export default function run(job: CalcJob): Promise<CalcAnswer> {
  if (!job || !Object.hasOwn(JOBS, job.kind)) return Promise.resolve({ ok: false, status: 422, message: "Unknown calculation", fieldErrors: {} });
  return JOBS[job.kind](job.input);
}
