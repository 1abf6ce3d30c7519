/**
 * Calls the app's API the way `next start` does, without a server: the request goes
 * through proxy.ts first (the accounts gate), then, if it passes, to the route handler
 * with the headers the proxy forwards. next/headers is served from the same request
 * (tests mock it with `nextHeadersMock`). For repository + API tests on both providers.
 */
import { NextRequest } from "next/server";

type Ctx = { params: Promise<Record<string, string>> };
// Method signatures, so each route's own params type fits.
interface RouteModule {
  GET?(req: Request, ctx: Ctx): Promise<Response>;
  POST?(req: Request, ctx: Ctx): Promise<Response>;
  PUT?(req: Request, ctx: Ctx): Promise<Response>;
  DELETE?(req: Request, ctx: Ctx): Promise<Response>;
}

const current: { headers: Headers; setCookies: string[] } = { headers: new Headers(), setCookies: [] };

/** What tests pass to vi.mock("next/headers", …). */
export const nextHeadersMock = {
  headers: async () => current.headers,
  cookies: async () => {
    const jar = new Map<string, string>();
    for (const part of (current.headers.get("cookie") ?? "").split(";")) {
      const i = part.indexOf("=");
      if (i > 0) jar.set(part.slice(0, i).trim(), decodeURIComponent(part.slice(i + 1).trim()));
    }
    return {
      get: (name: string) => (jar.has(name) ? { name, value: jar.get(name)! } : undefined),
      set: (name: string, value: string) => {
        jar.set(name, value);
        current.setCookies.push(`${name}=${value}`);
      },
      delete: (name: string) => {
        jar.delete(name);
        current.setCookies.push(`${name}=`);
      },
    };
  },
};

async function route(pathname: string): Promise<{ mod: RouteModule; params: Record<string, string> } | null> {
  const p = pathname.replace(/^\/api\/v1\//, "").split("/");
  if (p[0] === "session" && p.length === 1) return { mod: await import("../../app/api/v1/session/route"), params: {} };
  if (p[0] === "plans" && p.length === 1) return { mod: await import("../../app/api/v1/plans/route"), params: {} };
  if (p[0] === "settings" && p.length === 1) return { mod: await import("../../app/api/v1/settings/route"), params: {} };
  if (p.length === 1) return { mod: await import("../../app/api/v1/[kind]/route"), params: { kind: p[0] } };
  if (p.length === 2) return { mod: await import("../../app/api/v1/[kind]/[id]/route"), params: { kind: p[0], id: p[1] } };
  if (p.length === 3 && p[2] === "history") return { mod: await import("../../app/api/v1/[kind]/[id]/history/route"), params: { kind: p[0], id: p[1] } };
  return null;
}

export interface ApiAnswer {
  status: number;
  body: unknown;
  setCookies: string[];
}

export async function api(method: string, pathname: string, opts: { body?: unknown; rawBody?: string; token?: string; cookie?: string; headers?: Record<string, string> } = {}): Promise<ApiAnswer> {
  const { proxy } = await import("../../proxy");
  // What a browser on this origin sends, so host and origin checks in the proxy pass as for the app's own pages.
  const headers = new Headers({ host: "127.0.0.1:3113", origin: "http://127.0.0.1:3113", ...(opts.headers ?? {}) });
  if (opts.token) headers.set("authorization", `Bearer ${opts.token}`);
  if (opts.cookie) headers.set("cookie", opts.cookie);
  const body = opts.rawBody ?? (opts.body === undefined ? undefined : JSON.stringify(opts.body));
  if (body !== undefined) headers.set("content-type", "application/json");
  const url = `http://127.0.0.1:3113${pathname}`;
  const gate = await proxy(new NextRequest(url, { method, headers, body }));
  if (gate.headers.get("x-middleware-next") !== "1") {
    const text = await gate.text();
    return { status: gate.status, body: text ? JSON.parse(text) : null, setCookies: [] };
  }
  // The headers the proxy forwards: NextResponse.next({ request: { headers } }) lists them.
  const forwarded = new Headers();
  for (const name of (gate.headers.get("x-middleware-override-headers") ?? "").split(",").filter(Boolean)) {
    const v = gate.headers.get(`x-middleware-request-${name}`);
    if (v !== null) forwarded.set(name, v);
  }
  current.headers = forwarded;
  current.setCookies = [];
  const r = await route(pathname);
  const handler = r?.mod[method as keyof RouteModule];
  if (!r || !handler) return { status: 404, body: null, setCookies: [] };
  const res = await handler.call(r.mod, new Request(url, { method, headers: forwarded, body }), { params: Promise.resolve(r.params) });
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : null, setCookies: current.setCookies };
}
