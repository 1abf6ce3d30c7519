// Accounts mode in the browser: sign-in, roles, sign-out and the rule-set history page.
// On PostgreSQL when HOLDLINE_TEST_PG_URL names a server (a new database is made and dropped),
// else on a SQLite file with HOLDLINE_AUTH=accounts.
import { describe, it, before, after } from "node:test";
import assert from "node:assert/strict";
import { spawn, type ChildProcess } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import { chromium, type BrowserContext, type Page } from "playwright-core";
import { chromiumPath } from "./harness";
import { tempPostgresDatabase, tempSqliteDatabase } from "../helpers/tempdb";
import { createAccount } from "../../lib/db/accounts";

let server: ChildProcess;
let context: BrowserContext;
let page: Page;
let base = "";
let disposeDb: () => Promise<void>;
const tmp = mkdtempSync(path.join(os.tmpdir(), "holdline-e2e-accounts-"));

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = net.createServer();
    s.listen(0, "127.0.0.1", () => {
      const p = (s.address() as net.AddressInfo).port;
      s.close(() => resolve(p));
    });
  });

before(async () => {
  process.env.HOLDLINE_BCRYPT_COST = "4";
  const t = process.env.HOLDLINE_TEST_PG_URL ? await tempPostgresDatabase({ seed: true }) : await tempSqliteDatabase({ seed: true });
  disposeDb = t.dispose;
  for (const [u, n, role] of [["edda", "Edda Editor", "editor"], ["pat", "Pat Planner", "planner"]] as const) {
    const r = await createAccount(t.db, { username: u, displayName: n, password: `${u}-password-1`, role });
    assert.ok(r.ok);
  }
  await t.db.$disconnect();
  const port = await freePort();
  base = `http://127.0.0.1:${port}`;
  server = spawn(path.resolve("node_modules", ".bin", "next"), ["start", "-H", "127.0.0.1", "-p", String(port)], {
    env: { ...process.env, DATABASE_URL: t.dbPath, HOLDLINE_AUTH: "accounts", NEXT_TELEMETRY_DISABLED: "1" },
    stdio: ["ignore", "ignore", "inherit"],
    detached: true,
  });
  for (let i = 0; ; i++) {
    try {
      if ((await fetch(base + "/api/v1/session")).ok) break;
    } catch {}
    if (i > 200) throw new Error("next start did not answer");
    await new Promise((r) => setTimeout(r, 300));
  }
  context = await chromium.launchPersistentContext(path.join(tmp, "profile"), {
    executablePath: chromiumPath(),
    headless: true,
    args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
  });
  page = await context.newPage();
  page.setDefaultTimeout(15000);
});

after(async () => {
  await context?.close().catch(() => {});
  try {
    process.kill(-server.pid!, "SIGTERM");
  } catch {}
  await new Promise((r) => setTimeout(r, 500));
  await disposeDb?.();
  rmSync(tmp, { recursive: true, force: true });
});

async function signIn(user: string, password: string) {
  await page.getByLabel("Username").fill(user);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
}

describe("accounts in the browser", () => {
  it("sends a visitor to sign in, refuses a wrong password, and returns to the page asked for", async () => {
    await page.goto(base + "/library/rulesets");
    await page.waitForURL(/\/signin\?next=%2Flibrary%2Frulesets/);
    await signIn("pat", "wrong-password");
    await page.getByText("Unknown username or wrong password").waitFor();
    await signIn("pat", "pat-password-1");
    await page.waitForURL(/\/library\/rulesets$/);
    assert.match(await page.getByTestId("signed-in").innerText(), /Pat Planner \(planner\)/);
  });

  it("tells a planner that only an editor can change a rule set, and saves nothing", async () => {
    await page.getByTestId("template-list").getByRole("link", { name: "Canada", exact: true }).click();
    await page.getByLabel("Chilled food, upper limit").fill("3");
    await page.getByRole("button", { name: /Save this rule set/ }).click();
    await page.getByTestId("form-banner").getByText(/Only an editor can change/).waitFor();
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL(/\/signin/);
    await page.goto(base + "/plans");
    await page.waitForURL(/\/signin/);
  });

  it("lets an editor change it, and the history page shows who, what and the new limit", async () => {
    await signIn("edda", "edda-password-1");
    await page.waitForURL(/\/plans$/);
    await page.goto(base + "/library/rulesets");
    await page.getByTestId("template-list").getByRole("link", { name: "Canada", exact: true }).click();
    await page.getByLabel("Chilled food, upper limit").fill("3");
    await page.getByRole("button", { name: /Save this rule set/ }).click();
    await page.waitForURL(/\/library\/rulesets\?saved=/);
    await page.getByTestId("template-list").getByRole("link", { name: "Canada", exact: true }).click();
    await page.getByRole("link", { name: "History of this rule set" }).click();
    const table = page.getByTestId("ruleset-history");
    await table.waitFor();
    const firstRow = await table.locator("tbody tr").first().innerText();
    assert.match(firstRow, /Edda Editor/);
    assert.match(firstRow, /Changed/);
    assert.match(firstRow, /Chilled food, upper limit: 4 °C → 3 °C/);
    assert.match(await table.locator("tbody tr").last().innerText(), /Imported/);
  });

  it("lets an editor add an account, with field messages, and the new person can sign in", async () => {
    await page.getByRole("link", { name: "Accounts" }).click();
    await page.getByTestId("accounts").waitFor();
    const form = page.getByTestId("new-account");
    await form.getByLabel("Username", { exact: true }).fill("cy");
    await form.getByLabel("Name", { exact: true }).fill("Cy Cook");
    await form.getByLabel(/Password/).fill("short");
    await form.getByRole("button", { name: "Add this account" }).click();
    await page.locator("#acct-password-err").getByText(/at least 10 characters/).waitFor();
    await form.getByLabel(/Password/).fill("cy-password-1");
    await form.getByRole("button", { name: "Add this account" }).click();
    await form.getByText("Account cy (planner) created.").waitFor();
    await page.reload();
    assert.match(await page.getByTestId("accounts").innerText(), /Cy Cook/);
    await page.getByRole("button", { name: "Sign out" }).click();
    await page.waitForURL(/\/signin/);
    await signIn("cy", "cy-password-1");
    await page.waitForURL((u) => !u.pathname.startsWith("/signin"));
    assert.match(await page.getByTestId("signed-in").innerText(), /Cy Cook \(planner\)/);
    await page.goto(base + "/accounts");
    await page.getByText("Only an editor can see and add accounts.").waitFor();
  });
});
