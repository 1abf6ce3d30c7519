// `npm start`: serves the built app on HOLDLINE_HOST (default 127.0.0.1, loopback only) and PORT (default
// 3000). Any other address is reachable from the network, so it needs a sign-in: accounts (a shared
// PostgreSQL database or HOLDLINE_AUTH=accounts, lib/db/auth-mode.ts), or else HOLDLINE_PASSPHRASE (at
// least 12 characters): pages then ask for it once and the API wants `Authorization: Bearer <passphrase>`.
import { spawn } from "node:child_process";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { authMode } from "../lib/db/auth-mode";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const host = process.env.HOLDLINE_HOST || "127.0.0.1";
const port = process.env.PORT || "3000";
const loopback = ["127.0.0.1", "localhost", "::1", "[::1]"].includes(host.toLowerCase());
const pass = process.env.HOLDLINE_PASSPHRASE ?? "";
const accounts = authMode() === "accounts";

if (!loopback && !accounts && pass.length < 12) {
  console.error(
    `holdline: refusing to listen on ${host}: an address other than loopback is reachable from the network.\n` +
      `Set HOLDLINE_PASSPHRASE (at least 12 characters) to share it behind a sign-in, use accounts (a shared PostgreSQL DATABASE_URL or HOLDLINE_AUTH=accounts), or leave HOLDLINE_HOST unset.`,
  );
  process.exit(1);
}
if (!loopback && (host === "0.0.0.0" || host === "::") && !process.env.HOLDLINE_ALLOWED_HOSTS) {
  console.error(`holdline: listening on all addresses; set HOLDLINE_ALLOWED_HOSTS to the names or addresses people type (e.g. 192.168.1.20,kitchen.local), or they will be refused.`);
}

const next = spawn(path.join(root, "node_modules", ".bin", "next"), ["start", "-H", host, "-p", port], { stdio: "inherit", cwd: root });
for (const sig of ["SIGINT", "SIGTERM"] as const) process.on(sig, () => next.kill(sig));
next.on("exit", (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
