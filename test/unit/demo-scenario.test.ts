import { describe, it, expect } from "vitest";
import { readFileSync } from "node:fs";
import path from "node:path";
import { DEMO_SCENARIO, DEMO_SCENARIO_FILE, type DemoTemplate } from "../../lib/db/demo-scenario";
import { layerSchema, libraryFileSchema, segmentSchema, templateSchemas, TEMPLATE_KINDS, type TemplateKind } from "../../lib/schemas/templates";

/** The fields a demo template may carry besides its schema's: where its figures come from. */
const PROVENANCE_FIELDS = ["sources", "invented"];
/** Schema fields that name a published source, by kind. */
const SOURCE_FIELDS: Record<TemplateKind, string[]> = {
  materials: ["conductivitySource", "densitySource", "specificHeatSource", "emissivitySource", "solarAbsorptivitySource"],
  products: ["compositionSource"],
  shippers: [],
  packs: [],
  routes: [],
  rulesets: ["source"],
};

const filled = (s: unknown) => typeof s === "string" && s.trim().length > 0;
const sourcesOf = (kind: TemplateKind, t: DemoTemplate): string[] => [
  ...SOURCE_FIELDS[kind].map((f) => t[f]).filter(filled) as string[],
  ...(t.sources ?? []),
];
const each = TEMPLATE_KINDS.flatMap((kind) => DEMO_SCENARIO_FILE[kind].map((t) => [kind, t.name, t] as const));

describe("the demo scenario data file", () => {
  it("is a holdline library file that the import reads as it is", () => {
    const raw = JSON.parse(readFileSync(path.resolve(import.meta.dirname, "../../lib/db/demo-scenario.json"), "utf8"));
    const r = libraryFileSchema.safeParse(raw);
    expect(r.success).toBe(true);
    expect(r.data).toEqual(DEMO_SCENARIO);
  });

  it.each(each)("%s: %s parses with its template schema", (kind, _name, t) => {
    const r = templateSchemas[kind].safeParse(t);
    expect(r.success ? [] : r.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`)).toEqual([]);
  });

  it.each(each)("%s: %s has no field its schema would drop unseen (a misspelt field)", (kind, _name, t) => {
    const known = new Set([...Object.keys(templateSchemas[kind].shape), ...PROVENANCE_FIELDS]);
    expect(Object.keys(t).filter((k) => !known.has(k))).toEqual([]);
    const nested: [unknown, Set<string>][] = [];
    if (kind === "routes") for (const s of t.segments as object[]) nested.push([s, new Set(Object.keys(segmentSchema.shape))]);
    if (kind === "shippers") for (const l of [...(t.wallLayers as object[]), ...((t.lidLayers as object[] | null) ?? [])]) nested.push([l, new Set(Object.keys(layerSchema.shape))]);
    for (const [o, keys] of nested) expect(Object.keys(o as object).filter((k) => !keys.has(k))).toEqual([]);
  });

  it.each(each)("%s: %s names its sources or says what is invented", (kind, _name, t) => {
    const sources = sourcesOf(kind, t);
    expect(sources.every(filled)).toBe(true);
    expect(sources.length > 0 || filled(t.invented)).toBe(true);
    if (t.invented !== undefined) expect(t.invented).toMatch(/invented|chosen for the demo/);
    // Every property of a material and every limit of a rule set comes from a source, never the demo.
    if (kind === "materials") expect(SOURCE_FIELDS.materials.filter((f) => !filled(t[f]))).toEqual([]);
    if (kind === "rulesets") expect(filled(t.source)).toBe(true);
  });

  it("keeps the kitchen, its boxes, products and routes invented, and says so", () => {
    expect(DEMO_SCENARIO_FILE.about.join(" ")).toMatch(/invented catering kitchen/);
    for (const kind of ["products", "shippers", "routes"] as const) {
      for (const t of DEMO_SCENARIO_FILE[kind]) expect(t.invented, `${kind}: ${t.name}`).toMatch(/invented for the demo/);
    }
  });

  it("marks recalled figures: every source is cited, 'from memory', 'uncertain', 'common practice' or 'as cited'", () => {
    // A cited source names a document (a handbook, standard, code, database, paper with its year or a
    // table); anything else must say how sure it is.
    const cited = /table|article|Handbook|Guide|Code|Regulations?|Standard|USDA|NIST|EN \d|FSANZ|FDA|Health Canada|RIBuild|\b(19|20)\d{2}\b/i;
    const marked = /from memory|uncertain|common practice|as cited/;
    const unmarked = each.flatMap(([kind, name, t]) => sourcesOf(kind, t).filter((s) => !cited.test(s) && !marked.test(s)).map((s) => `${kind}: ${name}: ${s}`));
    expect(unmarked).toEqual([]);
  });

  it("gives the seed one default rule set", () => {
    expect(DEMO_SCENARIO.rulesets.filter((r) => r.isDefault).length).toBe(1);
  });
});
