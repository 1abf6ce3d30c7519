/**
 * holdline: the command-line face of Holdline. Input is checked with the same zod
 * schemas as the pages and the API. Output is JSON on stdout; messages go to stderr.
 *
 * Start-up is kept short: the database layer (Prisma, better-sqlite3, the demo scenario) is
 * imported only when a command works on the library or an input names a template, and the sizer
 * threads only for `size`. cli/entry.ts runs `main` as a program; tests call it with their own io.
 */
import { parseArgs } from "node:util";
import { readFileSync, writeFileSync } from "node:fs";
import type { z } from "zod";
import type { Db } from "../lib/db/client";
import { resolveDatabasePath } from "../lib/db/path";
import type { SizeParsed } from "../lib/schemas/size";
import { fieldErrorsOf, type FieldErrors } from "../lib/schemas/errors";
import { PhysicsInputError } from "../lib/physics/validation";
import { CliError } from "./errors";

const schemaNames = async () => Object.keys((await import("../lib/schemas/json-schema")).NAMED_SCHEMAS);
/** The schema names for the help text, wrapped under its description column. */
const schemaNameLines = (names: string[]): string => {
  const lines: string[] = [];
  let line = "";
  for (const n of names) {
    const next = line ? `${line}, ${n}` : n;
    if (next.length > 44 && line) {
      lines.push(line + ",");
      line = n;
    } else line = next;
  }
  lines.push(line);
  return lines.map((l, i) => " ".repeat(38) + (i === 0 ? "(" : " ") + l + (i === lines.length - 1 ? ")" : "")).join("\n");
};

/** One block of help per planner, from its registry entry: `holdline <kind> FILE|-` and its lines. */
const plannerHelp = async () => {
  const { PLANNERS } = await import("../lib/planners/registry");
  return Object.values(PLANNERS)
    .map((e) => e.cliHelp.map((line, i) => (i === 0 ? `  holdline ${e.kind} FILE|-`.padEnd(38) : " ".repeat(38)) + line).join("\n"))
    .join("\n");
};

const help = async () => `holdline — hold, thaw and pack-out planning from transient heat transfer

Usage:
  holdline export [--out FILE]        write every template (and the units setting) as JSON
  holdline import FILE|-              add or update templates from such a file, all or nothing
${await plannerHelp()}
  holdline calibrate --plan FILE --log CSV
                                      fit the plan (a hold or thaw input, or
                                      holdline plans show ID --json) to a logger
                                      CSV; the first column is time, the next are
                                      inside air, product, pack, outside air (hold)
                                      or product centre, surface (thaw), unless
    --columns R,R,…                   names them: inside_air, product[:LINE][:surface],
                                      pack[:LINE], outside_air, or - to leave one out
    --time s|min|h|iso|day_first|month_first   (default: guessed from the file)
    --unit C|F  --delimiter ,|;|tab  --decimal .|,  --fit wallConductance,innerH,…
    --planner hold|thaw               (default: from the plan file)
  holdline plans [--json]             list the saved plans (id, kind, name, when saved)
  holdline plans show ID [--json]     one saved plan; with --json its input, as a file that
                                      holdline KIND FILE accepts
  holdline schema NAME                print the JSON Schema of an input
${schemaNameLines(await schemaNames())}
  holdline --help                     this text

Options:
  --db PATH      SQLite file, or postgresql:// URL of a shared library (default: DATABASE_URL, else data/holdline.db)
  --no-seed      do not seed the demo scenario into a brand-new database
  --out FILE     write the JSON answer to FILE instead of standard output

Results are model estimates; check real temperatures with a calibrated probe
thermometer or data logger, and follow your local food code and regulator.`;

export interface CliIo {
  out: (s: string) => void;
  err: (s: string) => void;
  /** Standard input, for "-" (default: file descriptor 0). */
  stdin?: () => string;
  /** Whether err is a terminal, where the sizer's progress line is redrawn in place. */
  errIsTTY?: boolean;
}
const STDIO: CliIo = { out: (s) => void process.stdout.write(s), err: (s) => void process.stderr.write(s), errIsTTY: process.stderr.isTTY };

/** Reads JSON from a file or standard input ("-"). A leading byte-order mark is ignored. */
function readJsonInput(file: string, command: string, io: CliIo): unknown {
  let text: string;
  try {
    text = file === "-" ? (io.stdin ? io.stdin() : readFileSync(0, "utf8")) : readFileSync(file, "utf8");
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === "ENOENT" ? "no such file" : code === "EISDIR" ? "it is a folder" : code === "EACCES" ? "permission denied" : (e as Error).message;
    throw new CliError(`holdline ${command}: cannot read ${file}: ${why}. Nothing was changed.`);
  }
  try {
    return JSON.parse(text.replace(/^\uFEFF/, ""));
  } catch (e) {
    throw new CliError(`holdline ${command}: cannot read ${file} as JSON: ${(e as Error).message}. Nothing was changed.`);
  }
}

/** JSON text of an answer. Non-finite numbers (never expected) are written as null and reported. */
function toJson(value: unknown, io: CliIo, command: string): string {
  let bad = 0;
  const text = JSON.stringify(value, (_k, v) => (typeof v === "number" && !Number.isFinite(v) ? (bad++, null) : v), 2) + "\n";
  if (bad) io.err(`holdline ${command}: warning: ${bad} non-finite number(s) in the answer were written as null; this is a defect, please report it\n`);
  return text;
}

function problemLines(fieldErrors: FieldErrors): string {
  return Object.entries(fieldErrors)
    .map(([k, v]) => `  ${k || "(input)"}: ${v.join("; ")}`)
    .join("\n");
}

/**
 * A Db that opens the real database on first use. The template resolvers (lib/db/resolve.ts) decide
 * what needs a look-up; an input that spells out every template never touches the database.
 */
function lazyDb(open: () => Promise<Db>): { db: Db; close: () => Promise<void> } {
  type Callable = (...a: unknown[]) => unknown;
  let real: Promise<Db> | null = null;
  const get = () => (real ??= open()) as Promise<unknown> as Promise<Record<PropertyKey, Callable & Record<PropertyKey, Callable>>>;
  const db = new Proxy(
    {},
    {
      get: (_t, model) =>
        typeof model === "string" && model.startsWith("$")
          ? (...args: unknown[]) => get().then((d) => d[model](...args))
          : new Proxy({}, { get: (_u, method) => (...args: unknown[]) => get().then((d) => d[model][method](...args)) }),
    },
  ) as Db;
  return {
    db,
    close: async () => {
      if (real) await (await real.catch(() => null))?.$disconnect();
    },
  };
}

type Resolved = { ok: true; value: unknown } | { ok: false; fieldErrors: FieldErrors };

export async function main(argv: string[], io: CliIo = STDIO): Promise<number> {
  try {
    return await run(argv, io);
  } catch (e) {
    if (e instanceof CliError) {
      io.err(e.message + "\n");
      return e.code;
    }
    const message = e instanceof Error ? e.message : String(e);
    io.err(`holdline: ${message.split("\n")[0]}${process.env.HOLDLINE_DEBUG ? "\n" + ((e as Error).stack ?? "") : " (set HOLDLINE_DEBUG=1 for details)"}\n`);
    return 1;
  }
}

async function run(argv: string[], io: CliIo): Promise<number> {
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
        json: { type: "boolean" },
        // holdline calibrate --plan FILE --log CSV (cli/calibrate-args.ts)
        plan: { type: "string" },
        log: { type: "string" },
        planner: { type: "string" },
        columns: { type: "string" },
        time: { type: "string" },
        unit: { type: "string" },
        delimiter: { type: "string" },
        decimal: { type: "string" },
        fit: { type: "string" },
      },
    });
  } catch (e) {
    io.err(`holdline: ${(e as Error).message}\n\n${await help()}\n`);
    return 2;
  }
  const { values, positionals } = parsed;
  const [command, ...rest] = positionals;
  if (values.help || command === "help") {
    io.out((await help()) + "\n");
    return 0;
  }
  if (!command) {
    io.err((await help()) + "\n");
    return 2;
  }
  const emit = (value: unknown) => {
    const text = toJson(value, io, command);
    if (!values.out) return io.out(text);
    try {
      writeFileSync(values.out, text);
    } catch (e) {
      throw new CliError(`holdline ${command}: cannot write ${values.out}: ${(e as Error).message}`);
    }
  };

  if (command === "schema") {
    const name = rest[0];
    const { jsonSchemaOf, NAMED_SCHEMAS } = await import("../lib/schemas/json-schema");
    const schema = name && Object.hasOwn(NAMED_SCHEMAS, name) ? jsonSchemaOf(name) : null;
    if (!schema) throw new CliError(`holdline schema: ${name ? `no input named "${name}"; ` : ""}name one of ${Object.keys(NAMED_SCHEMAS).join(", ")}`, 2);
    emit(schema);
    return 0;
  }

  if (values.db !== undefined && !values.db.trim()) throw new CliError(`holdline ${command}: --db needs the path of a database file`, 2);
  const dbPath = values.db ? resolveDatabasePath({ ...process.env, DATABASE_URL: values.db }) : resolveDatabasePath();
  const library = () => import("./library");
  /** Runs fn on the library; the database is opened only if fn queries it. */
  const withDb = async <T>(fn: (db: Db) => Promise<T>): Promise<T> => {
    const lazy = lazyDb(async () => (await library()).openLibrary(dbPath, { seed: !values["no-seed"] }));
    try {
      return await fn(lazy.db);
    } finally {
      await lazy.close();
    }
  };

  if (command === "export") {
    const { exportLibrary } = await library();
    emit(await withDb(exportLibrary));
    return 0;
  }

  if (command === "import") {
    const file = rest[0];
    if (!file) throw new CliError("holdline import: give a file name, or - for standard input", 2);
    const data = readJsonInput(file, "import", io);
    const { importLibrary } = await library();
    const r = await withDb((db) => importLibrary(db, data));
    if (!r.ok) {
      io.err(`holdline import: the file has ${r.errors.length} problem(s); nothing was changed.\n${r.errors.map((e) => "  " + e).join("\n")}\n`);
      return 1;
    }
    io.err(`holdline import: ${r.created} added, ${r.updated} updated.\n`);
    return 0;
  }

  if (command === "plans") {
    const { listPlans, getPlan } = await library();
    if (rest[0] === undefined) {
      const plans = await withDb(listPlans);
      if (values.json) emit(plans.map((p) => ({ id: p.id, kind: p.kind, name: p.name, createdAt: p.createdAt.toISOString() })));
      else if (!plans.length) io.err("holdline plans: no saved plans yet (save one from a planner page)\n");
      else io.out(plans.map((p) => `${String(p.id).padStart(4)}  ${p.kind.padEnd(6)}  ${p.createdAt.toISOString().slice(0, 16).replace("T", " ")}  ${p.name}`).join("\n") + "\n");
      return 0;
    }
    if (rest[0] !== "show") throw new CliError(`holdline plans: unknown sub-command "${rest[0]}"; use holdline plans, or holdline plans show ID`, 2);
    const idText = rest[1] ?? "";
    if (!/^[1-9][0-9]{0,15}$/.test(idText) || !Number.isSafeInteger(Number(idText))) throw new CliError(`holdline plans show: give a plan id (a whole number from holdline plans)${idText ? `, not "${idText}"` : ""}`, 2);
    const plan = await withDb((db) => getPlan(db, Number(idText)));
    if (!plan) throw new CliError(`holdline plans show: no saved plan with id ${idText}`);
    if (values.json) emit(plan.input);
    else {
      io.out(`Plan ${plan.id}: ${plan.name}\n  kind: ${plan.kind}\n  saved: ${plan.createdAt.toISOString()}\n  rerun: holdline plans show ${plan.id} --json > plan.json && holdline ${plan.kind} plan.json\n`);
      emit(plan.result);
    }
    return 0;
  }

  const { isPlannerKind, plannerOf } = await import("../lib/planners/registry");
  if (isPlannerKind(command)) {
    const file = rest[0];
    const fromFiles = command === "calibrate" && (values.plan !== undefined || values.log !== undefined);
    if (!file && !fromFiles) throw new CliError(`holdline ${command}: give an input file, or - for standard input (see holdline schema ${command})`, 2);
    const data = fromFiles ? (await import("./calibrate-args")).calibrateInputFromFiles(values, (f) => readJsonInput(f, command, io)) : readJsonInput(file, command, io);
    const entry = plannerOf(command);
    const { resolvePlannerInput } = await import("../lib/db/resolve");
    let resolved: Resolved;
    try {
      resolved = await withDb((db) => resolvePlannerInput(db, command, data));
    } catch (e) {
      // A shape the name look-up cannot walk (say, a box whose layers are not a list): the schema names the field.
      const shape = entry.schema.safeParse(data);
      if (shape.success || e instanceof CliError) throw e;
      resolved = { ok: false, fieldErrors: fieldErrorsOf(shape.error) };
    }
    if (command === "size") return size(resolved, entry.schema, io, emit);
    const { runPlanner } = await import("../lib/planners/run");
    const r = resolved.ok ? await runPlanner(entry, resolved.value) : resolved;
    if (!r.ok) {
      io.err(`holdline ${command}: the input has problems; nothing was computed:\n${problemLines(r.fieldErrors)}\n`);
      return 1;
    }
    emit(r.result.result);
    return 0;
  }

  io.err(`holdline: unknown command "${command}"\n\n${await help()}\n`);
  return 2;
}

async function size(resolved: Resolved, schema: z.ZodType, io: CliIo, emit: (v: unknown) => void): Promise<number> {
  const parsed = resolved.ok ? (schema.safeParse(resolved.value) as z.ZodSafeParseResult<SizeParsed>) : null;
  const problems = !resolved.ok ? resolved.fieldErrors : parsed && !parsed.success ? fieldErrorsOf(parsed.error) : null;
  if (problems || !parsed?.success) {
    io.err(`holdline size: the input has problems; nothing was computed:\n${problemLines(problems ?? {})}\n`);
    return 1;
  }
  const [{ nodePool }, { runSizing }] = await Promise.all([import("./size-pool"), import("../lib/physics/sizing")]);
  const pool = nodePool(parsed.data);
  try {
    const r = await runSizing(parsed.data, pool.evaluate, { onProgress: io.errIsTTY ? (d, t) => io.err(`\rholdline size: ${d} of ${t} candidates`) : undefined });
    io.err(`${io.errIsTTY ? "\r" : ""}holdline size: ${r.evaluated} candidates run, ${r.pruned} decided by monotonicity\n`);
    if (r.message) io.err(`holdline size: ${r.message}\n`);
    emit(r);
    return 0;
  } catch (e) {
    if (e instanceof PhysicsInputError) throw new CliError(`holdline size: ${e.message}`);
    throw e;
  } finally {
    await pool.close();
  }
}
