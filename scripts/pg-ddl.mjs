// PostgreSQL DDL derived from prisma/schema.prisma, following Prisma's PostgreSQL conventions
// (Int @default(autoincrement()) -> SERIAL, Float -> DOUBLE PRECISION, DateTime -> TIMESTAMP(3),
// @unique -> CREATE UNIQUE INDEX "Model_field_key", @@index -> "Model_a_b_idx").
//
// It helps write a migration; it does not apply one. Migrations stay committed SQL files
// that are never edited once applied (prisma/migrations-postgresql/<timestamp>_<name>/migration.sql).
//   node scripts/pg-ddl.mjs                 # CREATE TABLE for every model
//   node scripts/pg-ddl.mjs Product Plan    # only these models
//   node scripts/pg-ddl.mjs --add Product.shape   # ALTER TABLE … ADD COLUMN for one field
//   node scripts/pg-ddl.mjs --twin 20261202090000_x  # write the PostgreSQL twin of an additive SQLite migration
// test/unit/schema-drift.pg.test.ts prints the --add statement for every column a PostgreSQL
// migration is missing.
import { readFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

/** Models of a Prisma schema: fields with type, optionality and the attributes that shape DDL. */
export function parseModels(schema) {
  const models = [];
  const noComments = schema.replace(/\/\/.*$/gm, "");
  for (const m of noComments.matchAll(/model\s+(\w+)\s*\{([^}]*)\}/g)) {
    const fields = [];
    const indexes = [];
    for (const raw of m[2].split("\n")) {
      const line = raw.trim();
      if (!line) continue;
      const idx = /^@@index\(\[([^\]]*)\]\)/.exec(line);
      if (idx) {
        indexes.push(idx[1].split(",").map((s) => s.trim()));
        continue;
      }
      if (line.startsWith("@@")) continue;
      const [name, typeRaw, ...attrs] = line.split(/\s+/);
      const rest = attrs.join(" ");
      const dflt = /@default\(((?:[^()]|\([^()]*\))*)\)/.exec(rest);
      fields.push({
        name,
        type: typeRaw.replace("?", ""),
        optional: typeRaw.endsWith("?"),
        id: /@id\b/.test(rest),
        unique: /@unique\b/.test(rest),
        updatedAt: /@updatedAt\b/.test(rest),
        default: dflt ? dflt[1] : null,
      });
    }
    models.push({ name: m[1], fields, indexes });
  }
  return models;
}

export const PG_TYPE = { Int: "INTEGER", Float: "DOUBLE PRECISION", String: "TEXT", Boolean: "BOOLEAN", DateTime: "TIMESTAMP(3)", Json: "JSONB" };

function defaultSql(f) {
  if (f.default === null) return "";
  if (f.default === "now()") return " DEFAULT CURRENT_TIMESTAMP";
  if (f.default.startsWith('"')) return ` DEFAULT '${JSON.parse(f.default).replace(/'/g, "''")}'`;
  return ` DEFAULT ${f.default}`;
}

export function columnSql(f) {
  if (f.default === "autoincrement()") return `"${f.name}" SERIAL NOT NULL`;
  const type = PG_TYPE[f.type];
  if (!type) throw new Error(`pg-ddl: no PostgreSQL type for ${f.type} (${f.name})`);
  return `"${f.name}" ${type}${f.optional ? "" : " NOT NULL"}${defaultSql(f)}`;
}

export function createTableSql(model) {
  const lines = model.fields.map((f) => "    " + columnSql(f));
  const pk = model.fields.filter((f) => f.id).map((f) => `"${f.name}"`);
  if (pk.length) lines.push(`    CONSTRAINT "${model.name}_pkey" PRIMARY KEY (${pk.join(", ")})`);
  const out = [`CREATE TABLE "${model.name}" (\n${lines.join(",\n")}\n);`];
  for (const f of model.fields.filter((x) => x.unique)) out.push(`CREATE UNIQUE INDEX "${model.name}_${f.name}_key" ON "${model.name}"("${f.name}");`);
  for (const cols of model.indexes) {
    out.push(`CREATE INDEX "${model.name}_${cols.join("_")}_idx" ON "${model.name}"(${cols.map((c) => `"${c}"`).join(", ")});`);
  }
  return out.join("\n");
}

/** ALTER TABLE for one field. A NOT NULL column without a default gets one only if you give it; say so. */
export function addColumnSql(model, field) {
  const f = model.fields.find((x) => x.name === field);
  if (!f) throw new Error(`pg-ddl: ${model.name} has no field ${field}`);
  let sql = `ALTER TABLE "${model.name}" ADD COLUMN ${columnSql(f)};`;
  if (f.unique) sql += `\nCREATE UNIQUE INDEX "${model.name}_${f.name}_key" ON "${model.name}"("${f.name}");`;
  if (!f.optional && f.default === null && !f.updatedAt) sql += "  -- NOT NULL without a default: give existing rows a value (as the SQLite migration does)";
  return sql;
}

/**
 * The PostgreSQL twin of a SQLite migration made only of comments, `ALTER TABLE … ADD COLUMN`
 * and `CREATE [UNIQUE] INDEX` statements (the usual additive migration), with Prisma's type
 * mapping (REAL -> DOUBLE PRECISION, DATETIME -> TIMESTAMP(3)). Anything else (a table copy,
 * PRAGMA, CREATE TABLE) throws: write that twin by hand.
 */
export function twinOfSqliteMigration(sql, name = "migration") {
  const out = [`-- PostgreSQL twin of prisma/migrations/${name} (scripts/pg-ddl.mjs --twin).`];
  for (const stmt of sql.replace(/\r/g, "").split(/;\s*(?:\n|$)/)) {
    const lines = stmt.split("\n");
    const comments = lines.filter((l) => l.trim().startsWith("--"));
    const body = lines.filter((l) => !l.trim().startsWith("--")).join("\n").trim();
    out.push(...comments.map((c) => c.trim()));
    if (!body) continue;
    if (/^ALTER TABLE\s+"\w+"\s+ADD COLUMN\s+"\w+"\s+/i.test(body)) {
      out.push(body.replace(/\bREAL\b/g, "DOUBLE PRECISION").replace(/\bDATETIME\b/g, "TIMESTAMP(3)") + ";");
    } else if (/^CREATE (UNIQUE )?INDEX\s+"\w+"\s+ON\s+"\w+"\s*\(/i.test(body)) {
      out.push(body + ";");
    } else {
      throw new Error(`pg-ddl: ${name}: cannot translate this statement; write the PostgreSQL twin by hand:\n${body}`);
    }
  }
  return out.join("\n") + "\n";
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const models = parseModels(readFileSync(path.join(root, "prisma", "schema.prisma"), "utf8"));
  const args = process.argv.slice(2);
  const byName = (n) => {
    const m = models.find((x) => x.name === n);
    if (!m) throw new Error(`pg-ddl: no model ${n}`);
    return m;
  };
  if (args[0] === "--twin") {
    // Writes prisma/migrations-postgresql/<name>/migration.sql for each named SQLite migration.
    const { mkdirSync, writeFileSync, existsSync } = await import("node:fs");
    for (const name of args.slice(1)) {
      const target = path.join(root, "prisma", "migrations-postgresql", name, "migration.sql");
      if (existsSync(target)) throw new Error(`pg-ddl: ${target} exists; never edit an applied migration`);
      const twin = twinOfSqliteMigration(readFileSync(path.join(root, "prisma", "migrations", name, "migration.sql"), "utf8"), name);
      mkdirSync(path.dirname(target), { recursive: true });
      writeFileSync(target, twin);
      console.error(`pg-ddl: wrote ${path.relative(root, target)}`);
    }
  } else if (args[0] === "--add") {
    for (const spec of args.slice(1)) {
      const [model, field] = spec.split(".");
      console.log(addColumnSql(byName(model), field));
    }
  } else {
    const chosen = args.length ? args.map(byName) : models;
    console.log(chosen.map(createTableSql).join("\n\n"));
  }
}
