/**
 * Queries for the template library. Every function takes the Prisma client, validates
 * with the one zod schema of its kind, and maps between the flat SQLite row (SI units,
 * JSON text for layers and segments) and the schema's shape.
 */
import type { Db } from "./client";
import { type FieldErrors, type SaveResult, fieldErrorsOf } from "../schemas/errors";
export type { SaveResult };
import {
  type TemplateKind,
  type TemplateOutput,
  templateSchemas,
  layerSchema,
  segmentSchema,
  boxCalibrationSchema,
  TEMPLATE_LABELS,
} from "../schemas/templates";
import { z } from "zod";
// Shared-database support (issue 16): library writes go through one transaction helper and rule-set changes are recorded.
import { libraryTransaction, isUniqueViolation } from "./tx";
import { recordRuleSetChange, type Actor } from "./audit";
import { parseId } from "../schemas/id";

export interface Stored<K extends TemplateKind> {
  id: number;
  version: number;
  updatedAt: Date;
  data: TemplateOutput[K];
}

type Row = Record<string, unknown> & { id: number; version: number; updatedAt: Date };

const parseJson = <T>(text: unknown, schema: z.ZodType<T>): T => schema.parse(JSON.parse(String(text)));

/** Row → schema shape. */
function fromRow<K extends TemplateKind>(kind: K, row: Row): TemplateOutput[K] {
  const { id: _id, version: _v, createdAt: _c, updatedAt: _u, ...rest } = row;
  switch (kind) {
    case "products": {
      const {
        waterFraction,
        proteinFraction,
        fatFraction,
        carbohydrateFraction,
        fibreFraction,
        ashFraction,
        ...p
      } = rest as Record<string, unknown>;
      return {
        ...p,
        composition: {
          water: waterFraction,
          protein: proteinFraction,
          fat: fatFraction,
          carbohydrate: carbohydrateFraction,
          fibre: fibreFraction,
          ash: ashFraction,
        },
      } as unknown as TemplateOutput[K];
    }
    case "shippers":
      return {
        ...rest,
        wallLayers: parseJson(rest.wallLayers, z.array(layerSchema)),
        lidLayers: rest.lidLayers === null ? null : parseJson(rest.lidLayers, z.array(layerSchema)),
        calibration: rest.calibration === null || rest.calibration === undefined ? null : parseJson(rest.calibration, boxCalibrationSchema),
      } as unknown as TemplateOutput[K];
    case "routes":
      return { ...rest, segments: parseJson(rest.segments, z.array(segmentSchema)) } as unknown as TemplateOutput[K];
    case "rulesets":
      return { ...rest, isDefault: Boolean(rest.isDefault) } as unknown as TemplateOutput[K];
    default:
      return rest as unknown as TemplateOutput[K];
  }
}

/** Schema shape → row columns. */
function toRow(kind: TemplateKind, data: TemplateOutput[TemplateKind]): Record<string, unknown> {
  switch (kind) {
    case "products": {
      const { composition, ...p } = data as TemplateOutput["products"];
      return {
        ...p,
        waterFraction: composition.water,
        proteinFraction: composition.protein,
        fatFraction: composition.fat,
        carbohydrateFraction: composition.carbohydrate,
        fibreFraction: composition.fibre,
        ashFraction: composition.ash,
      };
    }
    case "shippers": {
      const s = data as TemplateOutput["shippers"];
      return { ...s, wallLayers: JSON.stringify(s.wallLayers), lidLayers: s.lidLayers ? JSON.stringify(s.lidLayers) : null, calibration: s.calibration ? JSON.stringify(s.calibration) : null };
    }
    case "routes": {
      const r = data as TemplateOutput["routes"];
      return { ...r, segments: JSON.stringify(r.segments) };
    }
    default:
      return { ...data };
  }
}

// Prisma delegates are typed per model; the generic repository reaches them by name.
type Delegate = {
  findMany(args?: unknown): Promise<Row[]>;
  findUnique(args: unknown): Promise<Row | null>;
  findFirst(args: unknown): Promise<Row | null>;
  create(args: unknown): Promise<Row>;
  updateMany(args: unknown): Promise<{ count: number }>;
  update(args: unknown): Promise<Row>;
  delete(args: unknown): Promise<Row>;
  deleteMany(args?: unknown): Promise<{ count: number }>;
  count(args?: unknown): Promise<number>;
};
type TxLike = Pick<Db, "material" | "product" | "shipper" | "coolantPack" | "route" | "ruleSet">;

const MODEL: Record<TemplateKind, keyof TxLike> = {
  materials: "material",
  products: "product",
  shippers: "shipper",
  packs: "coolantPack",
  routes: "route",
  rulesets: "ruleSet",
};

export function delegateFor(db: TxLike, kind: TemplateKind): Delegate {
  return db[MODEL[kind]] as unknown as Delegate;
}

export async function listTemplates<K extends TemplateKind>(db: Db, kind: K): Promise<Stored<K>[]> {
  const rows = await delegateFor(db, kind).findMany({ orderBy: { name: "asc" } });
  return rows.map((r) => ({ id: r.id, version: r.version, updatedAt: r.updatedAt, data: fromRow(kind, r) }));
}

/** `id` may be the text from a URL; anything but a plain positive whole number in range finds nothing. */
export async function getTemplate<K extends TemplateKind>(db: Db, kind: K, rawId: number | string): Promise<Stored<K> | null> {
  const id = parseId(rawId);
  if (id === null) return null;
  const r = await delegateFor(db, kind).findUnique({ where: { id } });
  return r ? { id: r.id, version: r.version, updatedAt: r.updatedAt, data: fromRow(kind, r) } : null;
}

export async function getTemplateByName<K extends TemplateKind>(db: Db, kind: K, name: string): Promise<Stored<K> | null> {
  const r = await delegateFor(db, kind).findUnique({ where: { name } });
  return r ? { id: r.id, version: r.version, updatedAt: r.updatedAt, data: fromRow(kind, r) } : null;
}

/** Checks references a template makes to other templates (a box's layer materials). */
async function referenceErrors(db: TxLike, kind: TemplateKind, data: TemplateOutput[TemplateKind]): Promise<FieldErrors> {
  const errors: FieldErrors = {};
  if (kind !== "shippers") return errors;
  const s = data as TemplateOutput["shippers"];
  const names = new Set(
    (await delegateFor(db, "materials").findMany({ select: { name: true } })).map((m) => String(m.name)),
  );
  s.wallLayers.forEach((l, i) => {
    if (!names.has(l.material)) errors[`wallLayers.${i}.material`] = [`No material named "${l.material}" in the library`];
  });
  (s.lidLayers ?? []).forEach((l, i) => {
    if (!names.has(l.material)) errors[`lidLayers.${i}.material`] = [`No material named "${l.material}" in the library`];
  });
  if (!names.has(s.finishMaterial)) errors["finishMaterial"] = [`No material named "${s.finishMaterial}" in the library`];
  return errors;
}

async function nameTaken(db: TxLike, kind: TemplateKind, name: string, exceptId: number | null): Promise<boolean> {
  const r = await delegateFor(db, kind).findUnique({ where: { name } });
  return !!r && r.id !== exceptId;
}

/** Validates and saves. `id === null` creates; otherwise updates only if `expectedVersion` still matches. */
export async function saveTemplate(
  db: Db,
  kind: TemplateKind,
  id: number | null,
  expectedVersion: number | null,
  input: unknown,
  actor: Actor = null,
): Promise<SaveResult> {
  const notFound = { ok: false as const, reason: "not_found" as const, message: `This ${TEMPLATE_LABELS[kind].one} no longer exists; it may have been deleted.` };
  if (id !== null && parseId(id) === null) return notFound;
  const parsed = templateSchemas[kind].safeParse(input);
  if (!parsed.success) return { ok: false, reason: "invalid", fieldErrors: fieldErrorsOf(parsed.error) };
  const data = parsed.data as TemplateOutput[TemplateKind];
  const nameTakenResult: SaveResult = {
    ok: false,
    reason: "invalid",
    fieldErrors: { name: [`Another ${TEMPLATE_LABELS[kind].one} is already called "${(data as { name: string }).name}"`] },
  };
  // One transaction under the library write lock (lib/db/tx.ts): every check (references, name, version)
  // comes before the first write, so a refused save changes nothing — in particular the default rule set
  // keeps its flag when an update is refused. The unique index is the backstop for the name check.
  return libraryTransaction(db, async (tx) => {
    const txl = tx as unknown as TxLike;
    const t = delegateFor(txl, kind);
    const audit = (rowId: number, version: number, action: "created" | "updated") =>
      kind === "rulesets"
        ? recordRuleSetChange(tx, { ruleSetId: rowId, ruleSetName: (data as { name: string }).name, action, version, snapshot: data, actor })
        : Promise.resolve();
    const refErrors = await referenceErrors(txl, kind, data);
    if (Object.keys(refErrors).length) return { ok: false as const, reason: "invalid" as const, fieldErrors: refErrors };
    if (await nameTaken(txl, kind, (data as { name: string }).name, id)) return nameTakenResult;
    const clearOtherDefaults = async () => {
      if (kind === "rulesets" && (data as TemplateOutput["rulesets"]).isDefault) {
        await t.updateMany({ where: { isDefault: true, ...(id ? { NOT: { id } } : {}) }, data: { isDefault: false } });
      }
    };
    if (id === null) {
      await clearOtherDefaults();
      const row = await t.create({ data: toRow(kind, data) });
      await audit(row.id, row.version, "created");
      return { ok: true as const, id: row.id, version: row.version };
    }
    const current = await t.findUnique({ where: { id } });
    if (!current) return notFound;
    if (expectedVersion === null || current.version !== expectedVersion) {
      return {
        ok: false as const,
        reason: "conflict" as const,
        message: `This ${TEMPLATE_LABELS[kind].one} was changed since you opened it (by another person or tab). Your edits are still in the form; nothing was saved.`,
        currentVersion: current.version,
      };
    }
    const res = await t.updateMany({ where: { id, version: expectedVersion }, data: { ...toRow(kind, data), version: { increment: 1 } } });
    if (res.count !== 1) throw new VersionMoved(); // rolls the transaction back
    await clearOtherDefaults();
    await audit(id, expectedVersion + 1, "updated");
    return { ok: true as const, id, version: expectedVersion + 1 };
  }).catch((e: unknown): SaveResult => {
    if (e instanceof VersionMoved) return { ok: false, reason: "conflict", message: `This ${TEMPLATE_LABELS[kind].one} was changed since you opened it.`, currentVersion: null };
    if (isUniqueViolation(e)) return nameTakenResult;
    throw e;
  });
}

class VersionMoved extends Error {}

/** Deletes a template. Saved plans hold their own snapshot, so they are not touched. */
export async function deleteTemplate(
  db: Db,
  kind: TemplateKind,
  rawId: number | string,
  actor: Actor = null,
): Promise<{ ok: true } | { ok: false; reason: "not_found" | "in_use"; message: string }> {
  const d = delegateFor(db, kind);
  const id = parseId(rawId);
  const row = id === null ? null : await d.findUnique({ where: { id } });
  if (!row || id === null) return { ok: false, reason: "not_found", message: `No ${TEMPLATE_LABELS[kind].one} with id ${String(rawId).slice(0, 40)}` };
  if (kind === "materials") {
    const users = (await listTemplates(db, "shippers")).filter(
      (s) =>
        s.data.finishMaterial === row.name ||
        s.data.wallLayers.some((l) => l.material === row.name) ||
        (s.data.lidLayers ?? []).some((l) => l.material === row.name),
    );
    if (users.length) {
      return { ok: false, reason: "in_use", message: `"${String(row.name)}" is used by ${users.map((u) => `"${u.data.name}"`).join(", ")}; change those boxes first` };
    }
  }
  // deleteMany: a row deleted meanwhile by someone else is "not found", not a database error.
  const count = await libraryTransaction(db, async (tx) => {
    const gone = await delegateFor(tx, kind).deleteMany({ where: { id } });
    if (kind === "rulesets" && gone.count === 1) {
      const snapshot = fromRow("rulesets", row);
      await recordRuleSetChange(tx, { ruleSetId: id, ruleSetName: snapshot.name, action: "deleted", version: row.version, snapshot, actor });
    }
    return gone.count;
  });
  return count === 1 ? { ok: true } : { ok: false, reason: "not_found", message: `No ${TEMPLATE_LABELS[kind].one} with id ${id}` };
}

/** Copies a template under a free name ("X (copy)", "X (copy 2)", …). */
export async function duplicateTemplate(db: Db, kind: TemplateKind, id: number | string, actor: Actor = null): Promise<SaveResult> {
  const src = await getTemplate(db, kind, id);
  if (!src) return { ok: false, reason: "not_found", message: `No ${TEMPLATE_LABELS[kind].one} with id ${id}` };
  const base = `${(src.data as { name: string }).name} (copy`;
  let name = `${base})`;
  for (let n = 2; await nameTaken(db, kind, name, null); n++) name = `${base} ${n})`;
  const data = { ...src.data, name } as Record<string, unknown>;
  if (kind === "rulesets") data.isDefault = false;
  return saveTemplate(db, kind, null, null, data, actor);
}

export async function countTemplates(db: Db): Promise<number> {
  let n = 0;
  for (const k of Object.keys(MODEL) as TemplateKind[]) n += await delegateFor(db, k).count();
  return n;
}

export async function defaultRuleSet(db: Db): Promise<Stored<"rulesets"> | null> {
  const r = (await delegateFor(db, "rulesets").findFirst({ where: { isDefault: true } })) ?? (await delegateFor(db, "rulesets").findFirst({ orderBy: { id: "asc" } }));
  return r ? { id: r.id, version: r.version, updatedAt: r.updatedAt, data: fromRow("rulesets", r) } : null;
}

export { toRow };
