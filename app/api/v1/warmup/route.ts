import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { resolveTemplateRefs } from "@/lib/db/resolve";
import { warmupInputSchema } from "@/lib/schemas/warmup";
import { runValidated } from "@/lib/schemas/run";
import { runWarmup } from "@/lib/physics/warmup";
import { readJson, unprocessable } from "../_lib";

/** POST /api/v1/warmup — the warm-up / cool-down check. `product` and `ruleSet` may be template names. */
export async function POST(req: Request) {
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const resolved = await resolveTemplateRefs(await getDb(), body.body, { product: "products", ruleSet: "rulesets" });
  if (!resolved.ok) return unprocessable("Some fields are not valid", resolved.fieldErrors);
  const r = runValidated(warmupInputSchema, resolved.value, (input) => runWarmup(input));
  return r.ok ? NextResponse.json(r.result) : unprocessable("Some fields are not valid", r.fieldErrors);
}
