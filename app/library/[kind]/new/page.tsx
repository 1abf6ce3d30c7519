import { notFound } from "next/navigation";
import { isTemplateKind, TEMPLATE_LABELS } from "@/lib/schemas/templates";
import { BLANK_TEMPLATES } from "@/lib/schemas/blank";
import { TemplateForm } from "@/app/_components/TemplateForm";
import { materialOptions } from "@/app/_server/form-data";

export default async function NewTemplate({ params }: { params: Promise<{ kind: string }> }) {
  const { kind } = await params;
  if (!isTemplateKind(kind)) notFound();
  return (
    <>
      <h1>New {TEMPLATE_LABELS[kind].one}</h1>
      <TemplateForm kind={kind} id={null} version={null} initial={BLANK_TEMPLATES[kind]} materials={await materialOptions()} />
    </>
  );
}
