// Saved plans for every planner, as a user of the API makes them: save from the README's example inputs
// (templates by name), read back the server's own result, rename, export the record's CSV in °C and °F,
// delete. Single-user SQLite install, through proxy.ts and the route handlers.
import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, it, expect, beforeAll, afterAll, vi } from "vitest";
import { tempDatabase } from "../helpers/tempdb";
import { api, nextHeadersMock } from "../helpers/api";
import { PLANNER_KINDS } from "../../lib/planners/registry";

vi.mock("server-only", () => ({}));
vi.mock("next/headers", () => nextHeadersMock);
vi.mock("next/cache", () => ({ revalidatePath: () => {} }));

let dispose: () => Promise<void>;
const saved = process.env.DATABASE_URL;
const example = (k: string) => JSON.parse(readFileSync(path.join(process.cwd(), "public/examples", `${k}.json`), "utf8"));

beforeAll(async () => {
  const t = await tempDatabase({ seed: true });
  dispose = t.dispose;
  process.env.DATABASE_URL = t.dbPath;
});
afterAll(async () => {
  if (saved === undefined) delete process.env.DATABASE_URL;
  else process.env.DATABASE_URL = saved;
  await dispose();
});

async function csvOf(id: number): Promise<{ status: number; text: string }> {
  const { GET } = await import("../../app/plans/[id]/csv/route");
  const r = await GET(new Request(`http://127.0.0.1/plans/${id}/csv`), { params: Promise.resolve({ id: String(id) }) });
  return { status: r.status, text: await r.text() };
}

describe("saved plans for every planner", () => {
  const withExample = PLANNER_KINDS.filter((k) => {
    try {
      return !!example(k);
    } catch {
      return false;
    }
  });

  it("has an example input for every planner in the registry", () => {
    expect(withExample).toEqual(PLANNER_KINDS);
  });

  it.each(withExample)("%s: saves from the example, keeps the server's result, renames, exports CSV in the chosen units and deletes", async (kind) => {
    const made = await api("POST", "/api/v1/plans", { body: { kind, name: `Example ${kind}`, input: example(kind) } });
    expect(made.status, JSON.stringify(made.body)).toBe(201);
    const id = (made.body as { id: number }).id;
    const got = (await api("GET", `/api/v1/plans/${id}`)).body as { kind: string; name: string; result: Record<string, unknown> };
    expect(got.kind).toBe(kind);
    expect(Object.keys(got.result).length).toBeGreaterThan(3);

    expect((await api("PATCH", `/api/v1/plans/${id}`, { body: { name: "  Renamed  " } })).status).toBe(200);
    expect(((await api("GET", `/api/v1/plans/${id}`)).body as { name: string }).name).toBe("Renamed");
    expect((await api("PATCH", `/api/v1/plans/${id}`, { body: { name: "" } })).status).toBe(422);
    expect((await api("PATCH", `/api/v1/plans/${id}`, { body: { name: "x", extra: 1 } })).status).toBe(422);

    const c = await csvOf(id);
    expect(c.status).toBe(200);
    const header = c.text.split("\n")[0];
    expect(c.text.split("\n").length).toBeGreaterThan(1);
    expect((await api("PUT", "/api/v1/settings", { body: { temperatureUnit: "F", massUnit: "lb", lengthUnit: "in" } })).status).toBe(200);
    const f = await csvOf(id);
    expect((await api("PUT", "/api/v1/settings", { body: { temperatureUnit: "C", massUnit: "kg", lengthUnit: "mm" } })).status).toBe(200);
    if (/_C\b/.test(header)) {
      expect(f.text.split("\n")[0]).toMatch(/_F\b/);
      expect(f.text.split("\n")[0]).not.toMatch(/_C\b/);
    }

    expect((await api("DELETE", `/api/v1/plans/${id}`)).status).toBe(204);
    expect((await api("GET", `/api/v1/plans/${id}`)).status).toBe(404);
    expect((await api("DELETE", `/api/v1/plans/${id}`)).status).toBe(404);
  });

  it("refuses malformed ids and unknown kinds with 4xx", async () => {
    for (const bad of ["0", "-1", "1e3", "abc", "99999999999999999999"]) {
      expect((await api("GET", `/api/v1/plans/${bad}`)).status).toBe(404);
      expect((await api("PATCH", `/api/v1/plans/${bad}`, { body: { name: "x" } })).status).toBe(404);
    }
    const r = await api("POST", "/api/v1/plans", { body: { kind: "nonsense", name: "x", input: {} } });
    expect(r.status).toBe(422);
  });
});
