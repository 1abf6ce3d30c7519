import { describe, it } from "node:test";
import assert from "node:assert/strict";
import { browserSuite } from "./harness";

const suite = browserSuite();

describe("pack-out sizer in the browser", () => {
  it("sizes from the seeded templates with progress, shows the table, opens a candidate as a plan and the print sheet", async () => {
    const page = suite.page;
    await page.goto(suite.h.baseUrl + "/size");
    await page.getByLabel("Route", { exact: false }).first().selectOption("Overnight courier, Millbrook depot");
    for (const name of ["Eutectic plate −21 °C, 800 g", "Gel pack, 600 g", "Water ice brick, 1 kg"]) await page.getByLabel("Most").nth(["Dry ice slab, 2.5 kg", "Eutectic plate −21 °C, 800 g", "Gel pack, 600 g", "Water ice brick, 1 kg"].indexOf(name)).fill("8");
    // Record whether the progress display ever appears, however quickly the search ends.
    await page.evaluate(() => {
      (window as unknown as { sawProgress: boolean }).sawProgress = false;
      new MutationObserver(() => {
        if (document.querySelector('[data-testid="size-progress"]')) (window as unknown as { sawProgress: boolean }).sawProgress = true;
      }).observe(document.body, { childList: true, subtree: true });
    });
    await page.getByRole("button", { name: "Find pack-outs" }).click();
    await page.getByTestId("size-table").waitFor({ timeout: 90000 });
    assert.equal(await page.evaluate(() => (window as unknown as { sawProgress: boolean }).sawProgress), true);
    assert.match(await page.getByTestId("size-headline").innerText(), /candidates hold for/);
    assert.ok((await page.getByTestId("size-table").locator("tbody tr[data-pareto]").count()) >= 1);
    await page.getByTestId("pareto-chart").waitFor();

    await page.getByTestId("size-table").locator("tbody tr[data-pareto]").first().getByRole("button", { name: "Open as plan" }).click();
    await page.waitForURL(/\/hold\?plan=\d+/);
    await page.getByText(/Reopened the saved plan/).waitFor();
    await page.getByTestId("hold-time").waitFor();

    await page.goBack();
    await page.getByRole("button", { name: "Find pack-outs" }).click();
    await page.getByTestId("size-table").waitFor({ timeout: 90000 });
    await page.getByTestId("size-table").locator("tbody tr[data-pareto]").first().getByRole("button", { name: "Pack-out sheet" }).click();
    await page.waitForURL(/\/size\/sheet\/\d+/);
    await page.getByTestId("layer-diagram").waitFor();
    assert.match(await page.getByTestId("sheet-hold").innerText(), /Estimated hold/);
    await page.getByText("Packed by:").waitFor();
  });

  it("can be stopped part-way, and says so", async () => {
    const page = suite.page;
    await page.goto(suite.h.baseUrl + "/size");
    // A freeze-sensitive load cannot be pruned, so this search runs long enough to stop.
    await page.getByLabel("Product 1", { exact: true }).selectOption("Mixed salad leaves, tub");
    for (const i of [1, 2, 3]) await page.getByLabel("Most").nth(i).fill("10");
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
});
