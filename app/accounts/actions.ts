"use server";
import { revalidatePath } from "next/cache";
import { getDb } from "@/app/_server/db";
import { authorize } from "@/app/_server/auth";
import { authMode } from "@/lib/db/auth-mode";
import { createAccount, setAccountDisabled } from "@/lib/db/accounts";
import type { FieldErrors } from "@/lib/schemas/errors";

/** Editors add accounts (the first one comes from `npm run account`). */
export async function createAccountAction(_prev: unknown, form: FormData): Promise<{ ok: boolean; message: string; fieldErrors: FieldErrors }> {
  const who = await authorize("edit");
  if (authMode() === "none" || !who.ok) return { ok: false, message: who.ok ? "This install has no accounts." : who.message, fieldErrors: {} };
  const r = await createAccount(await getDb(), {
    username: form.get("username"),
    displayName: form.get("displayName"),
    password: form.get("password"),
    role: form.get("role"),
  });
  if (!r.ok) return { ok: false, message: "Some fields need attention.", fieldErrors: r.fieldErrors };
  revalidatePath("/accounts");
  return { ok: true, message: `Account ${r.account.username} (${r.account.role}) created.`, fieldErrors: {} };
}

export async function setDisabledAction(form: FormData): Promise<void> {
  const who = await authorize("edit");
  if (authMode() === "none" || !who.ok) return;
  const id = Number(form.get("id"));
  if (!Number.isInteger(id) || id <= 0 || id === who.actor?.id) return; // nobody locks themselves out
  await setAccountDisabled(await getDb(), id, form.get("disabled") === "1");
  revalidatePath("/accounts");
}
