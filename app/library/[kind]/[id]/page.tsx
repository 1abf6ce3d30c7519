import { notFound } from "next/navigation";
import { getDb } from "@/app/_server/db";
import { getTemplate } from "@/lib/db/templates";
import { isTemplateKind, TEMPLATE_LABELS } from "@/lib/schemas/templates";
import { TemplateForm } from "@/app/_components/TemplateForm";
import { materialOptions } from "@/app/_server/form-data";
import Link from "next/link";

export default async function EditTemplate({ params }: { params: Promise<{ kind: string; id: string }> }) {
  const { kind, id } = await params;
  if (!isTemplateKind(kind)) notFound();
  const t = await getTemplate(await getDb(), kind, id);
  if (!t) notFound();
  return (
    <>
      <h1>
        Edit {TEMPLATE_LABELS[kind].one}: {(t.data as { name: string }).name}
      </h1>
      <p className="muted">Version {t.version}, last saved {t.updatedAt.toISOString().slice(0, 16).replace("T", " ")} UTC.
        {kind === "rulesets" ? (
          <>
            {" "}
            <Link href={`/library/rulesets/${t.id}/history`}>History of this rule set</Link>
          </>
        ) : null}
      </p>
      <TemplateForm kind={kind} id={t.id} version={t.version} initial={t.data as Record<string, unknown>} materials={await materialOptions()} />
    </>
  );
}
