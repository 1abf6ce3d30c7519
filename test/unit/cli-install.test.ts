/**
 * `npm install -g .` then `holdline …` from any folder, as the README says: installs the package
 * into a temporary global prefix, puts its bin folder first on PATH, and runs `holdline` by name
 * from an unrelated temporary folder.
 */
import { describe, it, expect, beforeAll } from "vitest";
import { mkdtempSync, existsSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { ROOT, sh, STACK_TRACE } from "../helpers/cli-run";

describe("holdline installed globally, run from another folder", () => {
  const prefix = mkdtempSync(path.join(os.tmpdir(), "holdline-global-"));
  const elsewhere = mkdtempSync(path.join(os.tmpdir(), "holdline-elsewhere-"));
  const env = { PATH: `${path.join(prefix, "bin")}${path.delimiter}${process.env.PATH}`, DATABASE_URL: "" };
  const holdline = (args: string) => sh(`holdline ${args}`, { cwd: elsewhere, env });

  beforeAll(() => {
    const r = sh(`npm install -g . --prefix "${prefix}" --offline --no-audit --no-fund`, { cwd: ROOT, timeout_ms: 300_000 });
    expect(r.status, r.stderr).toBe(0);
  }, 300_000);

  it("puts a holdline command on PATH that prints its help", () => {
    expect(existsSync(path.join(prefix, "bin", "holdline"))).toBe(true);
    const r = holdline("--help");
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/^Usage:/m);
    expect(r.stdout).toMatch(/holdline hold FILE/);
  });

  it("runs a calculation on a file in that folder, with the library in data/holdline.db there", () => {
    writeFileSync(
      path.join(elsewhere, "rice.json"),
      JSON.stringify({ product: "Steamed rice, full pan", start_C: 80, surroundings: { medium: "air", T_C: 22, speed_m_s: 0.3 }, limit: "hotHoldMin", horizon_s: 14400 }),
    );
    const r = holdline("warmup rice.json");
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.timeToLimit_s.center).toBeGreaterThan(0);
    expect(out.series.length).toBeGreaterThan(10);
    expect(existsSync(path.join(elsewhere, "data", "holdline.db"))).toBe(true);
  });

  it("prints a JSON Schema without touching any database", () => {
    const r = sh("holdline schema thaw", { cwd: prefix, env });
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).properties.method).toBeDefined();
    expect(existsSync(path.join(prefix, "data"))).toBe(false);
  });

  it("an unknown command exits non-zero with one message and the usage, no stack trace", () => {
    const r = holdline("frobnicate");
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(/^holdline: unknown command "frobnicate"/);
    expect(r.stderr).not.toMatch(STACK_TRACE);
    expect(r.stdout).toBe("");
  });
});
