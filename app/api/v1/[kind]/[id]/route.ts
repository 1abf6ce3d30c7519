import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { deleteTemplate, getTemplate, saveTemplate } from "@/lib/db/templates";
import { isTemplateKind } from "@/lib/schemas/templates";
import { notFound, readJson, unprocessable } from "../../_lib";
import { authorizeApi } from "@/app/_server/auth";

type Ctx = { params: Promise<{ kind: string; id: string }> };

export async function GET(_req: Request, { params }: Ctx) {
  const { kind, id } = await params;
  if (!isTemplateKind(kind)) return notFound(`No template kind "${kind}"`);
  const t = await getTemplate(await getDb(), kind, Number(id));
  if (!t) return notFound(`No ${kind} with id ${id}`);
  return NextResponse.json({ id: t.id, version: t.version, ...t.data });
}

/** Update. The body is the full template plus the `version` the client last read. */
export async function PUT(req: Request, { params }: Ctx) {
  const { kind, id } = await params;
  if (!isTemplateKind(kind)) return notFound(`No template kind "${kind}"`);
  const who = await authorizeApi("edit");
  if (!who.ok) return who.response;
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const b = body.body as Record<string, unknown> | null;
  if (!b || typeof b !== "object" || !Number.isInteger(b.version)) {
    return unprocessable("Send the version you last read, to guard against overwriting someone else's edit", { version: ["version: a whole number is required"] });
  }
  const { version, id: _ignored, ...data } = b;
  const r = await saveTemplate(await getDb(), kind, Number(id), version as number, data, who.actor);
  if (r.ok) return NextResponse.json({ id: r.id, version: r.version });
  if (r.reason === "invalid") return unprocessable("Some fields are not valid", r.fieldErrors);
  if (r.reason === "conflict") return NextResponse.json({ error: r.message, currentVersion: r.currentVersion }, { status: 409 });
  return notFound(r.message);
}

export async function DELETE(_req: Request, { params }: Ctx) {
  const { kind, id } = await params;
  if (!isTemplateKind(kind)) return notFound(`No template kind "${kind}"`);
  const who = await authorizeApi("edit");
  if (!who.ok) return who.response;
  const r = await deleteTemplate(await getDb(), kind, Number(id), who.actor);
  if (r.ok) return new NextResponse(null, { status: 204 });
  return NextResponse.json({ error: r.message }, { status: 409 });
}
