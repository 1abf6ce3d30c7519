import { parseId } from "@/lib/schemas/id";
import Link from "next/link";
import { notFound } from "next/navigation";
import { getDb } from "@/app/_server/db";
import { ruleSetHistory } from "@/lib/db/audit";
import { TEMPLATE_FIELDS, type FieldSpec } from "@/app/_components/template-fields";

const ACTION_LABEL: Record<string, string> = { created: "Created", updated: "Changed", deleted: "Deleted", imported: "Imported" };

/** Field labels of the rule-set form, so the history names fields as the form does (every field, also ones added later). */
const LABELS = new Map<string, string>(
  (function flat(specs: FieldSpec[]): [string, string][] {
    return specs.flatMap((s) => (s.kind === "group" ? flat(s.fields) : [[s.name, s.label] as [string, string]]));
  })(TEMPLATE_FIELDS.rulesets),
);

/** Stored values are SI: the unit is in the field name. */
function show(key: string, v: unknown): string {
  if (v === null || v === undefined) return "none";
  if (typeof v === "boolean") return v ? "yes" : "no";
  if (typeof v === "number") return key.endsWith("_C") ? `${v} °C` : key.endsWith("_s") ? `${v} s` : String(v);
  const s = String(v);
  return s.length > 80 ? s.slice(0, 77) + "…" : s;
}

function differences(now: Record<string, unknown>, before: Record<string, unknown> | null): string[] {
  const keys = [...new Set([...Object.keys(now), ...Object.keys(before ?? {})])];
  return keys
    .filter((k) => !before || JSON.stringify(now[k] ?? null) !== JSON.stringify(before[k] ?? null))
    .map((k) => `${LABELS.get(k) ?? k}: ${before ? `${show(k, before[k])} → ` : ""}${show(k, now[k])}`);
}

/** Every recorded change to one rule set, newest first: who, when, and what changed from the entry before. */
export default async function RuleSetHistoryPage({ params }: { params: Promise<{ kind: string; id: string }> }) {
  const { kind, id } = await params;
  const n = parseId(id);
  if (kind !== "rulesets" || n === null) notFound();
  const rows = await ruleSetHistory(await getDb(), n);
  if (!rows.length) notFound();
  return (
    <>
      <h1>History of rule set: {rows[0].ruleSetName}</h1>
      <p className="muted">
        Every change to this rule set, newest first, with who made it and when (UTC), and what changed from the entry before (values in °C and seconds, as
        stored). <Link href={`/library/rulesets/${id}`}>Back to the rule set</Link> · <Link href={`/api/v1/rulesets/${id}/history`}>as JSON</Link>
      </p>
      <table className="list" data-testid="ruleset-history">
        <thead>
          <tr>
            <th>When (UTC)</th>
            <th>Who</th>
            <th>What</th>
            <th>Version</th>
            <th>Changes</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r, i) => {
            const now = (r.snapshot ?? {}) as Record<string, unknown>;
            const before = i + 1 < rows.length ? ((rows[i + 1].snapshot ?? {}) as Record<string, unknown>) : null;
            const diff = r.action === "deleted" ? ["deleted (its last saved values are in the entry below)"] : differences(now, before);
            return (
              <tr key={r.id}>
                <td>{r.at.toISOString().slice(0, 19).replace("T", " ")}</td>
                <td>{r.byName}</td>
                <td>{ACTION_LABEL[r.action] ?? r.action}</td>
                <td>{r.version}</td>
                <td>
                  {diff.length ? (
                    <ul className="facts">
                      {diff.map((d) => (
                        <li key={d}>{d}</li>
                      ))}
                    </ul>
                  ) : (
                    "no change to any value"
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </>
  );
}
