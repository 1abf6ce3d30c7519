import { NextResponse } from "next/server";
import { authorizeApi } from "@/app/_server/auth";
import { computeAndSaveCalibratedBox } from "@/app/_server/calibrate";
import { readJson, unprocessable } from "../../_lib";

/**
 * Save a hold calibration's box as a new template: `{ input, name? }` (a calibrate input). The server fits
 * the log, saves the box with its fitted factors and their source, and a hold plan with it. Editors only.
 */
export async function POST(req: Request) {
  const who = await authorizeApi("edit");
  if (!who.ok) return who.response;
  const body = await readJson(req);
  if (!body.ok) return body.response;
  const r = await computeAndSaveCalibratedBox(body.body, who.actor);
  if (!r.ok) return r.status === 422 ? unprocessable(r.message, r.fieldErrors) : NextResponse.json({ error: r.message, fieldErrors: r.fieldErrors }, { status: r.status });
  return NextResponse.json({ id: r.shipperId, name: r.shipperName, planId: r.planId, factors: r.result.factors, rms_K: r.result.rms_K, maxResidual_K: r.result.maxResidual_K, warnings: r.result.warnings }, { status: 201 });
}
