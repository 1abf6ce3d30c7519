/**
 * The served app under hostile conditions (no browser needed): the crash test — kill -9 the server during
 * a stream of writes, restart, PRAGMA integrity_check, and count that no acknowledged write was lost — and
 * the pages and headers a real `next start` gives (strict ids on pages, security headers, the proxy's
 * cross-site and host checks, a cheap GET answering while heavy calculations run).
 */
import { describe, it, before, after } from "node:test";
import assert from "node:assert/strict";
import { mkdtempSync, rmSync } from "node:fs";
import http from "node:http";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import Database from "better-sqlite3";
import { startNextServer, type RunningServer } from "../../scripts/next-server";

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const srv = net.createServer();
    srv.once("error", reject);
    srv.listen(0, "127.0.0.1", () => {
      const port = (srv.address() as net.AddressInfo).port;
      srv.close(() => resolve(port));
    });
  });
}

const tmp = mkdtempSync(path.join(os.tmpdir(), "holdline-robust-"));
after(() => rmSync(tmp, { recursive: true, force: true }));

describe("crash test: kill -9 during writes", () => {
  const dbPath = path.join(tmp, "crash.db");
  let server: RunningServer | null = null;
  after(async () => {
    await server?.stop();
  });

  it("loses no acknowledged write over three kills, and the database stays intact", async () => {
    const port = await freePort();
    server = await startNextServer({ port, dbPath });
    const origin = server.baseUrl;
    const template = (await (await fetch(origin + "/api/v1/products")).json())[0];
    delete template.id;
    delete template.version;
    const acknowledged: string[] = [];
    let attempted = 0;
    const totals = { kills: 0, attempted: 0, acknowledged: 0, found: 0, lost: 0, unacknowledgedButSaved: 0 };

    for (let round = 0; round < 3; round++) {
      const sent: string[] = [];
      let stop = false;
      const writer = async (w: number) => {
        for (let i = 0; !stop; i++) {
          const name = `Crash r${round} w${w} #${i}`;
          sent.push(name);
          attempted++;
          try {
            const r = await fetch(server!.baseUrl + "/api/v1/products", {
              method: "POST",
              headers: { "content-type": "application/json", origin },
              body: JSON.stringify({ ...template, name }),
            });
            if (r.status === 201) acknowledged.push(name);
            else if (!stop) assert.fail(`write answered ${r.status}: ${await r.text()}`);
          } catch {
            return; // the server died mid-request: not acknowledged
          }
        }
      };
      const writers = [0, 1, 2, 3].map(writer);
      // Kill once a good number of writes are in, at a moment that does not line up with any request.
      const target = acknowledged.length + 60 + round * 17;
      while (acknowledged.length < target) await new Promise((r) => setTimeout(r, 5));
      await new Promise((r) => setTimeout(r, 3 + round * 7));
      await server.kill9();
      totals.kills++;
      stop = true;
      await Promise.all(writers);

      const raw = new Database(dbPath);
      const check = raw.pragma("integrity_check", { simple: true });
      const saved = new Set((raw.prepare("SELECT name FROM Product").all() as { name: string }[]).map((r) => r.name));
      raw.close();
      assert.equal(check, "ok");
      const lost = acknowledged.filter((n) => !saved.has(n));
      assert.deepEqual(lost, [], `acknowledged writes lost after kill ${round + 1}`);
      totals.unacknowledgedButSaved += sent.filter((n) => saved.has(n) && !acknowledged.includes(n)).length;

      server = await startNextServer({ port, dbPath });
      const listed = new Set(((await (await fetch(server.baseUrl + "/api/v1/products")).json()) as { name: string }[]).map((p) => p.name));
      assert.deepEqual(acknowledged.filter((n) => !listed.has(n)), [], "the restarted server lists every acknowledged write");
    }
    totals.attempted = attempted;
    totals.acknowledged = acknowledged.length;
    totals.found = acknowledged.length;
    console.log("crash test:", JSON.stringify(totals));
  });
});

describe("served app: pages, headers and the proxy", () => {
  let server: RunningServer;
  before(async () => {
    server = await startNextServer({ port: await freePort(), dbPath: path.join(tmp, "served.db") });
  });
  after(async () => {
    await server?.stop();
  });

  it("pages with ids that are not ids answer 404, not 500", async () => {
    for (const p of [`/library/products/${"9".repeat(30)}`, `/plans/${"9".repeat(30)}`, "/library/products/1.5", "/plans/0x1", `/size/sheet/${"9".repeat(30)}`]) {
      const r = await fetch(server.baseUrl + p);
      await r.arrayBuffer();
      assert.equal(r.status, 404, p);
    }
    const ok = await fetch(server.baseUrl + "/library/products/1");
    await ok.arrayBuffer();
    assert.equal(ok.status, 200);
  });

  it("sends the security headers", async () => {
    const r = await fetch(server.baseUrl + "/");
    await r.arrayBuffer();
    assert.match(r.headers.get("content-security-policy") ?? "", /frame-ancestors 'none'/);
    assert.equal(r.headers.get("x-content-type-options"), "nosniff");
    assert.ok(r.headers.get("referrer-policy"));
  });

  it("refuses a cross-site text/plain write and a foreign Host", async () => {
    const body = JSON.stringify({ name: "Lenient", jurisdiction: "Nowhere", chilledMax_C: 20, isDefault: true });
    const evil = await fetch(server.baseUrl + "/api/v1/rulesets", { method: "POST", headers: { "content-type": "text/plain", origin: "http://evil.example" }, body });
    assert.equal(evil.status, 403);
    // fetch may not set Host; node:http can, as a rebinding page's browser would send it.
    const rebound = await new Promise<number>((resolve, reject) => {
      const u = new URL(server.baseUrl);
      http.get({ host: u.hostname, port: u.port, path: "/api/v1/rulesets", headers: { host: "evil.example" } }, (res) => (res.resume(), resolve(res.statusCode ?? 0))).on("error", reject);
    });
    assert.equal(rebound, 403);
    const page = await new Promise<number>((resolve, reject) => {
      const u = new URL(server.baseUrl);
      http.get({ host: u.hostname, port: u.port, path: "/", headers: { host: `rebound.example:${u.port}` } }, (res) => (res.resume(), resolve(res.statusCode ?? 0))).on("error", reject);
    });
    assert.equal(page, 403);
    const rules = (await (await fetch(server.baseUrl + "/api/v1/rulesets")).json()) as { name: string; isDefault: boolean }[];
    assert.ok(!rules.some((r) => r.name === "Lenient"));
  });

  it("a template list answers while heavy calculations run", async () => {
    const origin = server.baseUrl;
    const heavy = fetch(server.baseUrl + "/api/v1/size", {
      method: "POST",
      headers: { "content-type": "application/json", origin },
      body: JSON.stringify({
        products: [{ product: "Roast chicken thighs, half tray", count: 2, start_C: 3 }],
        route: "Overnight courier, Millbrook depot",
        boxes: [{ shipper: "Quillfield thick catering box", thicknessVariants_m: [0.03, 0.05] }],
        packs: [{ pack: "Gel pack, 600 g", maxCount: 30, conditioning_C: [-25, -18, -10] }],
        prune: false,
      }),
    });
    await new Promise((r) => setTimeout(r, 300));
    const r = await fetch(server.baseUrl + "/api/v1/products");
    assert.equal(r.status, 200);
    await r.arrayBuffer();
    // The list answered; the sizing is still running (or has just finished) in the pool.
    const s = await heavy;
    assert.ok(s.status === 200 || s.status === 422, `sizing answered ${s.status}`);
    await s.arrayBuffer();
  });
});

describe("served app shared with a passphrase", () => {
  let server: RunningServer;
  const pass = "correct horse battery staple";
  before(async () => {
    server = await startNextServer({ port: await freePort(), dbPath: path.join(tmp, "shared.db"), env: { HOLDLINE_PASSPHRASE: pass } });
  });
  after(async () => {
    await server?.stop();
  });

  it("pages go through the sign-in, the API wants the bearer token", async () => {
    const b = server.baseUrl;
    const page = await fetch(b + "/hold", { redirect: "manual" });
    assert.equal(page.status, 303);
    assert.match(page.headers.get("location") ?? "", /^(http:\/\/127\.0\.0\.1:\d+)?\/signin\?next=%2Fhold$/);
    assert.equal((await fetch(b + "/api/v1/products")).status, 401);
    assert.equal((await fetch(b + "/api/v1/products", { headers: { authorization: `Bearer ${pass}` } })).status, 200);
    const form = (body: Record<string, string>) => fetch(b + "/signin", { method: "POST", redirect: "manual", headers: { origin: b, "content-type": "application/x-www-form-urlencoded" }, body: new URLSearchParams(body).toString() });
    assert.equal((await form({ passphrase: "guess", next: "/hold" })).status, 401);
    const ok = await form({ passphrase: pass, next: "/hold" });
    assert.equal(ok.status, 303);
    const cookie = (ok.headers.get("set-cookie") ?? "").split(";")[0];
    const after = await fetch(b + "/hold", { headers: { cookie }, redirect: "manual" });
    assert.equal(after.status, 200);
    await after.arrayBuffer();
  });
});
