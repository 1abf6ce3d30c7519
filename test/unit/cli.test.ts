import { describe, it, expect } from "vitest";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { main } from "../../cli/holdline";

function capture() {
  let out = "";
  let err = "";
  return { io: { out: (s: string) => void (out += s), err: (s: string) => void (err += s) }, get out() { return out; }, get err() { return err; } };
}

describe("holdline CLI", () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), "holdline-cli-"));
  const seeded = path.join(dir, "seeded.db");
  const empty = path.join(dir, "empty.db");

  it("prints help", async () => {
    const c = capture();
    expect(await main(["--help"], c.io)).toBe(0);
    expect(c.out).toMatch(/holdline export/);
    expect(c.out).toMatch(/calibrated probe\s+thermometer/);
  });

  it("export → import into an empty database → export gives the identical file", async () => {
    const a = capture();
    expect(await main(["export", "--db", seeded], a.io)).toBe(0);
    const file = path.join(dir, "library.json");
    writeFileSync(file, a.out);
    const i = capture();
    expect(await main(["import", file, "--db", empty, "--no-seed"], i.io)).toBe(0);
    const b = capture();
    expect(await main(["export", "--db", empty], b.io)).toBe(0);
    expect(b.out).toBe(a.out);
  });

  it("a malformed import changes nothing and names the entry and field", async () => {
    const before = capture();
    await main(["export", "--db", empty], before.io);
    const lib = JSON.parse(before.out);
    lib.rulesets[0].chilledMax_C = "five";
    lib.products[0].notes = "should not land";
    const bad = path.join(dir, "bad.json");
    writeFileSync(bad, JSON.stringify(lib));
    const c = capture();
    expect(await main(["import", bad, "--db", empty], c.io)).toBe(1);
    expect(c.err).toMatch(/rulesets\[0\] \(".+"\)\.chilledMax_C: Chilled upper limit: enter a number/);
    expect(c.err).toMatch(/nothing was changed/);
    const after = capture();
    await main(["export", "--db", empty], after.io);
    expect(after.out).toBe(before.out);
  });

  it("reports a file that is not JSON", async () => {
    const f = path.join(dir, "notjson.json");
    writeFileSync(f, "{ nope");
    const c = capture();
    expect(await main(["import", f, "--db", empty], c.io)).toBe(1);
    expect(c.err).toMatch(/cannot read .* as JSON/);
  });

  it("prints a JSON Schema generated from zod", async () => {
    const c = capture();
    expect(await main(["schema", "product"], c.io)).toBe(0);
    const s = JSON.parse(c.out);
    expect(s.properties.composition.properties.water.maximum).toBe(1);
    expect(s.required).toContain("mass_kg");
    const bad = capture();
    expect(await main(["schema", "nope"], bad.io)).toBe(2);
    expect(readFileSync(path.join(dir, "library.json"), "utf8").length).toBeGreaterThan(100);
  });
});
