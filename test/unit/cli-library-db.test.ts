// The bundled `holdline` command on the library database of the run: SQLite by default, PostgreSQL in
// `npm run test:pg` (vitest.pg.config.ts). A brand-new database is migrated (with the PostgreSQL twins on
// PostgreSQL) and seeded by the command itself; export then import round-trips, and a warm-up input that
// names a template resolves it from that database.
import { describe, it, expect, beforeAll, afterAll } from "vitest";
import { writeFileSync, mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { tempDatabase } from "../helpers/tempdb";
import { sh, ROOT } from "../helpers/cli-run";
import { countTemplates } from "../../lib/db/templates";

let t: Awaited<ReturnType<typeof tempDatabase>>;
const dir = mkdtempSync(path.join(os.tmpdir(), "holdline-cli-db-"));

beforeAll(async () => {
  t = await tempDatabase({ seed: false });
});
afterAll(async () => {
  await t?.dispose();
  rmSync(dir, { recursive: true, force: true });
});

describe("holdline export / import / warmup --db on the run's database", () => {
  it("migrates and seeds an empty database, round-trips the library, resolves a template by name", async () => {
    const bin = `node ${JSON.stringify(path.join(ROOT, "bin", "holdline.mjs"))} `;
    const db = `--db ${JSON.stringify(t.dbPath)}`;
    const exp = sh(`${bin} export ${db}`, { cwd: dir });
    expect(exp.status, exp.stderr).toBe(0);
    const lib = JSON.parse(exp.stdout) as { format: string; products: { name: string }[] };
    expect(lib.format).toBe("holdline-library");
    expect(lib.products.length).toBeGreaterThan(0);
    const file = path.join(dir, "lib.json");
    writeFileSync(file, exp.stdout);
    const before = await countTemplates(t.db);
    const imp = sh(`${bin} import ${db} ${JSON.stringify(file)}`, { cwd: dir });
    expect(imp.status, imp.stderr).toBe(0);
    expect(await countTemplates(t.db)).toBe(before);
    const input = path.join(dir, "warmup.json");
    writeFileSync(input, JSON.stringify({ product: lib.products[0].name, start_C: 80, surroundings: { medium: "air", T_C: 22, speed_m_s: 0.3 }, limit: "hotHoldMin", horizon_s: 3600 }));
    const w = sh(`${bin} warmup ${db} ${JSON.stringify(input)}`, { cwd: dir });
    expect(w.status, w.stderr).toBe(0);
    expect(JSON.parse(w.stdout)).toHaveProperty("timeToLimit_s");
  }, 120_000);
});
