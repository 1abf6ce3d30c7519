import { notFound } from "next/navigation";
import { getDb } from "@/app/_server/db";
import { getPlan } from "@/lib/db/plans";
import { holdInputSchema } from "@/lib/schemas/hold";
import { PackOutSheet } from "../PackOutSheet";

/** The pack-out sheet of a saved hold plan: its own snapshot of the inputs, worked out in the browser's workers. */
export default async function SavedPackOutSheet({ params }: { params: Promise<{ id: string }> }) {
  const { id } = await params;
  const plan = await getPlan(await getDb(), id);
  if (!plan || plan.kind !== "hold") notFound();
  const parsed = holdInputSchema.safeParse(plan.input);
  if (!parsed.success) notFound();
  return <PackOutSheet name={plan.name} input={parsed.data} saved />;
}
