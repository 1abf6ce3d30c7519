/**
 * Lets API and CLI inputs name a template instead of spelling it out: `"product": "Whole turkey, 6 kg"`.
 * Named templates are copied in from the library before the input schema checks the whole thing;
 * a missing rule set falls back to the default one.
 *
 * The shape and the counts are checked first (a body that is not an object, a list that is not a list
 * or longer than the schema allows, a line that is not an object, a name that is not short text), so a
 * hostile body never costs a template look-up per line; each distinct name is looked up once.
 */
import type { Db } from "./client";
import type { FieldErrors } from "../schemas/errors";
import { TEMPLATE_LABELS, type TemplateKind } from "../schemas/templates";
import { MAX_HOLD_LINES } from "../schemas/hold";
import { MAX_SIZE_LINES } from "../schemas/size";
import { defaultRuleSet, getTemplateByName } from "./templates";

type Resolved = { ok: true; value: unknown } | { ok: false; fieldErrors: FieldErrors };
type Obj = Record<string, unknown>;

/** Template names are at most 120 characters (lib/schemas/templates.ts); longer text names nothing. */
const MAX_NAME_CHARS = 120;

const isObject = (v: unknown): v is Obj => !!v && typeof v === "object" && !Array.isArray(v);

/** One request's look-ups: each (kind, name) once. */
function lookups(db: Db) {
  const cache = new Map<string, Promise<unknown | null>>();
  return (kind: TemplateKind, name: string): Promise<unknown | null> => {
    const key = `${kind}\u0000${name}`;
    let p = cache.get(key);
    if (!p) {
      p = name.length > MAX_NAME_CHARS ? Promise.resolve(null) : getTemplateByName(db, kind, name).then((t) => t?.data ?? null);
      cache.set(key, p);
    }
    return p;
  };
}
type Lookup = ReturnType<typeof lookups>;

const missing = (kind: TemplateKind, name: string) => `No ${TEMPLATE_LABELS[kind].one} named "${name.slice(0, MAX_NAME_CHARS)}" in the library`;

interface LineSpec {
  key: string;
  max: number;
  what: string;
}

/** Shape and count errors of the lists of lines, found before any look-up. */
function shapeErrors(out: Obj, lines: LineSpec[]): FieldErrors {
  const errors: FieldErrors = {};
  for (const { key, max, what } of lines) {
    const arr = out[key];
    if (arr === undefined) continue;
    if (!Array.isArray(arr)) errors[key] = [`${what}: a list is expected`];
    else if (arr.length > max) errors[key] = [`At most ${max} ${what}; this input has ${arr.length}`];
    else arr.forEach((l, i) => {
      if (!isObject(l)) errors[`${key}.${i}`] = [`${what}: each line is an object`];
    });
  }
  return errors;
}

async function resolveTop(find: Lookup, db: Db, out: Obj, fields: Record<string, TemplateKind>, errors: FieldErrors): Promise<void> {
  for (const [field, kind] of Object.entries(fields)) {
    const v = out[field];
    if (typeof v === "string") {
      const t = await find(kind, v);
      if (t) out[field] = t;
      else errors[field] = [missing(kind, v)];
    } else if (v === undefined && kind === "rulesets") {
      const d = await defaultRuleSet(db);
      if (d) out[field] = d.data;
    }
  }
}

export async function resolveTemplateRefs(db: Db, body: unknown, fields: Record<string, TemplateKind>): Promise<Resolved> {
  if (!isObject(body)) return { ok: true, value: body };
  const out: Obj = { ...body };
  const errors: FieldErrors = {};
  await resolveTop(lookups(db), db, out, fields, errors);
  return Object.keys(errors).length ? { ok: false, fieldErrors: errors } : { ok: true, value: out };
}

/** Replaces template names inside a list of lines (`products[i].product`, `packs[i].pack`, …) by the templates. */
async function resolveLines(find: Lookup, out: Obj, key: string, field: string, kind: TemplateKind, errors: FieldErrors, each?: (l: Obj) => void): Promise<void> {
  const arr = out[key];
  if (!Array.isArray(arr)) return;
  const lines: unknown[] = [];
  for (let i = 0; i < arr.length; i++) {
    const line = arr[i];
    if (!isObject(line)) {
      lines.push(line);
      continue;
    }
    const l = { ...line };
    const v = l[field];
    if (typeof v === "string") {
      const t = await find(kind, v);
      if (t) l[field] = t;
      else errors[`${key}.${i}.${field}`] = [missing(kind, v)];
    }
    each?.(l);
    lines.push(l);
  }
  out[key] = lines;
}

/** The library materials that the given boxes name (walls, lid and finish); malformed boxes name none. */
async function materialsNamedBy(find: Lookup, boxes: unknown[]): Promise<unknown[]> {
  const names = new Set<string>();
  const layerNames = (layers: unknown) => {
    if (!Array.isArray(layers)) return;
    for (const l of layers) if (isObject(l) && typeof l.material === "string") names.add(l.material);
  };
  for (const s of boxes) {
    if (!isObject(s)) continue;
    layerNames(s.wallLayers);
    layerNames(s.lidLayers);
    if (typeof s.finishMaterial === "string") names.add(s.finishMaterial);
  }
  const mats = [];
  for (const n of names) {
    const m = await find("materials", n);
    if (m) mats.push(m);
  }
  return mats;
}

/** Warm-up input with names: `product` and `ruleSet` may be template names. */
export function resolveWarmupRefs(db: Db, body: unknown): Promise<Resolved> {
  return resolveTemplateRefs(db, body, { product: "products", ruleSet: "rulesets" });
}

/**
 * Hold-planner input with names: `shipper`, `route`, `ruleSet` and each line's `product` / `pack` may be
 * template names; a pack line without `conditioning_C` takes the pack's usual conditioning; `materials`
 * defaults to the library materials the box names.
 */
export async function resolveHoldRefs(db: Db, body: unknown): Promise<Resolved> {
  if (!isObject(body)) return { ok: true, value: body };
  const out: Obj = { ...body };
  const shape = shapeErrors(out, [
    { key: "products", max: MAX_HOLD_LINES, what: "product lines" },
    { key: "packs", max: MAX_HOLD_LINES, what: "pack lines" },
  ]);
  if (Object.keys(shape).length) return { ok: false, fieldErrors: shape };
  const find = lookups(db);
  const errors: FieldErrors = {};
  await resolveTop(find, db, out, { shipper: "shippers", route: "routes", ruleSet: "rulesets" }, errors);
  await resolveLines(find, out, "products", "product", "products", errors);
  await resolveLines(find, out, "packs", "pack", "packs", errors, (l) => {
    if (l.conditioning_C === undefined && isObject(l.pack)) l.conditioning_C = l.pack.conditioning_C;
  });
  if (out.materials === undefined && isObject(out.shipper)) out.materials = await materialsNamedBy(find, [out.shipper]);
  return Object.keys(errors).length ? { ok: false, fieldErrors: errors } : { ok: true, value: out };
}

/** Thaw input with names: `product`, `ruleSet`, and a tray method's `tray` may be template names. */
export async function resolveThawRefs(db: Db, body: unknown): Promise<Resolved> {
  if (!isObject(body)) return { ok: true, value: body };
  const out: Obj = { ...body };
  const find = lookups(db);
  const errors: FieldErrors = {};
  await resolveTop(find, db, out, { product: "products", ruleSet: "rulesets" }, errors);
  const m = out.method;
  if (isObject(m) && typeof m.tray === "string") {
    const t = await find("materials", m.tray);
    if (t) out.method = { ...m, tray: t };
    else errors["method.tray"] = [missing("materials", m.tray)];
  }
  return Object.keys(errors).length ? { ok: false, fieldErrors: errors } : { ok: true, value: out };
}

/**
 * Sizer input with names: `route`, `ruleSet`, each product line's `product`, each box's `shipper` and each
 * pack line's `pack` may be template names; `materials` defaults to every library material the boxes name.
 */
export async function resolveSizeRefs(db: Db, body: unknown): Promise<Resolved> {
  if (!isObject(body)) return { ok: true, value: body };
  const out: Obj = { ...body };
  const shape = shapeErrors(out, [
    { key: "products", max: MAX_SIZE_LINES.products, what: "product lines" },
    { key: "boxes", max: MAX_SIZE_LINES.boxes, what: "candidate boxes" },
    { key: "packs", max: MAX_SIZE_LINES.packs, what: "candidate packs" },
  ]);
  if (Object.keys(shape).length) return { ok: false, fieldErrors: shape };
  const find = lookups(db);
  const errors: FieldErrors = {};
  await resolveTop(find, db, out, { route: "routes", ruleSet: "rulesets" }, errors);
  await resolveLines(find, out, "products", "product", "products", errors);
  await resolveLines(find, out, "boxes", "shipper", "shippers", errors);
  await resolveLines(find, out, "packs", "pack", "packs", errors);
  if (out.materials === undefined && Array.isArray(out.boxes)) out.materials = await materialsNamedBy(find, out.boxes.map((b) => (isObject(b) ? b.shipper : null)));
  return Object.keys(errors).length ? { ok: false, fieldErrors: errors } : { ok: true, value: out };
}
