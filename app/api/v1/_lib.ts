import "server-only";
import { NextResponse } from "next/server";
import type { FieldErrors } from "@/lib/schemas/errors";
import { getDb } from "@/app/_server/db";
import { runCalculation } from "@/app/_server/calc-pool";
import { resolvePlannerInput } from "@/lib/db/resolve";
import type { PlannerKind } from "@/lib/planners/registry";

/** The largest request body the API reads: 1 MiB (a full library export is a few tens of kB). */
export const MAX_BODY_BYTES = 1024 * 1024;

export function unprocessable(message: string, fieldErrors: FieldErrors = {}) {
  return NextResponse.json({ error: message, fieldErrors }, { status: 422 });
}

export function notFound(message: string) {
  return NextResponse.json({ error: message }, { status: 404 });
}

function tooLarge() {
  const message = `The request body is larger than ${MAX_BODY_BYTES / 1024} KiB; send less (split a library import, name templates instead of spelling them out)`;
  return NextResponse.json({ error: message, fieldErrors: { "": [message] } }, { status: 413 });
}

/**
 * Reads a JSON body of at most MAX_BODY_BYTES (413 beyond, counted while reading, so a body without a
 * length cannot slip past); a body that is not JSON is a 422 with a clear message, never a crash. A
 * leading byte-order mark is accepted.
 */
export async function readJson(req: Request): Promise<{ ok: true; body: unknown } | { ok: false; response: NextResponse }> {
  const declared = Number(req.headers.get("content-length"));
  if (Number.isFinite(declared) && declared > MAX_BODY_BYTES) return { ok: false, response: tooLarge() };
  const chunks: Uint8Array[] = [];
  let size = 0;
  try {
    if (req.body) {
      const reader = req.body.getReader();
      for (;;) {
        const { done, value } = await reader.read();
        if (done) break;
        size += value.byteLength;
        if (size > MAX_BODY_BYTES) {
          await reader.cancel().catch(() => {});
          return { ok: false, response: tooLarge() };
        }
        chunks.push(value);
      }
    }
  } catch {
    return { ok: false, response: unprocessable("The request body could not be read", { "": ["The request body could not be read"] }) };
  }
  try {
    const text = new TextDecoder("utf-8", { fatal: true }).decode(Buffer.concat(chunks));
    return { ok: true, body: JSON.parse(text.replace(/^\uFEFF/, "")) };
  } catch {
    return { ok: false, response: unprocessable("The request body is not valid JSON", { "": ["The request body is not valid JSON"] }) };
  }
}

/**
 * POST /api/v1/<planner>: read JSON, check its shape and counts, copy in named templates (as the planner's
 * registry entry says), then check with its zod schema and compute in the worker pool (off the request
 * thread, with a time limit). Bad input is a 422 with field errors; a physics input error names its field;
 * a busy pool is a 503.
 */
export async function runPlannerRequest(kind: PlannerKind, req: Request): Promise<NextResponse> {
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const resolved = await resolvePlannerInput(await getDb(), kind, body.body);
  if (!resolved.ok) return unprocessable("Some fields are not valid", resolved.fieldErrors);
  const r = await runCalculation(kind, resolved.value);
  if (r.ok) return new NextResponse(r.json, { headers: { "content-type": "application/json" } });
  const headers: Record<string, string> = "retryAfter_s" in r ? { "Retry-After": String(r.retryAfter_s) } : {};
  return NextResponse.json({ error: r.message, fieldErrors: r.fieldErrors }, { status: r.status, headers });
}
