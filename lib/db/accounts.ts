/**
 * Accounts for a shared database: people sign in with a username and a password
 * (hashed with bcrypt through bcryptjs), and have one of two roles. Editors change
 * templates, rule sets and settings and make plans; planners make plans and read the library.
 * A sign-in makes a session: a random token the browser keeps in a cookie (or an API
 * client sends as `Authorization: Bearer …`); only its sha256 is stored.
 */
import bcrypt from "bcryptjs";
import { createHash, randomBytes } from "node:crypto";
import { z } from "zod";
import type { Db } from "./client";
import { ROLES, type Actor, type Role } from "./audit";
import { fieldErrorsOf, type FieldErrors } from "../schemas/errors";
import { isUniqueViolation } from "./tx";

/** bcrypt cost: 2^12 rounds (≈ 0.2–0.4 s in bcryptjs here). Tests may lower it through HOLDLINE_BCRYPT_COST. */
function bcryptCost(): number {
  const n = Number(process.env.HOLDLINE_BCRYPT_COST);
  return Number.isInteger(n) && n >= 4 && n <= 15 ? n : 12;
}

export const SESSION_TTL_S = 12 * 3600;

export const accountSchema = z.object({
  username: z
    .string()
    .trim()
    .toLowerCase()
    .regex(/^[a-z0-9._-]{2,64}$/, { error: "Username: 2 to 64 letters, digits, dots, dashes or underscores" }),
  displayName: z.string().trim().min(1, { error: "Name: enter the person's name" }).max(120),
  password: z
    .string()
    .min(10, { error: "Password: at least 10 characters" })
    .max(72, { error: "Password: at most 72 characters (bcrypt reads no further)" }),
  role: z.enum(ROLES, { error: "Role: editor or planner" }),
});
export type AccountInput = z.input<typeof accountSchema>;

export interface AccountView {
  id: number;
  username: string;
  displayName: string;
  role: Role;
  disabled: boolean;
  createdAt: Date;
}

const view = (a: { id: number; username: string; displayName: string; role: string; disabled: boolean; createdAt: Date }): AccountView => ({
  id: a.id,
  username: a.username,
  displayName: a.displayName,
  role: a.role as Role,
  disabled: a.disabled,
  createdAt: a.createdAt,
});

export async function createAccount(db: Db, input: unknown): Promise<{ ok: true; account: AccountView } | { ok: false; fieldErrors: FieldErrors }> {
  const parsed = accountSchema.safeParse(input);
  if (!parsed.success) return { ok: false, fieldErrors: fieldErrorsOf(parsed.error) };
  const { password, ...rest } = parsed.data;
  const passwordHash = await bcrypt.hash(password, bcryptCost());
  try {
    const row = await db.account.create({ data: { ...rest, passwordHash } });
    return { ok: true, account: view(row) };
  } catch (e) {
    if (isUniqueViolation(e)) return { ok: false, fieldErrors: { username: [`An account called "${rest.username}" already exists`] } };
    throw e;
  }
}

export async function listAccounts(db: Db): Promise<AccountView[]> {
  return (await db.account.findMany({ orderBy: { username: "asc" } })).map(view);
}

export async function countAccounts(db: Db): Promise<number> {
  return db.account.count();
}

/** A hash of a password nobody has, so an unknown username costs the same time as a wrong password. */
let dummyHash: string | null = null;

/** The account if the username and password match and it is not disabled; null otherwise. */
export async function verifyCredentials(db: Db, username: unknown, password: unknown): Promise<AccountView | null> {
  if (typeof username !== "string" || typeof password !== "string" || password.length > 1000) return null;
  const row = await db.account.findUnique({ where: { username: username.trim().toLowerCase() } });
  dummyHash ??= await bcrypt.hash(randomBytes(16).toString("hex"), bcryptCost());
  const ok = await bcrypt.compare(password, row?.passwordHash ?? dummyHash);
  return row && ok && !row.disabled ? view(row) : null;
}

export const hashToken = (token: string): string => createHash("sha256").update(token).digest("hex");

export async function createSession(db: Db, accountId: number, ttl_s = SESSION_TTL_S): Promise<{ token: string; expiresAt: Date }> {
  const token = randomBytes(32).toString("base64url");
  const expiresAt = new Date(Date.now() + ttl_s * 1000);
  await db.accountSession.create({ data: { id: hashToken(token), accountId, expiresAt } });
  // Expired sessions are cleared as new ones are made.
  await db.accountSession.deleteMany({ where: { expiresAt: { lt: new Date() } } });
  return { token, expiresAt };
}

/** The actor a session token stands for, or null when it is unknown, expired or its account is disabled. */
export async function sessionActor(db: Db, token: string | null | undefined): Promise<Actor> {
  if (!token || token.length > 200) return null;
  const s = await db.accountSession.findUnique({ where: { id: hashToken(token) } });
  if (!s || s.expiresAt.getTime() <= Date.now()) return null;
  const a = await db.account.findUnique({ where: { id: s.accountId } });
  if (!a || a.disabled) return null;
  return { id: a.id, name: a.displayName, role: a.role as Role };
}

export async function endSession(db: Db, token: string): Promise<void> {
  await db.accountSession.deleteMany({ where: { id: hashToken(token) } });
}

/** Disabling an account ends its sessions at once. */
export async function setAccountDisabled(db: Db, id: number, disabled: boolean): Promise<boolean> {
  const r = await db.account.updateMany({ where: { id }, data: { disabled } });
  if (disabled) await db.accountSession.deleteMany({ where: { accountId: id } });
  return r.count === 1;
}
