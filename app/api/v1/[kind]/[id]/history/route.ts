import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { ruleSetHistory } from "@/lib/db/audit";
import { notFound } from "../../../_lib";

type Ctx = { params: Promise<{ kind: string; id: string }> };

/** A rule set's history, newest first: who changed it, when, how, and the rule set as saved. */
export async function GET(_req: Request, { params }: Ctx) {
  const { kind, id } = await params;
  if (kind !== "rulesets") return notFound(`History is kept for rule sets only`);
  if (!/^[1-9]\d{0,9}$/.test(id)) return notFound(`No rule set with id ${id}`);
  const rows = await ruleSetHistory(await getDb(), Number(id));
  if (!rows.length) return notFound(`No history for rule set ${id}`);
  return NextResponse.json(rows);
}
