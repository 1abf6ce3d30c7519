import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { authorizeApi } from "@/app/_server/auth";
import { deletePlan, getPlan, planNameSchema, renamePlan } from "@/lib/db/plans";
import { notFound, readJson, unprocessable } from "../../_lib";
import { z } from "zod";
import { fieldErrorsOf } from "@/lib/schemas/errors";

type Ctx = { params: Promise<{ id: string }> };
const renameSchema = z.object({ name: planNameSchema }).strict();

/** One saved plan: its input (which `POST /api/v1/<kind>` accepts as it is) and the result saved with it. */
export async function GET(_req: Request, { params }: Ctx) {
  const plan = await getPlan(await getDb(), (await params).id);
  return plan ? NextResponse.json(plan) : notFound("No saved plan with that id");
}

/** Renames a plan: `{ "name": "…" }`. */
export async function PATCH(req: Request, { params }: Ctx) {
  const who = await authorizeApi("plan");
  if (!who.ok) return who.response;
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const parsed = renameSchema.safeParse(body.body);
  if (!parsed.success) return unprocessable("Some fields are not valid", fieldErrorsOf(parsed.error));
  return (await renamePlan(await getDb(), (await params).id, parsed.data.name)) ? NextResponse.json({ ok: true }) : notFound("No saved plan with that id");
}

export async function DELETE(_req: Request, { params }: Ctx) {
  const who = await authorizeApi("plan");
  if (!who.ok) return who.response;
  return (await deletePlan(await getDb(), (await params).id)) ? new NextResponse(null, { status: 204 }) : notFound("No saved plan with that id");
}
