/**
 * Runs a calculation on untrusted input: validates with the zod schema, then computes. Bad input
 * comes back as field errors; a physics input error (valid shape, impossible value) names its field.
 */
import type { z } from "zod";
import { fieldErrorsOf, type FieldErrors } from "./errors";
import { PhysicsInputError } from "../physics/validation";

export type RunResult<T> = { ok: true; result: T } | { ok: false; fieldErrors: FieldErrors };

export function runValidated<S extends z.ZodType, T>(schema: S, input: unknown, compute: (parsed: z.output<S>) => T): RunResult<T> {
  const parsed = schema.safeParse(input);
  if (!parsed.success) return { ok: false, fieldErrors: fieldErrorsOf(parsed.error) };
  try {
    return { ok: true, result: compute(parsed.data) };
  } catch (e) {
    if (e instanceof PhysicsInputError) return { ok: false, fieldErrors: { [e.field]: [e.message] } };
    throw e;
  }
}
