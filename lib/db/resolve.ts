/**
 * Lets API and CLI inputs name a template instead of spelling it out: `"product": "Whole turkey, 6 kg"`.
 * Named templates are copied in from the library before the input schema checks the whole thing;
 * a missing rule set falls back to the default one.
 */
import type { Db } from "./client";
import type { FieldErrors } from "../schemas/errors";
import type { TemplateKind } from "../schemas/templates";
import { defaultRuleSet, getTemplateByName } from "./templates";

export async function resolveTemplateRefs(
  db: Db,
  body: unknown,
  fields: Record<string, TemplateKind>,
): Promise<{ ok: true; value: unknown } | { ok: false; fieldErrors: FieldErrors }> {
  if (!body || typeof body !== "object" || Array.isArray(body)) return { ok: true, value: body };
  const out: Record<string, unknown> = { ...(body as Record<string, unknown>) };
  const errors: FieldErrors = {};
  for (const [field, kind] of Object.entries(fields)) {
    const v = out[field];
    if (typeof v === "string") {
      const t = await getTemplateByName(db, kind, v);
      if (t) out[field] = t.data;
      else errors[field] = [`No ${kind.replace(/s$/, "")} named "${v}" in the library`];
    } else if (v === undefined && kind === "rulesets") {
      const d = await defaultRuleSet(db);
      if (d) out[field] = d.data;
    }
  }
  return Object.keys(errors).length ? { ok: false, fieldErrors: errors } : { ok: true, value: out };
}
