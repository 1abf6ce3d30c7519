import { NextResponse } from "next/server";
import { jsonSchemaOf, NAMED_SCHEMAS } from "@/lib/schemas/json-schema";

export async function GET(_req: Request, { params }: { params: Promise<{ name: string }> }) {
  const { name } = await params;
  const s = jsonSchemaOf(name);
  if (!s) return NextResponse.json({ error: `No schema "${name.slice(0, 40)}". Known: ${Object.keys(NAMED_SCHEMAS).join(", ")}` }, { status: 404 });
  return NextResponse.json(s);
}
