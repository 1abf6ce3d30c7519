"use server";
import { redirect } from "next/navigation";
import { headers } from "next/headers";
import { safeNext, signIn, signOut } from "@/app/_server/session";

export async function signInAction(form: FormData): Promise<void> {
  const next = safeNext(form.get("next"));
  const secure = (await headers()).get("x-forwarded-proto") === "https";
  const s = await signIn(form.get("username"), form.get("password"), secure);
  if (!s) redirect(`/signin?failed=1&next=${encodeURIComponent(next)}`);
  if ("wait_s" in s) redirect(`/signin?wait=${s.wait_s}&next=${encodeURIComponent(next)}`);
  redirect(next);
}

export async function signOutAction(): Promise<void> {
  await signOut();
  redirect("/signin");
}
