"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/app/_server/db";
import { authorize } from "@/app/_server/auth";
import { authMode } from "@/lib/db/auth-mode";
import { createAccount, setAccountDisabled } from "@/lib/db/accounts";
import type { FieldErrors } from "@/lib/schemas/errors";

/** Editors add accounts (the first one comes from `npm run account`). */
export interface NewAccountState {
  ok: boolean;
  message: string;
  fieldErrors: FieldErrors;
  /** What was typed (never the password), so a refused form shows it again. */
  values: { username: string; displayName: string; role: string };
}

export async function createAccountAction(_prev: unknown, form: FormData): Promise<NewAccountState> {
  const text = (k: string) => String(form.get(k) ?? "").slice(0, 200);
  const values = { username: text("username"), displayName: text("displayName"), role: text("role") };
  const who = await authorize("edit");
  if (authMode() === "none" || !who.ok) return { ok: false, message: who.ok ? "This install has no accounts." : who.message, fieldErrors: {}, values };
  const r = await createAccount(await getDb(), {
    username: form.get("username"),
    displayName: form.get("displayName"),
    password: form.get("password"),
    role: form.get("role"),
  });
  if (!r.ok) return { ok: false, message: "Some fields need attention.", fieldErrors: r.fieldErrors, values };
  revalidatePath("/accounts");
  return { ok: true, message: `Account ${r.account.username} (${r.account.role}) created.`, fieldErrors: {}, values: { username: "", displayName: "", role: "planner" } };
}

export async function setDisabledAction(form: FormData): Promise<void> {
  const who = await authorize("edit");
  if (authMode() === "none" || !who.ok) return;
  const id = Number(form.get("id"));
  if (!Number.isInteger(id) || id <= 0 || id === who.actor?.id) return; // nobody locks themselves out
  await setAccountDisabled(await getDb(), id, form.get("disabled") === "1");
  revalidatePath("/accounts");
}
