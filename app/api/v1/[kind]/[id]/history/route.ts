import { NextResponse } from "next/server";
import { getDb } from "@/app/_server/db";
import { ruleSetHistory } from "@/lib/db/audit";
import { parseId } from "@/lib/schemas/id";
import { notFound } from "../../../_lib";

type Ctx = { params: Promise<{ kind: string; id: string }> };

/** A rule set's history, newest first: who changed it, when, how, and the rule set as saved. */
export async function GET(_req: Request, { params }: Ctx) {
  const { kind, id } = await params;
  if (kind !== "rulesets") return notFound(`History is kept for rule sets only`);
  const n = parseId(id);
  if (n === null) return notFound(`No rule set with id "${id.slice(0, 40)}": an id is a whole number from 1`);
  const rows = await ruleSetHistory(await getDb(), n);
  if (!rows.length) return notFound(`No history for rule set ${id}`);
  return NextResponse.json(rows);
}
