/**
 * The demo scenario: an invented catering kitchen ("Quillfield Yard Kitchen") with its products,
 * boxes, coolant packs, routes, rule sets and materials. The data lives in `demo-scenario.json`, a
 * holdline library file (the format of `holdline export` / `holdline import`) in which every template
 * names the published sources of its figures — materials per property, products in `compositionSource`
 * and `sources`, packs in `sources`, rule sets in `source` — and says in `invented` what was made up
 * for the demo. This module checks the file with the template schemas (lib/schemas/templates.ts) when
 * it is first imported, so a broken edit fails every test and the seed instead of reaching a database.
 */
import data from "./demo-scenario.json";
import { libraryFileSchema, type LibraryFile, type TemplateKind } from "../schemas/templates";

/** Where a demo template's figures come from: its published sources and what was invented for the demo. */
export interface DemoProvenance {
  sources?: string[];
  invented?: string;
}

/** The raw demo file: the library file plus its provenance fields, which the schemas do not keep. */
export type DemoTemplate = { name: string } & DemoProvenance & Record<string, unknown>;
export type DemoScenarioFile = { about: string[] } & Record<TemplateKind, DemoTemplate[]>;

export const DEMO_SCENARIO_FILE = data as unknown as DemoScenarioFile;

function checked(file: unknown): LibraryFile {
  const r = libraryFileSchema.safeParse(file);
  if (!r.success) {
    const problems = r.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("\n");
    throw new Error(`lib/db/demo-scenario.json fails the template schemas:\n${problems}`);
  }
  return r.data;
}

/** The demo scenario as the template schemas read it (provenance fields dropped). */
export const DEMO_SCENARIO: LibraryFile = checked(data);
