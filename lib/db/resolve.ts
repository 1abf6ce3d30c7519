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
import type { TemplateRefs } from "../planners/types";
import { PLANNERS, isPlannerKind, type PlannerKind } from "../planners/registry";
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

/** Replaces template names inside a list of lines (`products[i].product`, `packs[i].pack`, …) by the templates. */
async function resolveLines(find: Lookup, out: Obj, spec: NonNullable<TemplateRefs["lines"]>[number], errors: FieldErrors, prefix: string): Promise<void> {
  const { key, field, kind, fill } = spec;
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
      else errors[`${prefix}${key}.${i}.${field}`] = [missing(kind, v)];
    }
    // A line without the field takes the template's own value (a pack's usual conditioning).
    if (fill && l[fill.field] === undefined && isObject(l[field])) l[fill.field] = (l[field] as Obj)[fill.from];
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

/**
 * A planner's input with template names replaced by the templates, as its registry entry's `refs` says
 * (lib/planners/types.ts): top-level fields, fields of each line (with a default taken from the template),
 * nested fields, the materials the boxes name, and another planner's input nested inside (a calibration's
 * plan). A missing rule set takes the library's default one. Field errors name the path of each unknown name.
 */
export async function resolveRefs(db: Db, body: unknown, refs: TemplateRefs, innerRefs: (planner: unknown) => TemplateRefs | null = () => null): Promise<Resolved> {
  const errors: FieldErrors = {};
  const value = await resolveInto(lookups(db), db, body, refs, innerRefs, errors, "");
  return Object.keys(errors).length ? { ok: false, fieldErrors: errors } : { ok: true, value };
}

async function resolveInto(find: Lookup, db: Db, body: unknown, refs: TemplateRefs, innerRefs: (planner: unknown) => TemplateRefs | null, errors: FieldErrors, prefix: string): Promise<unknown> {
  if (!isObject(body)) return body;
  const out: Obj = { ...body };
  const shape = shapeErrors(out, (refs.lines ?? []).map((l) => ({ key: l.key, max: l.max, what: l.what })));
  if (Object.keys(shape).length) {
    for (const [k, v] of Object.entries(shape)) errors[prefix + k] = v;
    return out;
  }
  const topErrors: FieldErrors = {};
  await resolveTop(find, db, out, refs.top, topErrors);
  for (const [k, v] of Object.entries(topErrors)) errors[prefix + k] = v;
  for (const spec of refs.lines ?? []) await resolveLines(find, out, spec, errors, prefix);
  for (const { path: [a, b], kind } of refs.nested ?? []) {
    const m = out[a];
    if (isObject(m) && typeof m[b] === "string") {
      const t = await find(kind, m[b]);
      if (t) out[a] = { ...m, [b]: t };
      else errors[`${prefix}${a}.${b}`] = [missing(kind, m[b])];
    }
  }
  const mf = refs.materialsFrom;
  if (mf && out.materials === undefined) {
    if ("list" in mf) {
      const list = out[mf.list];
      if (Array.isArray(list)) out.materials = await materialsNamedBy(find, list.map((b) => (isObject(b) ? b[mf.field] : null)));
    } else if (isObject(out[mf.field])) out.materials = await materialsNamedBy(find, [out[mf.field]]);
  }
  if (refs.inner) {
    const inner = innerRefs(out[refs.inner.by]);
    if (inner) out[refs.inner.field] = await resolveInto(find, db, out[refs.inner.field], inner, innerRefs, errors, `${prefix}${refs.inner.field}.`);
  }
  return out;
}

/** A planner's input with its template names resolved, as the planner's registry entry says. */
export function resolvePlannerInput(db: Db, kind: PlannerKind, body: unknown): Promise<Resolved> {
  return resolveRefs(db, body, PLANNERS[kind].refs, (by) => (isPlannerKind(by) ? PLANNERS[by].refs : null));
}
