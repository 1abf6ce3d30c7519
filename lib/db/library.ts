/**
 * Export and import of the whole template library (the `holdline export` / `import`
 * file). Import validates every entry with the same zod schemas as the forms and the
 * API, checks cross-references, and applies everything in one transaction: an invalid
 * file changes nothing and names the entry and field that is wrong.
 */
import type { Db } from "./client";
import { libraryFileSchema, TEMPLATE_KINDS, type LibraryFile, type TemplateKind, templateSchemas } from "../schemas/templates";
import { describeIssues } from "../schemas/errors";
import { delegateFor, listTemplates, toRow } from "./templates";
import { getSettings } from "./settings";
import { libraryTransaction } from "./tx";
import { recordRuleSetChange, type Actor } from "./audit";

export async function exportLibrary(db: Db): Promise<LibraryFile> {
  const out: Record<string, unknown> = { format: "holdline-library", formatVersion: 1, settings: await getSettings(db) };
  for (const kind of TEMPLATE_KINDS) out[kind] = (await listTemplates(db, kind)).map((t) => t.data);
  return out as LibraryFile;
}

export type ImportResult =
  | { ok: true; created: number; updated: number }
  | { ok: false; errors: string[] };

export async function importLibrary(db: Db, file: unknown, actor: Actor = null): Promise<ImportResult> {
  if (typeof file !== "object" || file === null || Array.isArray(file)) {
    return { ok: false, errors: ["The file must hold one JSON object with format \"holdline-library\""] };
  }
  const errors: string[] = [];
  const head = libraryFileSchema.pick({ format: true, formatVersion: true, settings: true }).safeParse(file);
  if (!head.success) errors.push(...describeIssues(head.error));
  const parsed: Partial<Record<TemplateKind, unknown[]>> = {};
  for (const kind of TEMPLATE_KINDS) {
    const entries = (file as Record<string, unknown>)[kind];
    if (entries === undefined) continue;
    if (!Array.isArray(entries)) {
      errors.push(`${kind}: must be a list`);
      continue;
    }
    parsed[kind] = [];
    entries.forEach((e, i) => {
      const r = templateSchemas[kind].safeParse(e);
      const label = `${kind}[${i}]${e && typeof e === "object" && "name" in e ? ` ("${String((e as { name: unknown }).name)}")` : ""}`;
      if (!r.success) errors.push(...describeIssues(r.error, label));
      else parsed[kind]!.push(r.data);
    });
    const names = entries.map((e) => (e && typeof e === "object" ? (e as { name?: unknown }).name : undefined));
    names.forEach((n, i) => {
      if (n !== undefined && names.indexOf(n) !== i) errors.push(`${kind}[${i}].name: "${String(n)}" appears twice in the file`);
    });
  }
  if (errors.length) return { ok: false, errors };

  // Box layers and finishes must name a material in the file or already in the library.
  const known = new Set([
    ...(await listTemplates(db, "materials")).map((m) => m.data.name),
    ...((parsed.materials ?? []) as { name: string }[]).map((m) => m.name),
  ]);
  ((parsed.shippers ?? []) as { name: string; wallLayers: { material: string }[]; lidLayers: { material: string }[] | null; finishMaterial: string }[]).forEach(
    (s, i) => {
      s.wallLayers.forEach((l, j) => {
        if (!known.has(l.material)) errors.push(`shippers[${i}] ("${s.name}").wallLayers[${j}].material: no material named "${l.material}"`);
      });
      (s.lidLayers ?? []).forEach((l, j) => {
        if (!known.has(l.material)) errors.push(`shippers[${i}] ("${s.name}").lidLayers[${j}].material: no material named "${l.material}"`);
      });
      if (!known.has(s.finishMaterial)) errors.push(`shippers[${i}] ("${s.name}").finishMaterial: no material named "${s.finishMaterial}"`);
    },
  );
  const defaults = ((parsed.rulesets ?? []) as { isDefault: boolean }[]).filter((r) => r.isDefault).length;
  if (defaults > 1) errors.push(`rulesets: ${defaults} rule sets are marked as the default; mark one`);
  if (errors.length) return { ok: false, errors };

  let created = 0;
  let updated = 0;
  await libraryTransaction(db, async (tx) => {
    const txDb = tx;
    if (defaults === 1) await delegateFor(txDb, "rulesets").updateMany({ where: { isDefault: true }, data: { isDefault: false } });
    for (const kind of TEMPLATE_KINDS) {
      for (const entry of (parsed[kind] ?? []) as { name: string }[]) {
        const d = delegateFor(txDb, kind);
        const row = toRow(kind, entry as never);
        const existing = await d.findUnique({ where: { name: entry.name } });
        const saved = existing
          ? await d.update({ where: { id: existing.id }, data: { ...row, version: { increment: 1 } } })
          : await d.create({ data: row });
        if (existing) updated++;
        else created++;
        if (kind === "rulesets") {
          await recordRuleSetChange(txDb, { ruleSetId: saved.id, ruleSetName: entry.name, action: "imported", version: saved.version, snapshot: entry, actor });
        }
      }
    }
    if (head.success && head.data.settings) {
      await tx.setting.upsert({ where: { id: 1 }, create: { id: 1, ...head.data.settings }, update: head.data.settings });
    }
  });
  return { ok: true, created, updated };
}
