/** vitest global setup: rebuilds the CLI bundle (dist/cli/) when cli/ or lib/ changed, so tests that start the sizer's threads or the bin run the current code. */
import { cliBundleIsStale } from "../../scripts/source-stamp.mjs";
import { bundle } from "../../scripts/bundle.mjs";
import { ROOT } from "../helpers/cli-run";

export default async function setup(): Promise<void> {
  if (cliBundleIsStale(ROOT)) await bundle({ quiet: true });
}
