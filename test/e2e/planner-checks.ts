/**
 * Checks the planner pages share in the browser suite: switching the units in settings, what a page says
 * in °F, and the latency figures of a planner computed in the page's worker (printed, never asserted:
 * a test never asserts on time; `npm run bench` measures speed).
 */
import { readFileSync } from "node:fs";
import type { Locator, Page } from "playwright-core";

export interface Timing {
  kind: string;
  stage: string;
  ms: number;
  compute_ms: number;
  /** With stage "helped": how many of the request's pieces the page's helper worker put in. */
  pieces?: number;
  /** When the page received the answer (performance.now()), stamped by the observer below. */
  at: number;
}

declare global {
  interface Window {
    __longTasks?: { start: number; ms: number }[];
    __lastInputAt?: number;
  }
}

/**
 * Before any page script: collect long tasks of the page's thread into window.__longTasks, stamp each entry
 * usePlanner pushes into window.__holdlineTimings with its arrival time, and note the last input event.
 */
export async function installLatencyProbes(page: Page): Promise<void> {
  await page.addInitScript(() => {
    const w = window as unknown as { __longTasks: { start: number; ms: number }[]; __holdlineTimings: unknown[]; __lastInputAt: number };
    w.__longTasks = [];
    const stamped: unknown[] = [];
    stamped.push = function (...xs: unknown[]) {
      for (const x of xs) (x as { at: number }).at = performance.now();
      return Array.prototype.push.apply(this, xs);
    };
    w.__holdlineTimings = stamped;
    w.__lastInputAt = 0;
    document.addEventListener("input", () => (w.__lastInputAt = performance.now()), true);
    try {
      new PerformanceObserver((list) => {
        for (const e of list.getEntries()) w.__longTasks.push({ start: e.startTime, ms: e.duration });
      }).observe({ type: "longtask", buffered: true });
    } catch {
      // a browser without long-task timing: the figure reads "not measured"
    }
  });
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? (s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2) : NaN;
};

/**
 * Types each value into `input` (cleared first, one key at a time like a person), waits for the full answer
 * to the last keystroke and prints one line: the first (central) answer's and the full answer's time after
 * the last keystroke, medians, and the longest task on the page's thread while typing and computing.
 */
export async function measureLatency(page: Page, label: string, kind: string, input: Locator, values: string[]) {
  const central: number[] = [];
  const full: number[] = [];
  const compute: number[] = [];
  let longest = 0;
  let longTasksOver50 = 0;
  for (const v of values) {
    await input.fill("");
    await page.evaluate(() => {
      window.__longTasks = [];
    });
    await input.pressSequentially(v, { delay: 60 });
    const handle = await page.waitForFunction(
      (k) => {
        const last = window.__lastInputAt ?? 0;
        const after = ((window.__holdlineTimings ?? []) as Timing[]).filter((t) => t.kind === k && t.at > last);
        return after.some((t) => t.stage === "full" || t.stage === "invalid" || t.stage === "error") ? after : null;
      },
      kind,
      { timeout: 120_000, polling: 20 },
    );
    const answers = (await handle.jsonValue()) as Timing[];
    const first = answers.find((t) => t.stage === "quick" || t.stage === "full");
    const done = answers.find((t) => t.stage === "full");
    if (!first || !done) throw new Error(`${label}: no result for ${v}: ${JSON.stringify(answers)}`);
    central.push(first.ms);
    full.push(done.ms);
    compute.push(done.compute_ms);
    const tasks = await page.evaluate(() => window.__longTasks ?? []);
    longest = Math.max(longest, ...tasks.map((t) => t.ms));
    longTasksOver50 += tasks.filter((t) => t.ms > 50).length;
  }
  const r = (x: number) => Math.round(x);
  console.log(
    `latency ${label}: central ${r(median(central))} ms after last keystroke (median of ${values.length}), full ${r(median(full))} ms (worker compute ${r(median(compute))} ms), longest main-thread task ${r(longest)} ms (${longTasksOver50} over 50 ms); central per keystroke ${central.map(r).join(", ")} ms`,
  );
  return { central, full, longest };
}

/** Settings page: the person's units, the way a person sets them. */
export async function setUnits(page: Page, baseUrl: string, u: { temperature: "C" | "F"; mass: "kg" | "lb"; length: "mm" | "in" }) {
  await page.goto(baseUrl + "/settings");
  await page.getByLabel("Temperature").selectOption(u.temperature);
  await page.getByLabel("Mass").selectOption(u.mass);
  await page.getByLabel("Length").selectOption(u.length);
  await page.getByRole("button", { name: "Use these units" }).click();
  await page.getByText(/Saved\. Every page/).waitFor();
}

/** Everything a person reads or hears on the page's main part: its text and its placeholders, labels and titles. */
export async function mainText(page: Page): Promise<string> {
  return page.evaluate(() => {
    const main = document.querySelector("main")!;
    const attrs = [...main.querySelectorAll("[placeholder],[title],[aria-label]")].flatMap((e) => ["placeholder", "title", "aria-label"].map((a) => e.getAttribute(a) ?? ""));
    return [main.innerText, ...attrs].join("\n");
  });
}

/** The id of the plan a "Saved — open the saved plan" page shows (/plans/ID). */
export const planIdOf = (url: string) => {
  const m = /\/plans\/(\d+)/.exec(url);
  if (!m) throw new Error(`not a plan page: ${url}`);
  return m[1];
};

/**
 * Waits until the planner's result on the page answers the present inputs in full: not marked as being
 * updated and no quicker first answer still waiting for the full one.
 */
export const settled = (page: Page) => page.waitForFunction(() => document.querySelector(".plan-view")?.getAttribute("aria-busy") === "false", undefined, { timeout: 90_000 });

/**
 * Downloads the planner's curves once its result is current and returns the CSV's text. The first, quicker
 * answer carries no curves (its button is disabled), and a result being updated does not offer them either:
 * a click before the full answer would find the button disabled or waiting.
 */
export async function downloadCurves(page: Page, name = "Download curves (CSV)"): Promise<string> {
  await settled(page);
  const [download] = await Promise.all([page.waitForEvent("download"), page.getByRole("button", { name }).click()]);
  return readFileSync(await download.path(), "utf8");
}
