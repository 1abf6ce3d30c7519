/**
 * The one gate every request passes (proxy.ts calls it): DNS rebinding, cross-site writes and, when the
 * app is exposed beyond this machine, the passphrase.
 *
 * - Host: the Host header must name this machine's loopback (127.0.0.1, localhost, [::1]) or an address
 *   listed in HOLDLINE_HOST / HOLDLINE_ALLOWED_HOSTS; a page on another site that rebinds its own name to
 *   127.0.0.1 is refused.
 * - State-changing API requests (anything but GET, HEAD, OPTIONS under /api/): an Origin that matches the
 *   served host, or, without Origin, `Sec-Fetch-Site: same-origin`; and a body must be application/json,
 *   which a cross-site form or a "simple" fetch cannot send without a preflight.
 * - With HOLDLINE_PASSPHRASE set: pages need a sign-in (a session cookie from /signin), the API needs
 *   `Authorization: Bearer <passphrase>` (or the session cookie, for the app's own pages).
 *
 * Server actions keep Next's own Origin check; they pass the Host and sign-in checks here like pages.
 * Pure apart from node:crypto, so the unit tests call it with plain Requests.
 */
import { createHmac, timingSafeEqual } from "node:crypto";

export const SESSION_COOKIE = "holdline_session";
const LOOPBACK = new Set(["127.0.0.1", "localhost", "[::1]", "::1"]);
const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

export interface GuardEnv {
  HOLDLINE_HOST?: string;
  HOLDLINE_ALLOWED_HOSTS?: string;
  HOLDLINE_PASSPHRASE?: string;
}

/** The hostname of a Host header or URL host ("127.0.0.1:3000" → "127.0.0.1", "[::1]:3000" → "[::1]"), lower case. */
export function hostnameOf(host: string): string {
  const h = host.trim().toLowerCase();
  if (h.startsWith("[")) return h.slice(0, h.indexOf("]") + 1);
  const colon = h.indexOf(":");
  return colon === -1 ? h : h.slice(0, colon);
}

export function allowedHostnames(env: GuardEnv): Set<string> {
  const out = new Set(LOOPBACK);
  for (const h of [env.HOLDLINE_HOST ?? "", ...(env.HOLDLINE_ALLOWED_HOSTS ?? "").split(",")]) {
    const n = hostnameOf(h);
    if (n && n !== "0.0.0.0" && n !== "[::]" && n !== "::") out.add(n.includes(":") && !n.startsWith("[") ? `[${n}]` : n);
  }
  return out;
}

function sessionToken(passphrase: string): string {
  return createHmac("sha256", passphrase).update("holdline session v1").digest("hex");
}

function same(a: string, b: string): boolean {
  const x = Buffer.from(a);
  const y = Buffer.from(b);
  return x.length === y.length && timingSafeEqual(x, y);
}

function cookie(req: Request, name: string): string | null {
  for (const part of (req.headers.get("cookie") ?? "").split(";")) {
    const [k, ...v] = part.trim().split("=");
    if (k === name) return v.join("=");
  }
  return null;
}

function json(status: number, error: string, headers: Record<string, string> = {}): Response {
  return new Response(JSON.stringify({ error, fieldErrors: {} }), { status, headers: { "content-type": "application/json", ...headers } });
}

function signInPage(next: string, message: string, status = 200): Response {
  const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
  const html = `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>Sign in · Holdline</title></head>
<body style="font-family:system-ui,sans-serif;max-width:28rem;margin:4rem auto;padding:0 1rem">
<h1>Holdline</h1><p>This copy of Holdline is shared on the network. Enter its passphrase.</p>
${message ? `<p role="alert" style="color:#a00">${esc(message)}</p>` : ""}
<form method="post" action="/signin"><input type="hidden" name="next" value="${esc(next)}">
<label>Passphrase <input type="password" name="passphrase" autocomplete="current-password" required autofocus></label>
<button type="submit">Sign in</button></form></body></html>`;
  return new Response(html, { status, headers: { "content-type": "text/html; charset=utf-8", "cache-control": "no-store" } });
}

/** A relative path to go back to after signing in (never another site). */
function safeNext(raw: string | null): string {
  return raw && raw.startsWith("/") && !raw.startsWith("//") && !raw.startsWith("/\\") ? raw : "/";
}

/** Whether Origin (or Sec-Fetch-Site) shows the request comes from a page of this same host. */
function sameOrigin(req: Request, host: string): boolean {
  const origin = req.headers.get("origin");
  if (origin !== null) {
    try {
      return new URL(origin).host.toLowerCase() === host.toLowerCase();
    } catch {
      return false;
    }
  }
  return req.headers.get("sec-fetch-site") === "same-origin";
}

/**
 * The answer that stops the request, or null to let it through. `signIn` handles the sign-in form's own
 * POST (it needs the form body, so it is async).
 */
export async function guard(req: Request, env: GuardEnv): Promise<Response | null> {
  const url = new URL(req.url);
  const host = req.headers.get("host") ?? "";
  if (!allowedHostnames(env).has(hostnameOf(host))) {
    return json(403, `This server answers only for ${[...allowedHostnames(env)].join(", ")}; set HOLDLINE_HOST to the address you serve it on`);
  }
  const api = url.pathname.startsWith("/api/");
  const unsafe = !SAFE_METHODS.has(req.method.toUpperCase());
  if (unsafe && (api || url.pathname === "/signin") && !sameOrigin(req, host)) {
    return json(403, `Cross-site request refused: a state-changing request needs an Origin header of this server (e.g. Origin: ${url.protocol}//${host})`);
  }
  if (unsafe && api && req.method.toUpperCase() !== "DELETE") {
    const type = (req.headers.get("content-type") ?? "").split(";")[0].trim().toLowerCase();
    if (type !== "application/json") return json(415, "Send the body as JSON with Content-Type: application/json");
  }
  const pass = env.HOLDLINE_PASSPHRASE;
  if (!pass) return null;
  const token = sessionToken(pass);
  const signedIn = same(cookie(req, SESSION_COOKIE) ?? "", token);
  if (url.pathname === "/signin") {
    if (req.method === "GET") return signInPage(safeNext(url.searchParams.get("next")), "");
    if (req.method !== "POST") return json(405, "Use GET or POST");
    const form = new URLSearchParams(await req.text().catch(() => ""));
    const next = safeNext(form.get("next"));
    if (!same(form.get("passphrase") ?? "", pass)) return signInPage(next, "That is not the passphrase.", 401);
    const secure = url.protocol === "https:" ? "; Secure" : "";
    return new Response(null, { status: 303, headers: { location: new URL(next, url).toString(), "set-cookie": `${SESSION_COOKIE}=${token}; Path=/; HttpOnly; SameSite=Strict; Max-Age=43200${secure}` } });
  }
  if (api) {
    const auth = req.headers.get("authorization") ?? "";
    const bearer = auth.toLowerCase().startsWith("bearer ") ? auth.slice(7).trim() : "";
    if (signedIn || (bearer && same(bearer, pass))) return null;
    return json(401, "Send Authorization: Bearer <the passphrase in HOLDLINE_PASSPHRASE>", { "www-authenticate": 'Bearer realm="holdline"' });
  }
  if (signedIn) return null;
  if (req.method === "GET" || req.method === "HEAD") {
    // Next wants an absolute Location from a proxy.
    return new Response(null, { status: 303, headers: { location: new URL(`/signin?next=${encodeURIComponent(url.pathname + url.search)}`, url).toString() } });
  }
  return json(401, "Sign in first (/signin)");
}
