/**
 * A bounded fuzz of the command line (fast-check, fixed seeds, 400 cases in all), run in-process
 * through `main` with captured io. Whatever the arguments, files and standard input: the exit
 * status is 0, 1 or 2; no stack trace is printed; a failure says what is wrong on stderr; an answer
 * is JSON with no non-finite number; and a rejected import leaves the library as it was.
 */
import { describe, it, expect, beforeAll } from "vitest";
import fc from "fast-check";
import { mkdirSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { main, type CliIo } from "../../cli/holdline";
import { ROOT, STACK_TRACE } from "../helpers/cli-run";

const dir = mkdtempSync(path.join(os.tmpdir(), "holdline-fuzz-"));
const seeded = path.join(dir, "seeded.db");
const scratch = path.join(dir, "scratch");
mkdirSync(scratch);
const example = (f: string) => JSON.parse(readFileSync(path.join(ROOT, "public", "examples", f), "utf8"));

/** Exit statuses seen, per test, so a fuzz that only ever hits one path is noticed. */
const seen: Record<string, number[]> = {};
let current = "";

async function run(argv: string[], stdin = "") {
  let out = "";
  let err = "";
  const io: CliIo = { out: (s) => void (out += s), err: (s) => void (err += s), stdin: () => stdin };
  const code = await main(argv, io);
  (seen[current] ??= []).push(code);
  return { code, out, err };
}

/** The checks every run must pass. */
function expectSane(argv: string[], r: { code: number; out: string; err: string }) {
  const where = JSON.stringify(argv);
  expect([0, 1, 2], where).toContain(r.code);
  expect(r.err, where).not.toMatch(STACK_TRACE);
  expect(r.out, where).not.toMatch(STACK_TRACE);
  expect(r.err, where).not.toMatch(/non-finite/);
  expect(r.err, where).not.toMatch(/HOLDLINE_DEBUG/); // an unexpected error, not a message about the input
  if (r.code !== 0) expect(r.err, where).toMatch(/^holdline/);
  if (r.code === 0 && r.out.trim().startsWith("{")) {
    const walk = (v: unknown): void => {
      if (typeof v === "number") expect(Number.isFinite(v), where).toBe(true);
      else if (v && typeof v === "object") Object.values(v).forEach(walk);
    };
    walk(JSON.parse(r.out));
  }
}

/** Sets the value at a path chosen by the indices (each picks a key or element, modulo the count), or deletes it. */
function mutate(base: unknown, picks: number[], value: unknown, remove: boolean): unknown {
  const root = structuredClone(base) as Record<string, unknown>;
  let node: Record<string, unknown> = root;
  for (let i = 0; i < picks.length; i++) {
    const keys = Object.keys(node);
    if (!keys.length) break;
    const k = keys[picks[i] % keys.length];
    const child = node[k];
    if (i === picks.length - 1 || !child || typeof child !== "object") {
      if (remove) delete node[k];
      else node[k] = value;
      return root;
    }
    node = child as Record<string, unknown>;
  }
  return root;
}

const ODD_VALUES = [null, "", "x", "Gel pack, 600 g", "Whole turkey, 6 kg", -1, 0, 0.5, 1, 3, 250, -300, 1e9, -1e9, 1e308, true, [], [null], {}, { material: 5 }];
const mutation = fc.record({ picks: fc.array(fc.nat({ max: 50 }), { minLength: 1, maxLength: 4 }), value: fc.constantFrom(...ODD_VALUES), remove: fc.boolean() });

describe("CLI fuzz", () => {
  const files: Record<string, string> = {};
  let libraryBefore = "";

  beforeAll(async () => {
    const e = await run(["export", "--db", seeded]);
    expect(e.code).toBe(0);
    libraryBefore = e.out;
    const put = (name: string, text: string) => {
      files[name] = path.join(dir, name);
      writeFileSync(files[name], text);
    };
    put("text.txt", "not json at all\n");
    put("empty.json", "");
    put("bom.json", "\uFEFF" + JSON.stringify(example("warmup.json")));
    put("array.json", "[1,2,3]");
    for (const f of ["warmup", "hold", "thaw", "size"]) put(`${f}.json`, JSON.stringify(example(`${f}.json`)));
    put("library.json", libraryBefore);
  }, 60_000);

  const both = (name: string) => {
    const codes = seen[name] ?? [];
    expect(codes.filter((c) => c === 0).length, `${name}: some runs succeed`).toBeGreaterThan(0);
    expect(codes.filter((c) => c !== 0).length, `${name}: some runs are refused`).toBeGreaterThan(0);
  };

  it("random argument lists (150 cases)", async () => {
    current = "args";
    const token = fc.oneof(
      fc.constantFrom("export", "import", "warmup", "hold", "thaw", "size", "plans", "show", "schema", "help", "--help", "-h", "--json", "--no-seed", "-", "constructor", "__proto__", "hold", "product", "1", "0", "-1", "1e3"),
      fc.constant("--bogus"),
      fc.string({ maxLength: 8 }),
    );
    const command = fc.constantFrom("export", "import", "warmup", "hold", "thaw", "size", "plans", "schema");
    const fileArg = fc.constantFrom("text.txt", "empty.json", "bom.json", "array.json", "warmup.json", "hold.json", "thaw.json", "library.json").map((n) => path.join(dir, n));
    const dbArg = fc.constantFrom(seeded, seeded, path.join(dir, "text.txt"), "", dir, "/etc/passwd", "/dev/null", "/proc/self/status", path.join(scratch, "sub", "x.db"));
    await fc.assert(
      fc.asyncProperty(fc.oneof({ weight: 6, arbitrary: command }, { weight: 1, arbitrary: token }), fc.array(fc.oneof(token, fileArg, fileArg), { maxLength: 3 }), dbArg, fc.boolean(), fc.string({ maxLength: 30 }), async (first, args, db, withOut, stdin) => {
        const argv = [first, ...args, "--db", db, ...(withOut ? ["--out", path.join(scratch, "out.json")] : [])];
        // A random argument list must not import into the shared library; imports are fuzzed below.
        if (argv.includes("import") && argv.includes(path.join(dir, "library.json"))) return;
        expectSane(argv, await run(argv, stdin));
      }),
      { seed: 20261202, numRuns: 150 },
    );
    both("args");
  }, 240_000);

  for (const kind of ["warmup", "hold", "thaw"] as const) {
    it(`${kind}: mutated example inputs and arbitrary JSON (50 cases)`, async () => {
      current = kind;
      await fc.assert(
        fc.asyncProperty(fc.oneof({ weight: 4, arbitrary: mutation.map((m) => mutate(example(`${kind}.json`), m.picks, m.value, m.remove)) }, { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) }), async (input) => {
          const f = path.join(scratch, `${kind}.json`);
          writeFileSync(f, JSON.stringify(input));
          const argv = [kind, f, "--db", seeded];
          const r = await run(argv);
          expectSane(argv, r);
          if (r.code === 0) expect(JSON.parse(r.out)).toHaveProperty("warnings");
          else expect(r.err).toMatch(new RegExp(`^holdline ${kind}: `));
        }),
        { seed: 1100 + kind.length, numRuns: 50 },
      );
      both(kind);
    }, 240_000);
  }

  it("size: mutated example inputs through standard input (30 cases)", async () => {
    current = "size";
    await fc.assert(
      fc.asyncProperty(mutation, async (m) => {
        const argv = ["size", "-", "--db", seeded];
        const r = await run(argv, JSON.stringify(mutate(example("size.json"), m.picks, m.value, m.remove)));
        expectSane(argv, r);
        if (r.code === 0) expect(JSON.parse(r.out)).toHaveProperty("candidates");
      }),
      { seed: 77, numRuns: 30 },
    );
    both("size");
  }, 240_000);

  it("import: mutated library files (70 cases); a rejected import changes nothing", async () => {
    const lib = JSON.parse(libraryBefore);
    const db = path.join(dir, "import-target.db");
    let library = (await run(["export", "--db", db])).out;
    current = "import";
    let rejected = 0;
    await fc.assert(
      fc.asyncProperty(mutation, async (m) => {
        const f = path.join(scratch, "lib.json");
        writeFileSync(f, JSON.stringify(mutate(lib, m.picks, m.value, m.remove)));
        const argv = ["import", f, "--db", db];
        const r = await run(argv);
        expectSane(argv, r);
        const after = (await run(["export", "--db", db])).out;
        if (r.code !== 0) {
          rejected++;
          expect(r.err).toMatch(/nothing was changed/i);
          expect(after).toBe(library);
        }
        library = after;
      }),
      { seed: 4242, numRuns: 70 },
    );
    expect(rejected).toBeGreaterThan(10);
    expect(rejected).toBeLessThan(70);
  }, 240_000);

  it("prints the spread of exit statuses", () => {
    const summary = Object.entries(seen).map(([k, v]) => `${k}: ${[0, 1, 2].map((c) => `${v.filter((x) => x === c).length}×${c}`).join(" ")}`);
    console.log(`CLI fuzz exit statuses — ${summary.join("; ")}`);
  });

  it("the shared library is unchanged by all of the above", async () => {
    expect((await run(["export", "--db", seeded])).out).toBe(libraryBefore);
  });
});
