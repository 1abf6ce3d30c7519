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

/** Replaces template names inside a list of lines (`products[i].product`, `packs[i].pack`, …) by the templates. */
async function resolveLines(db: Db, out: Record<string, unknown>, key: string, field: string, kind: TemplateKind, errors: FieldErrors, each?: (l: Record<string, unknown>) => void): Promise<void> {
  const arr = out[key];
  if (!Array.isArray(arr)) return;
  out[key] = await Promise.all(
    arr.map(async (line, i) => {
      if (!line || typeof line !== "object") return line;
      const l = { ...(line as Record<string, unknown>) };
      if (typeof l[field] === "string") {
        const t = await getTemplateByName(db, kind, l[field] as string);
        if (t) l[field] = t.data;
        else errors[`${key}.${i}.${field}`] = [`No ${kind.replace(/s$/, "")} named "${l[field]}" in the library`];
      }
      each?.(l);
      return l;
    }),
  );
}

/** The library materials that the given boxes name (walls, lid and finish). */
async function materialsNamedBy(db: Db, boxes: unknown[]): Promise<unknown[]> {
  const names = new Set<string>();
  for (const s of boxes as { wallLayers?: { material: string }[]; lidLayers?: { material: string }[] | null; finishMaterial?: string }[]) {
    if (!s || typeof s !== "object") continue;
    for (const l of [...(s.wallLayers ?? []), ...(s.lidLayers ?? [])]) names.add(l.material);
    if (s.finishMaterial) names.add(s.finishMaterial);
  }
  const mats = [];
  for (const n of names) {
    const m = await getTemplateByName(db, "materials", n);
    if (m) mats.push(m.data);
  }
  return mats;
}

/**
 * Hold-planner input with names: `shipper`, `route`, `ruleSet` and each line's `product` / `pack` may be
 * template names; a pack line without `conditioning_C` takes the pack's usual conditioning; `materials`
 * defaults to the library materials the box names.
 */
export async function resolveHoldRefs(db: Db, body: unknown): Promise<{ ok: true; value: unknown } | { ok: false; fieldErrors: FieldErrors }> {
  const top = await resolveTemplateRefs(db, body, { shipper: "shippers", route: "routes", ruleSet: "rulesets" });
  if (!top.ok || !top.value || typeof top.value !== "object") return top;
  const out = top.value as Record<string, unknown>;
  const errors: FieldErrors = {};
  await resolveLines(db, out, "products", "product", "products", errors);
  await resolveLines(db, out, "packs", "pack", "packs", errors, (l) => {
    if (l.conditioning_C === undefined && l.pack && typeof l.pack === "object") l.conditioning_C = (l.pack as { conditioning_C?: number }).conditioning_C;
  });
  if (out.materials === undefined && out.shipper && typeof out.shipper === "object") out.materials = await materialsNamedBy(db, [out.shipper]);
  return Object.keys(errors).length ? { ok: false, fieldErrors: errors } : { ok: true, value: out };
}

/** Thaw input with names: `product`, `ruleSet`, and a tray method's `tray` may be template names. */
export async function resolveThawRefs(db: Db, body: unknown): Promise<{ ok: true; value: unknown } | { ok: false; fieldErrors: FieldErrors }> {
  const top = await resolveTemplateRefs(db, body, { product: "products", ruleSet: "rulesets" });
  if (!top.ok || !top.value || typeof top.value !== "object") return top;
  const out = top.value as Record<string, unknown>;
  const m = out.method as Record<string, unknown> | undefined;
  if (m && typeof m === "object" && typeof m.tray === "string") {
    const t = await getTemplateByName(db, "materials", m.tray);
    if (!t) return { ok: false, fieldErrors: { "method.tray": [`No material named "${m.tray}" in the library`] } };
    out.method = { ...m, tray: t.data };
  }
  return { ok: true, value: out };
}

/**
 * Sizer input with names: `route`, `ruleSet`, each product line's `product`, each box's `shipper` and each
 * pack line's `pack` may be template names; `materials` defaults to every library material the boxes name.
 */
export async function resolveSizeRefs(db: Db, body: unknown): Promise<{ ok: true; value: unknown } | { ok: false; fieldErrors: FieldErrors }> {
  const top = await resolveTemplateRefs(db, body, { route: "routes", ruleSet: "rulesets" });
  if (!top.ok || !top.value || typeof top.value !== "object") return top;
  const out = top.value as Record<string, unknown>;
  const errors: FieldErrors = {};
  await resolveLines(db, out, "products", "product", "products", errors);
  await resolveLines(db, out, "boxes", "shipper", "shippers", errors);
  await resolveLines(db, out, "packs", "pack", "packs", errors);
  if (out.materials === undefined && Array.isArray(out.boxes)) out.materials = await materialsNamedBy(db, (out.boxes as { shipper?: unknown }[]).map((b) => b?.shipper));
  return Object.keys(errors).length ? { ok: false, fieldErrors: errors } : { ok: true, value: out };
}
