import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { listTemplates, saveTemplate } from "@/lib/db/templates";
import { isTemplateKind } from "@/lib/schemas/templates";
import { notFound, readJson, runPlannerRequest, unprocessable } from "../_lib";
import { isPlannerKind } from "@/lib/planners/registry";
import { authorizeApi } from "@/app/_server/auth";

type Ctx = { params: Promise<{ kind: string }> };

/** GET lists a kind of template; a planner (POST only) answers 405 and says how to call it. */
export async function GET(_req: Request, { params }: Ctx) {
  const { kind } = await params;
  if (isPlannerKind(kind)) return NextResponse.json({ error: `POST a JSON input to /api/v1/${kind}; its JSON Schema is at /api/v1/schema/${kind}` }, { status: 405, headers: { Allow: "POST" } });
  if (!isTemplateKind(kind)) return notFound(`No template kind "${kind}"`);
  const rows = await listTemplates(await getDb(), kind);
  return NextResponse.json(rows.map((r) => ({ id: r.id, version: r.version, ...r.data })));
}

/** POST runs a planner (any kind in lib/planners/registry.ts) or adds a template of the kind. */
export async function POST(req: Request, { params }: Ctx) {
  const { kind } = await params;
  if (isPlannerKind(kind)) return runPlannerRequest(kind, req);
  if (!isTemplateKind(kind)) return notFound(`No template kind "${kind}"`);
  const who = await authorizeApi("edit");
  if (!who.ok) return who.response;
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const r = await saveTemplate(await getDb(), kind, null, null, body.body, who.actor);
  if (r.ok) return NextResponse.json({ id: r.id, version: r.version }, { status: 201 });
  if (r.reason === "invalid") return unprocessable("Some fields are not valid", r.fieldErrors);
  return unprocessable(r.message);
}
