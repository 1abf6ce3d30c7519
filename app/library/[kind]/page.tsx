import Link from "next/link";
import { notFound } from "next/navigation";
import { getDb } from "@/app/_server/db";
import { currentUnits } from "@/app/_server/units";
import { listTemplates } from "@/lib/db/templates";
import { isTemplateKind, TEMPLATE_LABELS } from "@/lib/schemas/templates";
import { formatQuantity } from "@/lib/units";
import { LIST_COLUMNS, getPath } from "@/app/_components/template-fields";
import { RowActions } from "@/app/_components/RowActions";

export default async function TemplateList({ params, searchParams }: { params: Promise<{ kind: string }>; searchParams: Promise<{ saved?: string }> }) {
  const { kind } = await params;
  const { saved } = await searchParams;
  if (!isTemplateKind(kind)) notFound();
  const [rows, units] = await Promise.all([listTemplates(await getDb(), kind), currentUnits()]);
  const labels = TEMPLATE_LABELS[kind];
  return (
    <>
      <div className="page-head">
        <h1>{labels.many}</h1>
        <Link className="button" href={`/library/${kind}/new`}>
          New {labels.one}
        </Link>
      </div>
      {saved ? (
        <p className="banner ok" role="status">
          Saved.
        </p>
      ) : null}
      {rows.length === 0 ? (
        <p>No {labels.many.toLowerCase()} yet.</p>
      ) : (
        <table className="list" data-testid="template-list">
          <thead>
            <tr>
              <th>Name</th>
              {LIST_COLUMNS[kind].map((c) => (
                <th key={c.path}>{c.label}</th>
              ))}
              <th />
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => {
              const name = (r.data as { name: string }).name;
              return (
                <tr key={r.id} data-name={name}>
                  <td>
                    <Link href={`/library/${kind}/${r.id}`}>{name}</Link>
                  </td>
                  {LIST_COLUMNS[kind].map((c) => {
                    const v = getPath(r.data, c.path);
                    const text =
                      typeof v === "number" && c.quantity ? formatQuantity(c.quantity, v, units) : typeof v === "boolean" ? (v ? "yes" : "") : String(v ?? "—");
                    return <td key={c.path}>{text}</td>;
                  })}
                  <td>
                    <RowActions kind={kind} id={r.id} name={name} />
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
    </>
  );
}
