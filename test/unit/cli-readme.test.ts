/**
 * Every command in the README's command-line section, run as typed (`npx holdline …` through a shell,
 * in order, with the README's own redirections) in a fresh folder laid out like the project (the
 * example inputs under public/examples/, the holdline bin on npx's local path, a new database). The
 * commands are parsed from the README, so the README and this test cannot drift; each must print
 * what the README promises. The README's JSON examples must also be the files in public/examples/.
 */
import { describe, it, expect, beforeAll } from "vitest";
import { mkdirSync, mkdtempSync, readFileSync, symlinkSync, writeFileSync, existsSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { ROOT, sh, readmeSection, codeBlocks, commandsOf, STACK_TRACE, type Ran } from "../helpers/cli-run";
import { openLibrary } from "../../cli/library";
import { resolvePlannerInput } from "../../lib/db/resolve";
import { savePlan } from "../../lib/db/plans";

const section = readmeSection("Command line");
// Every shell block of the section that runs the command through npx (the global-install block does not).
const commands = codeBlocks(section)
  .filter((b) => b.lang === "sh" && /^npx holdline /m.test(b.body))
  .flatMap((b) => commandsOf(b.body));
const example = (name: string) => JSON.parse(readFileSync(path.join(ROOT, "public", "examples", name), "utf8"));

/** The fields the README says each calculation answers with. */
const PROMISED: Record<string, string[]> = {
  warmup: ["timeToLimit_s", "method", "biot", "warnings", "assumptions", "series"],
  hold: ["holdTime_s", "margin_s", "failsFirst", "band", "heatGain_J", "energyBalanceError", "warnings", "assumptions", "series"],
  thaw: ["thawTime_s", "surfaceAboveLimit_s", "maxSurface_C", "compliance", "estimates", "startBy", "warnings", "series", "comparison"],
  size: ["candidates", "pareto", "nearMisses"],
  cool: ["stages", "maxDepth_m", "comparison", "warnings", "assumptions", "series"],
};

describe("README command-line section, run as typed", () => {
  const dir = mkdtempSync(path.join(os.tmpdir(), "holdline-readme-"));
  const env = { DATABASE_URL: path.join(dir, "holdline.db") };
  const ran: Ran[] = [];

  beforeAll(async () => {
    // A folder like the project: npx finds the holdline bin locally, the README's paths resolve.
    writeFileSync(path.join(dir, "package.json"), JSON.stringify({ name: "holdline-readme-check", private: true }));
    mkdirSync(path.join(dir, "node_modules", ".bin"), { recursive: true });
    symlinkSync(path.join(ROOT, "bin", "holdline.mjs"), path.join(dir, "node_modules", ".bin", "holdline"));
    symlinkSync(path.join(ROOT, "public"), path.join(dir, "public"));
    // A plan saved as the hold page saves one (its input spelled out), so `plans show 1` has something to show.
    const db = await openLibrary(env.DATABASE_URL, { seed: true });
    const input = await resolvePlannerInput(db, "hold", example("hold.json"));
    if (!input.ok) throw new Error(JSON.stringify(input.fieldErrors));
    await savePlan(db, { kind: "hold", name: "README check plan", input: input.value, result: null });
    await db.$disconnect();
    for (const c of commands) ran.push(sh(c, { cwd: dir, env, timeout_ms: 180_000 }));
  }, 600_000);

  const find = (re: RegExp) => {
    const r = ran.find((x) => re.test(x.command));
    expect(r, `README runs a command matching ${re}`).toBeDefined();
    return r!;
  };
  const answer = (re: RegExp) => JSON.parse(find(re).stdout);

  it("the section lists the commands, every one through npx holdline", () => {
    expect(commands.length).toBeGreaterThanOrEqual(10);
    for (const c of commands) expect(c).toMatch(/^npx holdline /);
  });

  it("every command exits 0 and prints no stack trace", () => {
    for (const r of ran) {
      expect({ command: r.command, status: r.status, stderr: r.stderr.slice(0, 2000) }).toEqual({ command: r.command, status: 0, stderr: expect.not.stringMatching(STACK_TRACE) });
      expect(r.stdout).not.toMatch(STACK_TRACE);
    }
  });

  it("--help prints the usage of every command the README shows", () => {
    const help = find(/--help/).stdout;
    expect(help).toMatch(/^Usage:/m);
    for (const c of commands) expect(help).toContain(`holdline ${c.split(/\s+/)[2]}`);
  });

  it("export writes the whole library to the file; importing it and the example file reports what changed", () => {
    const lib = JSON.parse(readFileSync(path.join(dir, "library.json"), "utf8"));
    expect(lib.format).toBe("holdline-library");
    for (const kind of ["materials", "products", "shippers", "packs", "routes", "rulesets"]) expect(lib[kind].length).toBeGreaterThan(0);
    expect(lib.settings).toBeDefined();
    expect(find(/import library\.json/).stderr).toMatch(/0 added, \d+ updated/);
    expect(find(/import public\/examples\/import\.json/).stderr).toMatch(/1 added, 0 updated/);
  });

  it("schema product prints a JSON Schema", () => {
    const s = answer(/schema product/);
    expect(s.$schema).toMatch(/json-schema/);
    expect(s.properties.composition).toBeDefined();
  });

  for (const kind of Object.keys(PROMISED)) {
    it(`${kind} on the example answers with every field the README promises`, () => {
      const r = answer(new RegExp(`holdline ${kind} public/examples/${kind}\\.json`));
      for (const key of PROMISED[kind]) {
        expect(section, `README mentions ${key}`).toContain("`" + key + "`");
        expect(r, `${kind} answers with ${key}`).toHaveProperty(key);
      }
    });
  }

  it("the answers are real results, not placeholders", () => {
    const hold = answer(/holdline hold public/);
    expect(hold.holdTime_s === null || hold.holdTime_s > 3600).toBe(true);
    expect(hold.series.length).toBeGreaterThan(10);
    const thaw = answer(/holdline thaw public/);
    expect(thaw.thawTime_s).toBeGreaterThan(3600);
    expect(thaw.comparison.map((m: { kind: string }) => m.kind)).toEqual(expect.arrayContaining(["fridge_air", "running_water", "room_air"]));
    const warm = answer(/holdline warmup public/);
    expect(warm.timeToLimit_s.center).toBeGreaterThan(0);
    const size = answer(/holdline size public/);
    expect(size.candidates.length).toBeGreaterThan(1);
    const cool = answer(/holdline cool public/);
    expect(cool.stages.map((x: { reached_s: number | null }) => x.reached_s).every((t: number | null) => t !== null && t > 600)).toBe(true);
    expect(cool.maxDepth_m).toBeGreaterThan(0.005);
  });

  it("plans lists the saved plan; plans show --json writes an input the planner reruns to the same answer", () => {
    expect(find(/holdline plans$/).stdout).toMatch(/^\s*1\s+hold\s+.*README check plan$/m);
    expect(existsSync(path.join(dir, "plan.json"))).toBe(true);
    const rerun = answer(/holdline hold plan\.json/);
    expect(rerun.holdTime_s).toBe(answer(/holdline hold public/).holdTime_s);
  });

  it("the README's JSON examples are the files in public/examples/, and the section links them", () => {
    const blocks = codeBlocks(section).filter((b) => b.lang === "json").map((b) => JSON.parse(b.body));
    expect(blocks).toEqual([example("warmup.json"), example("hold.json")]);
    const inline = (lead: string) => JSON.parse(section.slice(section.indexOf(lead)).match(/`(\{.*?\})`/)![1]);
    expect(inline("A thaw input:")).toEqual(example("thaw.json"));
    expect(inline("A sizing input")).toEqual(example("size.json"));
    for (const f of ["warmup", "hold", "thaw", "size", "cool", "import"]) expect(section).toContain(`(public/examples/${f}.json)`);
  });
});
