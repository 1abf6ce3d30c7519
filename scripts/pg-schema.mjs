// Writes prisma/postgresql/schema.prisma, the PostgreSQL copy of prisma/schema.prisma.
// prisma/schema.prisma is the one source of truth for the models; a Prisma schema names
// one provider, so the PostgreSQL client is generated from this derived copy, which differs
// only in the datasource provider and the generated client's folder.
// `node scripts/pg-schema.mjs --check` exits 1 if the committed copy is stale.
import { readFileSync, writeFileSync, mkdirSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
export const SOURCE = path.join(root, "prisma", "schema.prisma");
export const TARGET = path.join(root, "prisma", "postgresql", "schema.prisma");

/** The PostgreSQL schema text for a SQLite schema text. Throws if the source does not have the expected blocks. */
export function postgresSchemaFrom(source) {
  const datasource = /datasource\s+db\s*\{[^}]*provider\s*=\s*"sqlite"[^}]*\}/;
  const output = /(generator\s+client\s*\{[^}]*output\s*=\s*)"\.\.\/lib\/db\/generated"/;
  if (!datasource.test(source)) throw new Error('prisma/schema.prisma: expected `datasource db { provider = "sqlite" }`');
  if (!output.test(source)) throw new Error('prisma/schema.prisma: expected the client output "../lib/db/generated"');
  const body = source
    .replace(datasource, (block) => block.replace('"sqlite"', '"postgresql"'))
    .replace(output, '$1"../../lib/db/generated-pg"');
  return (
    "// GENERATED from prisma/schema.prisma by scripts/pg-schema.mjs. Do not edit: change\n" +
    "// prisma/schema.prisma and run `node scripts/pg-schema.mjs` (npm install does it too).\n" +
    body
  );
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const want = postgresSchemaFrom(readFileSync(SOURCE, "utf8"));
  let have = "";
  try {
    have = readFileSync(TARGET, "utf8");
  } catch {}
  if (process.argv.includes("--check")) {
    if (have !== want) {
      console.error("prisma/postgresql/schema.prisma is stale: run `node scripts/pg-schema.mjs`");
      process.exit(1);
    }
  } else if (have !== want) {
    mkdirSync(path.dirname(TARGET), { recursive: true });
    writeFileSync(TARGET, want);
    console.error("holdline: wrote prisma/postgresql/schema.prisma");
  }
}
