// Accounts, sessions, roles and the audit trail, on SQLite (npm test) and PostgreSQL (npm run test:pg).
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { tempDatabase } from "../helpers/tempdb";
import type { Db } from "../../lib/db/client";
import { createAccount, createSession, endSession, sessionActor, setAccountDisabled, verifyCredentials, listAccounts } from "../../lib/db/accounts";
import { ruleSetHistory, SINGLE_USER } from "../../lib/db/audit";
import { deleteTemplate, getTemplateByName, saveTemplate } from "../../lib/db/templates";
import { exportLibrary, importLibrary } from "../../lib/db/library";
import { getPlan, listPlans, savePlan } from "../../lib/db/plans";
import { authMode, can, decodeActor, encodeActor, isPublicPath } from "../../lib/db/auth-mode";
import { DEMO_SCENARIO } from "../../lib/db/demo-scenario";

process.env.HOLDLINE_BCRYPT_COST = "4"; // the smallest cost bcrypt allows, to keep the tests quick

let db: Db;
let dispose: () => Promise<void>;
beforeAll(async () => {
  ({ db, dispose } = await tempDatabase({ seed: true }));
});
afterAll(async () => dispose());

describe("accounts", () => {
  it("stores a bcrypt hash, never the password, and checks the fields", async () => {
    const r = await createAccount(db, { username: "Ana.Ruiz", displayName: "Ana Ruiz", password: "pass-word-123", role: "editor" });
    expect(r.ok).toBe(true);
    const row = await db.account.findUnique({ where: { username: "ana.ruiz" } });
    expect(row!.passwordHash).toMatch(/^\$2[aby]\$04\$/);
    expect(row!.passwordHash).not.toContain("pass-word-123");
    const short = await createAccount(db, { username: "bo", displayName: "Bo", password: "short", role: "planner" });
    expect(short.ok).toBe(false);
    if (!short.ok) expect(Object.keys(short.fieldErrors)).toEqual(["password"]);
    const role = await createAccount(db, { username: "cy", displayName: "Cy", password: "long-enough-1", role: "admin" });
    expect(role.ok).toBe(false);
    if (!role.ok) expect(Object.keys(role.fieldErrors)).toEqual(["role"]);
  });

  it("refuses a second account with the same username (any case) on the username field", async () => {
    const r = await createAccount(db, { username: "ANA.RUIZ", displayName: "Other", password: "pass-word-456", role: "planner" });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.fieldErrors.username[0]).toMatch(/already exists/);
    expect((await listAccounts(db)).filter((a) => a.username === "ana.ruiz").length).toBe(1);
  });

  it("signs in only with the right password and an enabled account", async () => {
    expect((await verifyCredentials(db, "ana.ruiz", "pass-word-123"))?.role).toBe("editor");
    expect(await verifyCredentials(db, "ana.ruiz", "pass-word-12")).toBeNull();
    expect(await verifyCredentials(db, "nobody", "pass-word-123")).toBeNull();
    expect(await verifyCredentials(db, { $ne: 1 }, "x")).toBeNull();
  });

  it("makes sessions that name the actor, end on sign-out, expire, and end when the account is disabled", async () => {
    const a = (await verifyCredentials(db, "ana.ruiz", "pass-word-123"))!;
    const s = await createSession(db, a.id);
    expect(await sessionActor(db, s.token)).toEqual({ id: a.id, name: "Ana Ruiz", role: "editor" });
    expect((await db.accountSession.findMany()).some((x) => x.id === s.token)).toBe(false); // only the hash is stored
    await endSession(db, s.token);
    expect(await sessionActor(db, s.token)).toBeNull();
    const old = await createSession(db, a.id, -1);
    expect(await sessionActor(db, old.token)).toBeNull();
    const p = await createAccount(db, { username: "dee", displayName: "Dee", password: "pass-word-789", role: "planner" });
    if (!p.ok) throw new Error("setup");
    const ps = await createSession(db, p.account.id);
    expect((await sessionActor(db, ps.token))?.role).toBe("planner");
    await setAccountDisabled(db, p.account.id, true);
    expect(await sessionActor(db, ps.token)).toBeNull();
    expect(await verifyCredentials(db, "dee", "pass-word-789")).toBeNull();
    expect(await sessionActor(db, "not-a-token")).toBeNull();
  });
});

describe("who may do what", () => {
  it("uses accounts for a postgresql:// database or HOLDLINE_AUTH=accounts, none for SQLite", () => {
    expect(authMode({ DATABASE_URL: "postgresql://u:p@db:5432/holdline" })).toBe("accounts");
    expect(authMode({ DATABASE_URL: "postgres://db/holdline" })).toBe("accounts");
    expect(authMode({ DATABASE_URL: "file:./data/x.db" })).toBe("none");
    expect(authMode({})).toBe("none");
    expect(authMode({ HOLDLINE_AUTH: "accounts" })).toBe("accounts");
  });

  it("lets editors edit and plan, planners only plan, and anyone in a single-user install", () => {
    const editor = { id: 1, name: "E", role: "editor" as const };
    const planner = { id: 2, name: "P", role: "planner" as const };
    expect([can("accounts", editor, "edit"), can("accounts", editor, "plan")]).toEqual([true, true]);
    expect([can("accounts", planner, "edit"), can("accounts", planner, "plan")]).toEqual([false, true]);
    expect([can("accounts", null, "edit"), can("accounts", null, "plan")]).toEqual([false, false]);
    expect([can("none", null, "edit"), can("none", null, "plan")]).toEqual([true, true]);
  });

  it("passes the actor between proxy and handlers intact, and refuses a forged or broken header", () => {
    const a = { id: 7, name: "Zoë, \"night\" shift", role: "planner" as const };
    expect(decodeActor(encodeActor(a))).toEqual(a);
    expect(decodeActor(encodeURIComponent(JSON.stringify({ id: 1, name: "x", role: "admin" })))).toBeNull();
    expect(decodeActor("%E0%A4%A")).toBeNull();
    expect(isPublicPath("/signin")).toBe(true);
    expect(isPublicPath("/api/v1/products")).toBe(false);
  });
});

describe("rule-set history", () => {
  const editor = { id: 1, name: "Ana Ruiz", role: "editor" as const };

  it("records create, update and delete with who, when, version and the limits as saved", async () => {
    const base = { ...structuredClone(DEMO_SCENARIO.rulesets[0]), name: "Audit test rules", isDefault: false };
    const c = await saveTemplate(db, "rulesets", null, null, base, editor);
    if (!c.ok) throw new Error("create failed");
    const u = await saveTemplate(db, "rulesets", c.id, c.version, { ...base, chilledMax_C: 4 }, { id: 2, name: "Bea Sol", role: "editor" });
    expect(u.ok).toBe(true);
    const stale = await saveTemplate(db, "rulesets", c.id, c.version, { ...base, chilledMax_C: 3 }, editor);
    expect(stale.ok).toBe(false);
    expect((await deleteTemplate(db, "rulesets", c.id, editor)).ok).toBe(true);
    const h = await ruleSetHistory(db, c.id);
    expect(h.map((x) => [x.action, x.byName, x.version])).toEqual([
      ["deleted", "Ana Ruiz", 2],
      ["updated", "Bea Sol", 2],
      ["created", "Ana Ruiz", 1],
    ]);
    expect((h[1].snapshot as { chilledMax_C: number }).chilledMax_C).toBe(4);
    expect((h[2].snapshot as { chilledMax_C: number }).chilledMax_C).toBe(base.chilledMax_C);
    expect(h.every((x) => x.at instanceof Date && Math.abs(x.at.getTime() - Date.now()) < 3600_000)).toBe(true);
  });

  it("records imports, and 'single user' without an actor; other templates keep no history", async () => {
    const file = await exportLibrary(db);
    expect((await importLibrary(db, file)).ok).toBe(true);
    const canada = await getTemplateByName(db, "rulesets", "Canada");
    const h = await ruleSetHistory(db, canada!.id);
    expect(h[0]).toMatchObject({ action: "imported", byName: SINGLE_USER, byAccountId: null, version: canada!.version });
    const before = await db.ruleSetChange.count();
    const p = await getTemplateByName(db, "products", "Whole turkey, 6 kg");
    expect((await saveTemplate(db, "products", p!.id, p!.version, { ...p!.data, notes: "x" }, editor)).ok).toBe(true);
    expect(await db.ruleSetChange.count()).toBe(before);
  });

  it("a plan records who saved it", async () => {
    const id = await savePlan(db, { kind: "thaw", name: "Turkey for Friday", input: { a: 1 }, result: { b: 2 } }, { id: 3, name: "Cal Ode", role: "planner" });
    expect((await getPlan(db, id))?.createdByName).toBe("Cal Ode");
    const solo = await savePlan(db, { kind: "thaw", name: "Solo", input: {}, result: {} });
    expect((await listPlans(db)).find((p) => p.id === solo)?.createdByName).toBeNull();
  });
});

describe("sign-in throttle", () => {
  it("locks a username after five wrong passwords, longer each time, and a success clears it", async () => {
    const { SignInThrottle, FREE_FAILURES } = await import("../../lib/db/sign-in-throttle");
    const t = new SignInThrottle();
    for (let i = 0; i < FREE_FAILURES - 1; i++) t.failed("ana", 0);
    expect(t.waitFor("ana", 0)).toBe(0);
    t.failed("ana", 0);
    expect(t.waitFor("ana", 0)).toBe(30_000);
    expect(t.waitFor("bo", 0)).toBe(0);
    t.failed("ana", 30_000);
    expect(t.waitFor("ana", 30_000)).toBe(60_000);
    t.succeeded("ana");
    expect(t.waitFor("ana", 30_001)).toBe(0);
  });
});
