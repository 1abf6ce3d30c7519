import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { deleteTemplate, getTemplate, saveTemplate } from "@/lib/db/templates";
import { isTemplateKind, TEMPLATE_LABELS } from "@/lib/schemas/templates";
import { parseId } from "@/lib/schemas/id";
import { notFound, readJson, unprocessable } from "../../_lib";
import { authorizeApi } from "@/app/_server/auth";

type Ctx = { params: Promise<{ kind: string; id: string }> };

/** The kind and the strictly parsed id, or the 404 to answer (an id like "1.5", "0x1" or 30 digits is no id). */
async function target({ params }: Ctx): Promise<{ ok: true; kind: Parameters<typeof getTemplate>[1]; id: number } | { ok: false; response: NextResponse }> {
  const { kind, id } = await params;
  if (!isTemplateKind(kind)) return { ok: false, response: notFound(`No template kind "${kind.slice(0, 40)}"`) };
  const n = parseId(id);
  if (n === null) return { ok: false, response: notFound(`No ${TEMPLATE_LABELS[kind].one} with id "${id.slice(0, 40)}": an id is a whole number from 1`) };
  return { ok: true, kind, id: n };
}

export async function GET(_req: Request, ctx: Ctx) {
  const t = await target(ctx);
  if (!t.ok) return t.response;
  const row = await getTemplate(await getDb(), t.kind, t.id);
  if (!row) return notFound(`No ${TEMPLATE_LABELS[t.kind].one} with id ${t.id}`);
  return NextResponse.json({ id: row.id, version: row.version, ...row.data });
}

/** Update. The body is the full template plus the `version` the client last read. */
export async function PUT(req: Request, ctx: Ctx) {
  const t = await target(ctx);
  if (!t.ok) return t.response;
  const who = await authorizeApi("edit");
  if (!who.ok) return who.response;
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const b = body.body as Record<string, unknown> | null;
  if (!b || typeof b !== "object" || Array.isArray(b) || !Number.isInteger(b.version)) {
    return unprocessable("Send the version you last read, to guard against overwriting someone else's edit", { version: ["version: a whole number is required"] });
  }
  const { version, id: _ignored, ...data } = b;
  const r = await saveTemplate(await getDb(), t.kind, t.id, version as number, data, who.actor);
  if (r.ok) return NextResponse.json({ id: r.id, version: r.version });
  if (r.reason === "invalid") return unprocessable("Some fields are not valid", r.fieldErrors);
  if (r.reason === "conflict") return NextResponse.json({ error: r.message, currentVersion: r.currentVersion }, { status: 409 });
  return notFound(r.message);
}

export async function DELETE(_req: Request, ctx: Ctx) {
  const t = await target(ctx);
  if (!t.ok) return t.response;
  const who = await authorizeApi("edit");
  if (!who.ok) return who.response;
  const r = await deleteTemplate(await getDb(), t.kind, t.id, who.actor);
  if (r.ok) return new NextResponse(null, { status: 204 });
  return NextResponse.json({ error: r.message }, { status: r.reason === "not_found" ? 404 : 409 });
}
