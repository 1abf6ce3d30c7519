import Link from "next/link";
import { notFound } from "next/navigation";
import { getDb } from "@/app/_server/db";
import { ruleSetHistory } from "@/lib/db/audit";

const ACTION_LABEL = { created: "Created", updated: "Changed", deleted: "Deleted", imported: "Imported" } as const;
const LIMITS: [string, string][] = [
  ["chilledMax_C", "Chilled max (°C)"],
  ["frozenMax_C", "Frozen max (°C)"],
  ["hotHoldMin_C", "Hot hold min (°C)"],
  ["thawWaterMax_C", "Thaw water max (°C)"],
  ["outsideControlMax_s", "Outside control max (s)"],
  ["chillExcursionMax_s", "Chill excursion max (s)"],
  ["hotExcursionMax_s", "Hot excursion max (s)"],
  ["thawSurfaceAboveMax_s", "Thaw surface above max (s)"],
];

/** Every recorded change to one rule set, newest first, with who and when and the limits as saved. */
export default async function RuleSetHistoryPage({ params }: { params: Promise<{ kind: string; id: string }> }) {
  const { kind, id } = await params;
  if (kind !== "rulesets" || !/^[1-9]\d{0,9}$/.test(id)) notFound();
  const rows = await ruleSetHistory(await getDb(), Number(id));
  if (!rows.length) notFound();
  const fmt = (v: unknown) => (v === null || v === undefined ? "—" : String(v));
  return (
    <>
      <h1>History of rule set: {rows[0].ruleSetName}</h1>
      <p className="muted">
        Every change to this rule set&apos;s limits, newest first, with who made it and when (UTC). <Link href={`/library/rulesets/${id}`}>Back to the rule set</Link>
      </p>
      <table className="list" data-testid="ruleset-history">
        <thead>
          <tr>
            <th>When (UTC)</th>
            <th>Who</th>
            <th>What</th>
            <th>Version</th>
            {LIMITS.map(([, label]) => (
              <th key={label}>{label}</th>
            ))}
            <th>Default</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const s = (r.snapshot ?? {}) as Record<string, unknown>;
            return (
              <tr key={r.id}>
                <td>{r.at.toISOString().slice(0, 19).replace("T", " ")}</td>
                <td>{r.byName}</td>
                <td>{ACTION_LABEL[r.action] ?? r.action}</td>
                <td>{r.version}</td>
                {LIMITS.map(([k]) => (
                  <td key={k}>{fmt(s[k])}</td>
                ))}
                <td>{s.isDefault ? "yes" : "no"}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </>
  );
}
