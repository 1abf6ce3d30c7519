import "server-only";
import { NextResponse } from "next/server";
import type { z } from "zod";
import { fieldErrorsOf, type FieldErrors } from "@/lib/schemas/errors";
import { PhysicsInputError } from "@/lib/physics/validation";
import type { Db } from "@/lib/db/client";
import { getDb } from "@/app/_server/db";

export function unprocessable(message: string, fieldErrors: FieldErrors = {}) {
  return NextResponse.json({ error: message, fieldErrors }, { status: 422 });
}

/** Reads a JSON body; a body that is not JSON is a 422 with a clear message, never a crash. */
export async function readJson(req: Request): Promise<{ ok: true; body: unknown } | { ok: false; response: NextResponse }> {
  try {
    const text = await req.text();
    return { ok: true, body: JSON.parse(text) };
  } catch {
    return { ok: false, response: unprocessable("The request body is not valid JSON", { "": ["The request body is not valid JSON"] }) };
  }
}

export function notFound(message: string) {
  return NextResponse.json({ error: message }, { status: 404 });
}

/**
 * A POST handler for a calculation: read JSON, copy in named templates, check with the zod schema,
 * compute. Bad input is a 422 with field errors; a physics input error names its field.
 */
export function calculationRoute<S extends z.ZodType, T>(
  resolve: (db: Db, body: unknown) => Promise<{ ok: true; value: unknown } | { ok: false; fieldErrors: FieldErrors }>,
  schema: S,
  compute: (input: z.output<S>) => T | Promise<T>,
) {
  return async function POST(req: Request) {
    const body = await readJson(req);
    if (!body.ok) return body.response;
    const resolved = await resolve(await getDb(), body.body);
    if (!resolved.ok) return unprocessable("Some fields are not valid", resolved.fieldErrors);
    const parsed = schema.safeParse(resolved.value);
    if (!parsed.success) return unprocessable("Some fields are not valid", fieldErrorsOf(parsed.error));
    try {
      return NextResponse.json(await compute(parsed.data));
    } catch (e) {
      if (e instanceof PhysicsInputError) return unprocessable(e.message, { [e.field]: [e.message] });
      throw e;
    }
  };
}
