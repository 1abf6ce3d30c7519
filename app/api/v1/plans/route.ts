import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { authorizeApi } from "@/app/_server/auth";
import { listPlans } from "@/lib/db/plans";
import { computeAndSavePlan } from "@/app/_server/plans";
import { readJson, unprocessable } from "../_lib";

/** Saved plans, newest first, with who saved them (accounts mode). */
export async function GET() {
  const plans = await listPlans(await getDb());
  return NextResponse.json(plans.map((p) => ({ id: p.id, kind: p.kind, name: p.name, createdAt: p.createdAt, createdByName: p.createdByName })));
}

/** Save a plan: `{ kind, name, input }`; the server computes the result it stores. Records who and when. */
export async function POST(req: Request) {
  const who = await authorizeApi("plan");
  if (!who.ok) return who.response;
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const r = await computeAndSavePlan(body.body, who.actor);
  if (!r.ok) return r.status === 422 ? unprocessable(r.message, r.fieldErrors) : NextResponse.json({ error: r.message, fieldErrors: r.fieldErrors }, { status: r.status });
  return NextResponse.json({ id: r.id }, { status: 201 });
}
