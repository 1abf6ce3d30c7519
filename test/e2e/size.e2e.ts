import { describe, it } from "node:test";
import assert from "node:assert/strict";
import type { Page } from "playwright-core";
import { browserSuite } from "./harness";

const suite = browserSuite();

/** Waits until React has hydrated the sizer's form, so a click runs the page's handler, not a plain form post. */
async function hydrated(page: Page) {
  await page.waitForFunction(() => {
    const b = [...document.querySelectorAll("button")].find((x) => x.textContent?.includes("Find pack-outs"));
    return !!b && Object.keys(b).some((k) => k.startsWith("__reactProps"));
  });
}

const planCount = async (page: Page) => ((await (await page.request.get(suite.h.baseUrl + "/api/v1/plans")).json()) as unknown[]).length;
const setUnits = (page: Page, temperatureUnit: "C" | "F", massUnit: "kg" | "lb", lengthUnit: "mm" | "in") =>
  page.request.put(suite.h.baseUrl + "/api/v1/settings", { data: { temperatureUnit, massUnit, lengthUnit } });

describe("pack-out sizer in the browser", () => {
  it("sizes from the demo library, opens a candidate in the hold planner and on its sheet without saving, and saves the sizing only when asked", async () => {
    const page = suite.page;
    await page.goto(suite.h.baseUrl + "/size");
    await hydrated(page);
    await page.getByLabel("Route", { exact: true }).selectOption("Overnight courier, Millbrook depot");
    // The demo library offers water ice, gel and eutectic packs (dry ice only when asked): keep two.
    const packLine = (i: number) => page.getByTestId(`pack-line-${i}`);
    assert.equal(await page.locator('[data-testid^="pack-line-"]').count(), 3);
    await packLine(2).getByRole("button", { name: /Remove pack 3/ }).click();
    assert.equal(await page.locator('[data-testid^="pack-line-"]').count(), 2);
    assert.equal(await page.getByLabel("Pack 2", { exact: true }).inputValue(), "Gel pack, 600 g");

    // A message sits beside its field, names the pack, and the field points at it.
    await packLine(1).getByLabel("Fewest").fill("5");
    await packLine(1).getByLabel("Most").fill("4");
    await packLine(1).getByLabel("Most").blur();
    const msg = packLine(1).getByText("Gel pack, 600 g: Most must be at least Fewest");
    await msg.waitFor();
    assert.equal(await msg.getAttribute("role"), null, "not a live region: not announced on every keystroke");
    assert.equal(await packLine(1).getByLabel("Most").getAttribute("aria-describedby"), await msg.getAttribute("id"));
    assert.equal(await packLine(1).getByLabel("Most").getAttribute("aria-invalid"), "true");
    await packLine(1).getByLabel("Fewest").fill("0");
    await msg.waitFor({ state: "detached" });
    for (const i of [0, 1]) await packLine(i).getByLabel("Most").fill("4");
    // Raw kind codes never reach the page.
    assert.doesNotMatch(await page.locator("form").innerText(), /dry_ice|water_ice|\bpcm\b/);

    // Record whether the progress display ever appears, however quickly the search ends.
    await page.evaluate(() => {
      (window as unknown as { sawProgress: boolean }).sawProgress = false;
      new MutationObserver(() => {
        if (document.querySelector('[data-testid="size-progress"]')) (window as unknown as { sawProgress: boolean }).sawProgress = true;
      }).observe(document.body, { childList: true, subtree: true });
    });
    await page.getByRole("button", { name: "Find pack-outs" }).click();
    await page.getByTestId("size-table").waitFor({ timeout: 120000 });
    assert.equal(await page.evaluate(() => (window as unknown as { sawProgress: boolean }).sawProgress), true);
    assert.match(await page.getByTestId("size-headline").innerText(), /candidates are estimated to hold/);
    await page.getByTestId("pareto-chart").waitFor();
    await page.getByTestId("size-front").waitFor();
    await page.getByTestId("assumptions").waitFor();
    await page.getByTestId("caution-block").waitFor();
    const best = page.getByTestId("size-table").locator("tbody tr[data-pareto]").first();
    const packsOfBest = await best.locator("td").nth(2).innerText();
    const holdHref = await best.getByRole("link", { name: "Open in the hold planner" }).getAttribute("href");
    const sheetHref = await best.getByRole("link", { name: "Pack-out sheet" }).getAttribute("href");
    assert.match(holdHref ?? "", /^\/hold\?from=[A-Za-z0-9_-]+$/);
    assert.match(sheetHref ?? "", /^\/size\/sheet\?from=[A-Za-z0-9_-]+$/);

    // Saving is explicit: the sizing becomes one plan (the server computes it again).
    const before = await planCount(page);
    await page.getByLabel("Save as a plan").fill("Millbrook overnight pack-out");
    await page.getByRole("button", { name: "Save plan" }).click();
    await page.getByRole("link", { name: "open the saved plan" }).waitFor({ timeout: 120000 });
    assert.equal(await planCount(page), before + 1);
    const savedHref = await page.getByRole("link", { name: "open the saved plan" }).getAttribute("href");
    const savedId = savedHref!.split("/").pop();

    // Opening the candidate in the hold planner carries its inputs and saves nothing.
    await best.getByRole("link", { name: "Open in the hold planner" }).click();
    await page.waitForURL(/\/hold\?from=/);
    await page.getByTestId("hold-from").getByText(/from the pack-out sizer/).waitFor();
    await page.getByTestId("hold-time").waitFor({ timeout: 30000 });
    assert.equal(await page.getByLabel("Product 1", { exact: true }).inputValue(), "Roast chicken thighs, half tray");
    assert.equal(await page.getByLabel("Route", { exact: true }).inputValue(), "Overnight courier, Millbrook depot");
    const firstPack = await page.getByLabel("Pack 1", { exact: true }).inputValue();
    const firstCount = await page.getByTestId("pack-line-0").getByLabel("How many").inputValue();
    assert.ok(packsOfBest.includes(`${firstCount} × ${firstPack}`), `${packsOfBest} has ${firstCount} × ${firstPack}`);
    assert.equal(await planCount(page), before + 1, "opening a candidate saved no plan");

    // Its sheet in °F, lb and in: one rounding for each temperature, nothing saved.
    assert.equal((await setUnits(page, "F", "lb", "in")).status(), 200);
    await page.goto(suite.h.baseUrl + sheetHref);
    await page.getByTestId("layer-diagram").waitFor();
    await page.getByText("This sheet is worked out from the candidate and is not saved").waitFor();
    await page.waitForFunction(() => /Estimated hold .*range/.test(document.querySelector('[data-testid="sheet-hold"]')?.textContent ?? ""), undefined, { timeout: 30000 });
    await page.waitForFunction(() => !document.querySelector('[data-testid="sheet-packs"]')?.textContent?.includes("working it out"));
    const names = ["Eutectic plate −21 °C, 800 g", "Water ice brick, 1 kg", "Gel pack, 600 g", "Dry ice slab, 2.5 kg"];
    const sheet = names.reduce((t, n) => t.split(n).join("«pack»"), await page.locator("article.sheet").innerText());
    assert.doesNotMatch(sheet, /°C|\d\s?kg\b(?!\/)|\d\s?mm\b/);
    assert.match(await page.getByTestId("sheet-name").innerText(), / at -?\d+(\.\d+)? °F/);
    // 57 °C is 134.6 °F (×9/5 + 32, NIST SP 811 Appendix B): never also "135 °F" on the same sheet.
    assert.match(await page.getByTestId("sheet-limits").innerText(), /hot at least 134\.6 °F/);
    const byValue = new Map<number, Set<string>>();
    for (const m of sheet.matchAll(/(−|-)?(\d+(?:\.\d+)?) °F/g)) {
      const f = Number(m[2]) * (m[1] ? -1 : 1);
      const key = Math.round((((f - 32) * 5) / 9) * 2) / 2;
      byValue.set(key, (byValue.get(key) ?? new Set()).add(m[0].replace("−", "-")));
    }
    for (const [c, shown] of byValue) assert.equal(shown.size, 1, `${c} °C is shown as ${[...shown].join(" and ")}`);
    assert.ok(byValue.size >= 3);
    assert.equal(await planCount(page), before + 1, "the sheet saved no plan");
    assert.equal((await setUnits(page, "C", "kg", "mm")).status(), 200);

    // The saved sizing is in the plans list and reopens into the sizer with its inputs and result.
    await page.goto(suite.h.baseUrl + "/plans");
    await page.getByRole("link", { name: "Millbrook overnight pack-out" }).waitFor();
    await page.goto(`${suite.h.baseUrl}/size?plan=${savedId}`);
    await page.getByText(/Reopened the saved sizing/).waitFor();
    await hydrated(page);
    assert.equal(await page.locator('[data-testid^="pack-line-"]').count(), 2);
    assert.equal(await page.getByTestId("pack-line-1").getByLabel("Most").inputValue(), "4");
    assert.equal(await page.getByLabel("Route", { exact: true }).inputValue(), "Overnight courier, Millbrook depot");
    await page.getByTestId("size-table").waitFor();
  });

  it("can be stopped part-way, and says so", async () => {
    const page = suite.page;
    await page.goto(suite.h.baseUrl + "/size");
    await hydrated(page);
    // A freeze-sensitive load cannot be pruned, so this search runs long enough to stop.
    await page.getByLabel("Product 1", { exact: true }).selectOption("Mixed salad leaves, tub");
    for (const i of [0, 1, 2]) await page.getByTestId(`pack-line-${i}`).getByLabel("Most").fill("10");
    await page.getByRole("button", { name: "Find pack-outs" }).click();
    await page.getByTestId("size-progress").waitFor();
    await page.getByRole("button", { name: "Stop" }).click();
    await page.getByText("Stopped. Nothing was changed.").waitFor();
    assert.equal(await page.getByTestId("size-table").count(), 0);
  });

  it("answers POST /api/v1/size with candidates, pareto and nearMisses; refuses an oversized search with a clear message", async () => {
    const page = suite.page;
    const body = {
      products: [{ product: "Roast chicken thighs, half tray", count: 1, start_C: 2 }],
      route: "Overnight courier, Millbrook depot",
      boxes: [{ shipper: "Quillfield thin foam cooler" }, { shipper: "Quillfield lined carton" }],
      packs: [{ pack: "Gel pack, 600 g", maxCount: 6, conditioning_C: [-18] }],
    };
    const ok = await page.request.post(suite.h.baseUrl + "/api/v1/size", { data: body });
    assert.equal(ok.status(), 200);
    const r = (await ok.json()) as { candidates: { holds: boolean; mass_kg: number; cost: number; outerVolume_m3: number }[]; pareto: number[]; nearMisses: unknown[] };
    assert.ok(r.candidates.length > 5);
    assert.ok(Array.isArray(r.pareto) && Array.isArray(r.nearMisses));
    for (const k of ["holds", "mass_kg", "cost", "outerVolume_m3"]) assert.ok(k in r.candidates[0], k);
    const big = await page.request.post(suite.h.baseUrl + "/api/v1/size", { data: { ...body, maxCandidates: 10, packs: [{ pack: "Gel pack, 600 g", maxCount: 60, conditioning_C: [-18, -25] }] } });
    assert.equal(big.status(), 422);
    assert.match(JSON.stringify(await big.json()), /narrow the count ranges/);
  });

  it("a carried candidate that is not one is refused with 404, and the hold planner starts from the library", async () => {
    const page = suite.page;
    for (const from of ["garbage!", "AAAA", "x".repeat(13000)]) {
      const r = await page.request.get(`${suite.h.baseUrl}/size/sheet?from=${encodeURIComponent(from)}`);
      assert.equal(r.status(), 404, from.slice(0, 10));
    }
    await page.goto(suite.h.baseUrl + "/hold?from=AAAA");
    await page.getByText(/could not be read/).waitFor();
    await page.getByTestId("hold-time").waitFor({ timeout: 30000 });
  });
});
