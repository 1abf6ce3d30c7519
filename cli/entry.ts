/** The holdline program: runs the CLI on this process's arguments (bundled to dist/cli/holdline.mjs). */
import { main } from "./holdline";

// exitCode, not exit(): a large answer piped to another program must be written out in full first.
main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code;
  },
  (e: unknown) => {
    process.stderr.write(`holdline: ${e instanceof Error ? e.message : String(e)}\n`);
    process.exitCode = 1;
  },
);
