import "server-only";
import { NextResponse } from "next/server";
import type { FieldErrors } from "@/lib/schemas/errors";

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
