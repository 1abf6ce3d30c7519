import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { getSettings, saveSettings } from "@/lib/db/settings";
import { readJson, unprocessable } from "../_lib";
import { authorizeApi } from "@/app/_server/auth";

export async function GET() {
  return NextResponse.json(await getSettings(await getDb()));
}

export async function PUT(req: Request) {
  const who = await authorizeApi("edit");
  if (!who.ok) return who.response;
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const r = await saveSettings(await getDb(), body.body);
  return r.ok ? NextResponse.json(r.settings) : unprocessable("Some fields are not valid", r.fieldErrors);
}
