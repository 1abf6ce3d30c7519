import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { resolveHoldRefs } from "@/lib/db/resolve";
import { holdInputSchema } from "@/lib/schemas/hold";
import { runValidated } from "@/lib/schemas/run";
import { runHoldParsed } from "@/lib/physics/hold";
import { readJson, unprocessable } from "../_lib";

/** POST /api/v1/hold — the hold planner. Templates may be given by name. */
export async function POST(req: Request) {
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const resolved = await resolveHoldRefs(await getDb(), body.body);
  if (!resolved.ok) return unprocessable("Some fields are not valid", resolved.fieldErrors);
  const r = runValidated(holdInputSchema, resolved.value, (input) => runHoldParsed(input));
  return r.ok ? NextResponse.json(r.result) : unprocessable("Some fields are not valid", r.fieldErrors);
}
