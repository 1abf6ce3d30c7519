import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { resolveThawRefs } from "@/lib/db/resolve";
import { thawInputSchema } from "@/lib/schemas/thaw";
import { runValidated } from "@/lib/schemas/run";
import { runThawParsed } from "@/lib/physics/thaw";
import { readJson, unprocessable } from "../_lib";

/** POST /api/v1/thaw — the thaw planner. `product`, `ruleSet` and a tray's material may be names. */
export async function POST(req: Request) {
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const resolved = await resolveThawRefs(await getDb(), body.body);
  if (!resolved.ok) return unprocessable("Some fields are not valid", resolved.fieldErrors);
  const r = runValidated(thawInputSchema, resolved.value, (input) => runThawParsed(input));
  return r.ok ? NextResponse.json(r.result) : unprocessable("Some fields are not valid", r.fieldErrors);
}
