/**
 * Accounts for a shared (PostgreSQL) install, from the command line: the first editor,
 * and later ones. Migrates the database first, so this can be the first command run
 * against a new, empty database.
 *   npm run account -- add USERNAME --role editor --name "Full Name"   (password: prompted, or HOLDLINE_PASSWORD)
 *   npm run account -- list
 *   npm run account -- disable USERNAME | enable USERNAME
 */
import { parseArgs } from "node:util";
import { createInterface } from "node:readline";
import { resolveDatabasePath } from "../lib/db/path";
import { prepareDatabase } from "../lib/db/prepare";
import { createPrismaClient } from "../lib/db/client";
import { createAccount, listAccounts, setAccountDisabled } from "../lib/db/accounts";
import { redactLocation } from "../lib/db/provider";
import { authMode } from "../lib/db/auth-mode";

const { values, positionals } = parseArgs({
  allowPositionals: true,
  options: { role: { type: "string", default: "planner" }, name: { type: "string" } },
});
const [command, username] = positionals;

async function readPassword(): Promise<string> {
  if (process.env.HOLDLINE_PASSWORD) return process.env.HOLDLINE_PASSWORD;
  const rl = createInterface({ input: process.stdin, output: process.stderr, terminal: process.stdin.isTTY });
  const out = rl as unknown as { _writeToOutput?: (s: string) => void; output: NodeJS.WritableStream };
  process.stderr.write("Password (10 characters or more): ");
  if (process.stdin.isTTY) out._writeToOutput = () => {}; // do not echo
  const line = await new Promise<string>((resolve) => rl.once("line", resolve));
  rl.close();
  process.stderr.write("\n");
  return line;
}

const location = resolveDatabasePath();
if (!command || !["add", "list", "disable", "enable"].includes(command)) {
  console.error("usage: npm run account -- add USERNAME --role editor|planner --name \"Full Name\" | list | disable USERNAME | enable USERNAME");
  process.exit(2);
}
await prepareDatabase(location, { quiet: false });
const db = createPrismaClient(location);
try {
  if (authMode() === "none") {
    console.error(`holdline: note: ${redactLocation(location)} is a single-user SQLite database; accounts are used only with a shared (postgresql://) database or HOLDLINE_AUTH=accounts.`);
  }
  if (command === "list") {
    for (const a of await listAccounts(db)) console.log(`${a.username}\t${a.role}\t${a.disabled ? "disabled" : "active"}\t${a.displayName}`);
  } else if (command === "add") {
    const r = await createAccount(db, { username, displayName: values.name ?? username, role: values.role, password: await readPassword() });
    if (!r.ok) {
      for (const [field, msgs] of Object.entries(r.fieldErrors)) console.error(`${field || "account"}: ${msgs.join("; ")}`);
      process.exitCode = 1;
    } else console.log(`holdline: account ${r.account.username} (${r.account.role}) created`);
  } else {
    const all = await listAccounts(db);
    const a = all.find((x) => x.username === username?.toLowerCase());
    if (!a) {
      console.error(`holdline: no account ${username}`);
      process.exitCode = 1;
    } else {
      await setAccountDisabled(db, a.id, command === "disable");
      console.log(`holdline: account ${a.username} ${command}d`);
    }
  }
} finally {
  await db.$disconnect();
}
