import { notFound } from "next/navigation";
import { decodeHandoff } from "@/lib/planners/handoff";
import { candidateHandoffSchema } from "@/lib/planners/size";
import { PackOutSheet } from "./PackOutSheet";

/** The pack-out sheet of a sizer candidate carried in the address (`?from=…`): nothing is saved. */
export default async function CandidatePackOutSheet({ searchParams }: { searchParams: Promise<{ from?: string | string[] }> }) {
  const { from } = await searchParams;
  const carried = candidateHandoffSchema.safeParse(await decodeHandoff(from));
  if (!carried.success) notFound();
  return <PackOutSheet input={carried.data.input} saved={false} />;
}
