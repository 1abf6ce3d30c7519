import { describe, it, expect } from "vitest";
import { guard, allowedHostnames, hostnameOf, SESSION_COOKIE } from "../../app/_server/guard";

const req = (url: string, init: RequestInit & { headers?: Record<string, string> } = {}) => new Request(url, init);
const LOCAL = { host: "127.0.0.1:3104" };

describe("request guard: hosts", () => {
  it("reads host names with ports and IPv6 brackets", () => {
    expect(hostnameOf("127.0.0.1:3000")).toBe("127.0.0.1");
    expect(hostnameOf("[::1]:3000")).toBe("[::1]");
    expect(hostnameOf("Kitchen.Local")).toBe("kitchen.local");
  });
  it("admits loopback by default and the configured names only", async () => {
    expect([...allowedHostnames({})].sort()).toEqual(["127.0.0.1", "::1", "[::1]", "localhost"].sort());
    expect(allowedHostnames({ HOLDLINE_HOST: "0.0.0.0", HOLDLINE_ALLOWED_HOSTS: "192.168.1.20, kitchen.local" }).has("kitchen.local")).toBe(true);
    expect(await guard(req("http://x/", { headers: { host: "localhost:3000" } }), {})).toBeNull();
    expect((await guard(req("http://x/", { headers: { host: "attacker.example" } }), {}))!.status).toBe(403);
  });
});

describe("request guard: cross-site writes", () => {
  it("needs a matching Origin or Sec-Fetch-Site: same-origin, and JSON", async () => {
    const post = (h: Record<string, string>) => guard(req("http://127.0.0.1:3104/api/v1/products", { method: "POST", headers: { ...LOCAL, ...h }, body: "{}" }), {});
    expect(await post({ origin: "http://127.0.0.1:3104", "content-type": "application/json" })).toBeNull();
    expect(await post({ "sec-fetch-site": "same-origin", "content-type": "application/json; charset=utf-8" })).toBeNull();
    expect((await post({ origin: "http://evil.example", "content-type": "application/json" }))!.status).toBe(403);
    expect((await post({ origin: "null", "content-type": "application/json" }))!.status).toBe(403);
    expect((await post({ "sec-fetch-site": "cross-site", "content-type": "application/json" }))!.status).toBe(403);
    expect((await post({ origin: "http://127.0.0.1:3104", "content-type": "text/plain" }))!.status).toBe(415);
    expect((await post({ origin: "http://127.0.0.1:3104", "content-type": "application/x-www-form-urlencoded" }))!.status).toBe(415);
    const del = await guard(req("http://127.0.0.1:3104/api/v1/products/1", { method: "DELETE", headers: { ...LOCAL, origin: "http://127.0.0.1:3104" } }), {});
    expect(del).toBeNull();
  });
  it("reads are not blocked by a missing Origin", async () => {
    expect(await guard(req("http://127.0.0.1:3104/api/v1/products", { headers: LOCAL }), {})).toBeNull();
  });
});

describe("request guard: passphrase when shared", () => {
  const env = { HOLDLINE_HOST: "0.0.0.0", HOLDLINE_ALLOWED_HOSTS: "kitchen.local", HOLDLINE_PASSPHRASE: "correct horse battery" };
  const H = { host: "kitchen.local:3000" };
  it("the API wants the bearer token", async () => {
    expect((await guard(req("http://kitchen.local:3000/api/v1/products", { headers: H }), env))!.status).toBe(401);
    expect((await guard(req("http://kitchen.local:3000/api/v1/products", { headers: { ...H, authorization: "Bearer wrong" } }), env))!.status).toBe(401);
    expect(await guard(req("http://kitchen.local:3000/api/v1/products", { headers: { ...H, authorization: "Bearer correct horse battery" } }), env)).toBeNull();
  });
  it("pages redirect to the sign-in, which sets a session cookie for the right passphrase only", async () => {
    const page = await guard(req("http://kitchen.local:3000/hold?plan=2", { headers: H }), env);
    expect(page!.status).toBe(303);
    expect(page!.headers.get("location")).toBe("http://kitchen.local:3000/signin?next=%2Fhold%3Fplan%3D2");
    const form = await guard(req("http://kitchen.local:3000/signin?next=/hold", { headers: H }), env);
    expect(await form!.text()).toMatch(/passphrase/i);
    const signIn = (pass: string, next = "/hold") =>
      guard(req("http://kitchen.local:3000/signin", { method: "POST", headers: { ...H, origin: "http://kitchen.local:3000", "content-type": "application/x-www-form-urlencoded" }, body: new URLSearchParams({ passphrase: pass, next }).toString() }), env);
    expect((await signIn("guess"))!.status).toBe(401);
    const ok = await signIn("correct horse battery", "//evil.example/");
    expect(ok!.status).toBe(303);
    expect(ok!.headers.get("location")).toBe("http://kitchen.local:3000/"); // never off-site
    const cookie = ok!.headers.get("set-cookie")!;
    expect(cookie).toMatch(new RegExp(`^${SESSION_COOKIE}=[0-9a-f]{64}; Path=/; HttpOnly; SameSite=Strict`));
    const value = cookie.split(";")[0];
    expect(await guard(req("http://kitchen.local:3000/hold", { headers: { ...H, cookie: value } }), env)).toBeNull();
    expect(await guard(req("http://kitchen.local:3000/api/v1/products", { headers: { ...H, cookie: value } }), env)).toBeNull();
    expect((await guard(req("http://kitchen.local:3000/hold", { headers: { ...H, cookie: `${SESSION_COOKIE}=${"0".repeat(64)}` } }), env))!.status).toBe(303);
  });
});
