import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { authorizeApi } from "@/app/_server/auth";
import { listPlans, planSchema, savePlan } from "@/lib/db/plans";
import { fieldErrorsOf } from "@/lib/schemas/errors";
import { readJson, unprocessable } from "../_lib";

/** Saved plans, newest first, with who saved them (accounts mode). */
export async function GET() {
  const plans = await listPlans(await getDb());
  return NextResponse.json(plans.map((p) => ({ id: p.id, kind: p.kind, name: p.name, createdAt: p.createdAt, createdByName: p.createdByName })));
}

/** Save a plan: `{ kind, name, input, result }`. Records who and when. */
export async function POST(req: Request) {
  const who = await authorizeApi("plan");
  if (!who.ok) return who.response;
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const parsed = planSchema.safeParse(body.body);
  if (!parsed.success) return unprocessable("Some fields are not valid", fieldErrorsOf(parsed.error));
  const id = await savePlan(await getDb(), parsed.data, who.actor);
  return NextResponse.json({ id }, { status: 201 });
}
