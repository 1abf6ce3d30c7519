import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { resolveSizeRefs } from "@/lib/db/resolve";
import { sizeInputSchema } from "@/lib/schemas/size";
import { fieldErrorsOf } from "@/lib/schemas/errors";
import { runSizing, evaluateHere } from "@/lib/physics/sizing";
import { PhysicsInputError } from "@/lib/physics/validation";
import { readJson, unprocessable } from "../_lib";

/** POST /api/v1/size — the pack-out sizer (runs in this server process; the CLI and the page use both cores). */
export async function POST(req: Request) {
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const resolved = await resolveSizeRefs(await getDb(), body.body);
  if (!resolved.ok) return unprocessable("Some fields are not valid", resolved.fieldErrors);
  const parsed = sizeInputSchema.safeParse(resolved.value);
  if (!parsed.success) return unprocessable("Some fields are not valid", fieldErrorsOf(parsed.error));
  try {
    return NextResponse.json(await runSizing(parsed.data, evaluateHere(parsed.data)));
  } catch (e) {
    if (e instanceof PhysicsInputError) return unprocessable(e.message, { [e.field]: [e.message] });
    throw e;
  }
}
