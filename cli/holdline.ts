/**
 * holdline: the command-line face of Holdline. Input is checked with the same zod
 * schemas as the pages and the API. Output is JSON on stdout; messages go to stderr.
 */
import { parseArgs } from "node:util";
import { readFileSync, writeFileSync } from "node:fs";
import { resolveDatabasePath } from "../lib/db/path";
import { prepareDatabase } from "../lib/db/prepare";
import { createPrismaClient, type Db } from "../lib/db/client";
import { exportLibrary, importLibrary } from "../lib/db/library";
import { jsonSchemaOf, NAMED_SCHEMAS } from "../lib/schemas/json-schema";
import { resolveHoldRefs, resolveSizeRefs, resolveTemplateRefs, resolveThawRefs } from "../lib/db/resolve";
import { sizeInputSchema } from "../lib/schemas/size";
import { fieldErrorsOf } from "../lib/schemas/errors";
import { runSizing } from "../lib/physics/sizing";
import { PhysicsInputError } from "../lib/physics/validation";
import { nodePool } from "./size-pool";
import { thawInputSchema } from "../lib/schemas/thaw";
import { runThawParsed } from "../lib/physics/thaw";
import { holdInputSchema } from "../lib/schemas/hold";
import { runHoldParsed } from "../lib/physics/hold";
import { warmupInputSchema } from "../lib/schemas/warmup";
import { runValidated } from "../lib/schemas/run";
import { runWarmup } from "../lib/physics/warmup";

const HELP = `holdline — hold, thaw and pack-out planning from transient heat transfer

Usage:
  holdline export [--out FILE]        write every template (and the units setting) as JSON
  holdline import FILE|-              add or update templates from such a file, all or nothing
  holdline warmup FILE|-              warm-up / cool-down check: time until centre, surface
                                      and mean cross the rule-set limit (JSON in, JSON out;
                                      "product" and "ruleSet" may be template names)
  holdline hold FILE|-                hold planner: how long this box and these packs keep the
                                      load inside its band on the route (templates by name)
  holdline thaw FILE|-                thaw planner: thaw time, time the surface sits above the
                                      chill limit, compliance; "compare": true runs every method
  holdline size FILE|-                pack-out sizer: every candidate box and pack count through
                                      the hold model, on both cores; prints candidates, the
                                      Pareto front and near misses
  holdline schema NAME                print the JSON Schema of an input
                                      (${Object.keys(NAMED_SCHEMAS).join(", ")})
  holdline --help                     this text

Options:
  --db PATH      SQLite file to use (default: DATABASE_URL, else data/holdline.db)
  --no-seed      do not seed the demo scenario into a brand-new database

Results are model estimates; check real temperatures with a calibrated probe
thermometer or data logger, and follow your local food code and regulator.`;

const NOT_READ = Symbol("not read");

/** Reads JSON from a file or standard input ("-"); reports and returns NOT_READ on failure. Changes nothing. */
function readJsonInput(file: string, command: string, io: CliIo): unknown {
  try {
    return JSON.parse(readFileSync(file === "-" ? 0 : file, "utf8"));
  } catch (e) {
    io.err(`holdline ${command}: cannot read ${file} as JSON: ${(e as Error).message}\nNothing was changed.\n`);
    return NOT_READ;
  }
}

export interface CliIo {
  out: (s: string) => void;
  err: (s: string) => void;
}
const STDIO: CliIo = { out: (s) => void process.stdout.write(s), err: (s) => void process.stderr.write(s) };

export async function main(argv: string[], io: CliIo = STDIO): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      allowPositionals: true,
      options: {
        help: { type: "boolean", short: "h" },
        out: { type: "string", short: "o" },
        db: { type: "string" },
        "no-seed": { type: "boolean" },
      },
    });
  } catch (e) {
    io.err(`holdline: ${(e as Error).message}\n\n${HELP}\n`);
    return 2;
  }
  const { values, positionals } = parsed;
  const [command, ...rest] = positionals;
  if (values.help || !command || command === "help") {
    io.out(HELP + "\n");
    return command || values.help ? 0 : 2;
  }

  if (command === "schema") {
    const name = rest[0];
    const schema = name ? jsonSchemaOf(name) : null;
    if (!schema) {
      io.err(`holdline schema: name one of ${Object.keys(NAMED_SCHEMAS).join(", ")}\n`);
      return 2;
    }
    io.out(JSON.stringify(schema, null, 2) + "\n");
    return 0;
  }

  const dbPath = values.db ? resolveDatabasePath({ ...process.env, DATABASE_URL: values.db }) : resolveDatabasePath();
  const withDb = async <T>(fn: (db: Db) => Promise<T>): Promise<T> => {
    await prepareDatabase(dbPath, { seed: !values["no-seed"], quiet: true });
    const db = createPrismaClient(dbPath);
    try {
      return await fn(db);
    } finally {
      await db.$disconnect();
    }
  };

  if (command === "export") {
    const lib = await withDb(exportLibrary);
    const text = JSON.stringify(lib, null, 2) + "\n";
    if (values.out) writeFileSync(values.out, text);
    else io.out(text);
    return 0;
  }

  if (command === "import") {
    const file = rest[0];
    if (!file) {
      io.err("holdline import: give a file name, or - for standard input\n");
      return 2;
    }
    const data = readJsonInput(file, "import", io);
    if (data === NOT_READ) return 1;
    const r = await withDb((db) => importLibrary(db, data));
    if (!r.ok) {
      io.err(`holdline import: the file has ${r.errors.length} problem(s); nothing was changed.\n${r.errors.map((e) => "  " + e).join("\n")}\n`);
      return 1;
    }
    io.err(`holdline import: ${r.created} added, ${r.updated} updated.\n`);
    return 0;
  }

  if (command === "warmup" || command === "hold" || command === "thaw") {
    const file = rest[0];
    if (!file) {
      io.err(`holdline ${command}: give an input file, or - for standard input (see holdline schema ${command})\n`);
      return 2;
    }
    const data = readJsonInput(file, command, io);
    if (data === NOT_READ) return 1;
    const resolved = await withDb((db) =>
      command === "hold" ? resolveHoldRefs(db, data) : command === "thaw" ? resolveThawRefs(db, data) : resolveTemplateRefs(db, data, { product: "products", ruleSet: "rulesets" }),
    );
    const r = !resolved.ok
      ? resolved
      : command === "hold"
        ? runValidated(holdInputSchema, resolved.value, (input) => runHoldParsed(input))
        : command === "thaw"
          ? runValidated(thawInputSchema, resolved.value, (input) => runThawParsed(input))
          : runValidated(warmupInputSchema, resolved.value, (input) => runWarmup(input));
    if (!r.ok) {
      io.err(`holdline ${command}: the input has problems; nothing was computed:\n${Object.entries(r.fieldErrors).map(([k, v]) => `  ${k || "(input)"}: ${v.join("; ")}`).join("\n")}\n`);
      return 1;
    }
    io.out(JSON.stringify(r.result, null, 2) + "\n");
    return 0;
  }

  if (command === "size") {
    const file = rest[0];
    if (!file) {
      io.err("holdline size: give an input file, or - for standard input (see holdline schema size)\n");
      return 2;
    }
    const data = readJsonInput(file, "size", io);
    if (data === NOT_READ) return 1;
    const resolved = await withDb((db) => resolveSizeRefs(db, data));
    const parsed = resolved.ok ? sizeInputSchema.safeParse(resolved.value) : null;
    const problems = !resolved.ok ? resolved.fieldErrors : parsed && !parsed.success ? fieldErrorsOf(parsed.error) : null;
    if (problems || !parsed?.success) {
      io.err(`holdline size: the input has problems; nothing was computed:\n${Object.entries(problems ?? {}).map(([k, v]) => `  ${k || "(input)"}: ${v.join("; ")}`).join("\n")}\n`);
      return 1;
    }
    const pool = nodePool(parsed.data);
    try {
      const r = await runSizing(parsed.data, pool.evaluate, { onProgress: (d, t) => io.err(`\rholdline size: ${d} of ${t} candidates`) });
      io.err("\n");
      if (r.message) io.err(`holdline size: ${r.message}\n`);
      io.out(JSON.stringify(r, null, 2) + "\n");
      return 0;
    } catch (e) {
      if (e instanceof PhysicsInputError) {
        io.err(`holdline size: ${e.message}\n`);
        return 1;
      }
      throw e;
    } finally {
      await pool.close();
    }
  }

  io.err(`holdline: unknown command "${command}"\n\n${HELP}\n`);
  return 2;
}

const isEntry = process.argv[1] && /holdline\.(ts|mjs)$/.test(process.argv[1]);
if (isEntry) {
  // exitCode, not exit(): a large answer piped to another program must be written out in full first.
  main(process.argv.slice(2)).then(
    (code) => {
      process.exitCode = code;
    },
    (e) => {
      process.stderr.write(`holdline: ${(e as Error).stack ?? e}\n`);
      process.exitCode = 1;
    },
  );
}
