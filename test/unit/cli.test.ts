import { describe, it, expect } from "vitest";
import { existsSync, mkdirSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { main } from "../../cli/holdline";
import { STACK_TRACE, ROOT } from "../helpers/cli-run";
import { openLibrary } from "../../cli/library";
import { sizeWorkerFile } from "../../cli/paths";
import { savePlan } from "../../lib/db/plans";
import { resolvePlannerInput } from "../../lib/db/resolve";

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

  const example = (f: string) => path.join(ROOT, "public", "examples", f);
  const oneLine = (c: { err: string; out: string }) => {
    expect(c.err).not.toMatch(STACK_TRACE);
    expect(c.out).not.toMatch(STACK_TRACE);
    expect(c.err.trim().split("\n")).toHaveLength(1);
  };

  it("a --db that is a text file, a folder, a system file or a device: one clear line, exit 1, the file untouched", async () => {
    const text = path.join(dir, "notes.txt");
    writeFileSync(text, "shopping list\n");
    const folder = path.join(dir, "a-folder");
    mkdirSync(folder);
    const cases: [string, RegExp][] = [
      [text, /notes\.txt is not a database file/],
      [folder, /a-folder is a folder/],
      ["/etc/passwd", /\/etc\/passwd is not a database file/],
      ["/dev/null", /\/dev\/null is not a regular file/],
      [path.join(text, "inside.db"), /is a file, not a folder|is not a folder/],
    ];
    for (const [db, re] of cases) {
      for (const args of [["export"], ["hold", example("hold.json")], ["plans"]]) {
        const c = capture();
        expect(await main([...args, "--db", db], c.io)).toBe(1);
        expect(c.err).toMatch(/^holdline: cannot use the database: /);
        expect(c.err).toMatch(re);
        oneLine(c);
      }
    }
    expect(readFileSync(text, "utf8")).toBe("shopping list\n");
    expect(existsSync(text + "-wal")).toBe(false);
  });

  it("a SQLite database of another program is refused, not migrated into", async () => {
    const Database = (await import("better-sqlite3")).default;
    const other = path.join(dir, "other.sqlite");
    const d = new Database(other);
    d.exec("CREATE TABLE recipes (id INTEGER PRIMARY KEY, name TEXT)");
    d.close();
    const c = capture();
    expect(await main(["export", "--db", other], c.io)).toBe(1);
    expect(c.err).toMatch(/database of another program/);
    const check = new Database(other, { readonly: true });
    expect((check.prepare("SELECT name FROM sqlite_master WHERE type = 'table'").all() as { name: string }[]).map((t) => t.name)).toEqual(["recipes"]);
    check.close();
  });

  it("a malformed box gets field messages, not a stack trace", async () => {
    for (const body of [{ shipper: { wallLayers: 5 } }, { shipper: { wallLayers: [null] }, route: 3 }, { shipper: { lidLayers: "x", wallLayers: [{ material: 7 }] } }]) {
      const f = path.join(dir, "badbox.json");
      writeFileSync(f, JSON.stringify(body));
      for (const cmd of ["hold", "size"]) {
        const c = capture();
        expect(await main([cmd, f, "--db", seeded], c.io)).toBe(1);
        expect(c.err).toMatch(new RegExp(`^holdline ${cmd}: the input has problems; nothing was computed`));
        expect(c.err).not.toMatch(STACK_TRACE);
      }
    }
  });

  it("schema with a name that is an Object property (constructor, __proto__, toString) is refused in one line, exit 2", async () => {
    for (const name of ["constructor", "__proto__", "toString", "hasOwnProperty"]) {
      const c = capture();
      expect(await main(["schema", name], c.io)).toBe(2);
      expect(c.err).toMatch(new RegExp(`^holdline schema: no input named "${name.replace(/_/g, "_")}"; name one of product, `));
      oneLine(c);
    }
  });

  it("a JSON file with a byte-order mark is accepted, for calculations and imports", async () => {
    const bom = path.join(dir, "bom.json");
    writeFileSync(bom, "\uFEFF" + readFileSync(example("warmup.json"), "utf8"));
    const c = capture();
    expect(await main(["warmup", bom, "--db", seeded], c.io)).toBe(0);
    expect(JSON.parse(c.out).timeToLimit_s.center).toBeGreaterThan(0);
    const lib = path.join(dir, "bom-lib.json");
    writeFileSync(lib, "\uFEFF" + readFileSync(example("import.json"), "utf8"));
    const i = capture();
    expect(await main(["import", lib, "--db", seeded], i.io)).toBe(0);
    expect(i.err).toMatch(/1 added|0 added, 1 updated/);
  });

  it("missing and unreadable input files, and an unwritable --out, are one line each", async () => {
    for (const args of [["hold", path.join(dir, "nope.json")], ["thaw", dir], ["export", "--db", seeded, "--out", path.join(dir, "no", "such", "dir", "x.json")]]) {
      const c = capture();
      expect(await main(args, c.io)).toBe(1);
      expect(c.err).toMatch(/^holdline \w+: cannot (read|write) /);
      oneLine(c);
    }
  });

  it("an input that spells out every template computes without creating or opening a database", async () => {
    const db = await openLibrary(seeded, { seed: true });
    const full = await resolvePlannerInput(db, "hold", JSON.parse(readFileSync(example("hold.json"), "utf8")));
    await db.$disconnect();
    expect(full.ok).toBe(true);
    const f = path.join(dir, "hold-full.json");
    writeFileSync(f, JSON.stringify((full as { value: unknown }).value));
    const never = path.join(dir, "never", "created.db");
    const c = capture();
    expect(await main(["hold", f, "--db", never], c.io)).toBe(0);
    expect(JSON.parse(c.out).band.central).toBeGreaterThan(3600);
    expect(existsSync(path.dirname(never))).toBe(false);
  });

  it("plans lists saved plans; plans show N --json prints an input the planner accepts; bad ids are refused", async () => {
    const db = await openLibrary(seeded, { seed: true });
    const input = await resolvePlannerInput(db, "hold", JSON.parse(readFileSync(example("hold.json"), "utf8")));
    const id = await savePlan(db, { kind: "hold", name: "Cod overnight", input: (input as { value: unknown }).value, result: { holdTime_s: 1 } });
    await db.$disconnect();
    const list = capture();
    expect(await main(["plans", "--db", seeded], list.io)).toBe(0);
    expect(list.out).toMatch(new RegExp(`^\\s*${id}\\s+hold\\s+\\d{4}-\\d\\d-\\d\\d \\d\\d:\\d\\d\\s+Cod overnight$`, "m"));
    const listJson = capture();
    expect(await main(["plans", "--json", "--db", seeded], listJson.io)).toBe(0);
    expect(JSON.parse(listJson.out)).toContainEqual(expect.objectContaining({ id, kind: "hold", name: "Cod overnight" }));
    const show = capture();
    expect(await main(["plans", "show", String(id), "--json", "--db", seeded], show.io)).toBe(0);
    const f = path.join(dir, "plan.json");
    writeFileSync(f, show.out);
    const rerun = capture();
    expect(await main(["hold", f, "--db", path.join(dir, "unused", "x.db")], rerun.io)).toBe(0);
    expect(JSON.parse(rerun.out).band.central).toBeGreaterThan(3600);
    const human = capture();
    expect(await main(["plans", "show", String(id), "--db", seeded], human.io)).toBe(0);
    expect(human.out).toMatch(/rerun: holdline plans show \d+ --json > plan.json && holdline hold plan.json/);
    for (const bad of ["0", "1.5", "0x1", " 1", "abc", "999999999999999999999", ""]) {
      const c = capture();
      expect(await main(["plans", "show", bad, "--db", seeded], c.io)).toBe(2);
      oneLine(c);
    }
    const missing = capture();
    expect(await main(["plans", "show", "9999", "--db", seeded], missing.io)).toBe(1);
    expect(missing.err).toMatch(/no saved plan with id 9999/);
  });

  it("the sizer's threads run the prebuilt JavaScript worker, with no TypeScript loader", async () => {
    const worker = readFileSync(sizeWorkerFile(), "utf8");
    expect(sizeWorkerFile()).toMatch(/dist[\\/]cli[\\/]size-worker\.mjs$/);
    expect(worker).not.toMatch(/tsx|\.ts"/);
    const c = capture();
    expect(await main(["size", example("size.json"), "--db", seeded], c.io)).toBe(0);
    expect(JSON.parse(c.out).candidates.length).toBeGreaterThan(1);
    expect(c.err).toMatch(/holdline size: \d+ candidates run, \d+ decided by monotonicity/);
  });

  it("an unknown command or option exits 2 with the usage", async () => {
    for (const args of [["frobnicate"], ["--frob"], []]) {
      const c = capture();
      expect(await main(args, c.io)).toBe(2);
      expect(c.err).toMatch(/Usage:/);
      expect(c.err).not.toMatch(STACK_TRACE);
    }
    const emptyDb = capture();
    expect(await main(["export", "--db", ""], emptyDb.io)).toBe(2);
    expect(emptyDb.err).toMatch(/--db needs the path of a database file/);
    const sub = capture();
    expect(await main(["plans", "delete", "1", "--db", seeded], sub.io)).toBe(2);
    expect(sub.err).toMatch(/^holdline plans: unknown sub-command "delete"/);
    oneLine(sub);
  });
});
