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
  const lines = async (key: "products" | "packs", field: "product" | "pack", kind: TemplateKind) => {
    const arr = out[key];
    if (!Array.isArray(arr)) return;
    out[key] = await Promise.all(
      arr.map(async (line, i) => {
        if (!line || typeof line !== "object") return line;
        const l = { ...(line as Record<string, unknown>) };
        if (typeof l[field] === "string") {
          const t = await getTemplateByName(db, kind, l[field] as string);
          if (t) l[field] = t.data;
          else errors[`${key}.${i}.${field}`] = [`No ${field} named "${l[field]}" in the library`];
        }
        if (key === "packs" && l.conditioning_C === undefined && l.pack && typeof l.pack === "object") {
          l.conditioning_C = (l.pack as { conditioning_C?: number }).conditioning_C;
        }
        return l;
      }),
    );
  };
  await lines("products", "product", "products");
  await lines("packs", "pack", "packs");
  if (out.materials === undefined && out.shipper && typeof out.shipper === "object") {
    const s = out.shipper as { wallLayers?: { material: string }[]; lidLayers?: { material: string }[] | null; finishMaterial?: string };
    const names = new Set([...(s.wallLayers ?? []).map((l) => l.material), ...(s.lidLayers ?? []).map((l) => l.material), s.finishMaterial ?? ""]);
    const mats = [];
    for (const n of names) {
      if (!n) continue;
      const m = await getTemplateByName(db, "materials", n);
      if (m) mats.push(m.data);
    }
    out.materials = mats;
  }
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
  const lines = async (key: string, field: string, kind: TemplateKind) => {
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
        return l;
      }),
    );
  };
  await lines("products", "product", "products");
  await lines("boxes", "shipper", "shippers");
  await lines("packs", "pack", "packs");
  if (out.materials === undefined && Array.isArray(out.boxes)) {
    const names = new Set<string>();
    for (const b of out.boxes as { shipper?: { wallLayers?: { material: string }[]; lidLayers?: { material: string }[] | null; finishMaterial?: string } }[]) {
      const s = b?.shipper;
      if (!s || typeof s !== "object") continue;
      for (const l of [...(s.wallLayers ?? []), ...(s.lidLayers ?? [])]) names.add(l.material);
      if (s.finishMaterial) names.add(s.finishMaterial);
    }
    const mats = [];
    for (const n of names) {
      const m = await getTemplateByName(db, "materials", n);
      if (m) mats.push(m.data);
    }
    out.materials = mats;
  }
  return Object.keys(errors).length ? { ok: false, fieldErrors: errors } : { ok: true, value: out };
}
