import { describe, it } from "node:test";
import assert from "node:assert/strict";
import { browserSuite } from "./harness";
import { downloadCurves } from "./planner-checks";

const suite = browserSuite();

/** The full answer (deepest layer and methods) has arrived: no "pending" line and a depth in mm. */
async function fullAnswer(page: (typeof suite)["page"]) {
  await page.waitForFunction(
    () => !document.querySelector('[data-testid="result-pending"]') && /\d mm/.test(document.querySelector('[data-testid="cool-max-depth"]')?.textContent ?? ""),
    undefined,
    { timeout: 90_000 },
  );
}

describe("cooling planner in the browser", () => {
  it("plans a cooling of the demo rice: both stages judged, the deepest layer found, the methods side by side, the record printed", async () => {
    const page = suite.page;
    await page.goto(suite.h.baseUrl + "/cool");
    await page.getByLabel("Food", { exact: true }).selectOption("Steamed rice, full pan");
    // The first answer (the one plan) judges both stages; the depth search follows.
    await page.getByTestId("cool-stage-1").waitFor();
    assert.match(await page.getByTestId("cool-stage-1").innerText(), /57 °C to 21 °C: .* — (meets|misses)$/);
    assert.match(await page.getByTestId("cool-stage-2").innerText(), /to 5 °C: .* — (meets|misses)$/);
    await fullAnswer(page);
    const depthText = await page.getByTestId("cool-max-depth").innerText();
    const maxDepth_mm = Number(/^([\d.]+) mm/.exec(depthText)?.[1]);
    assert.ok(maxDepth_mm > 10 && maxDepth_mm < 65, depthText);
    assert.equal(await page.getByTestId("cool-compare").locator("tbody tr").count(), 4);
    await page.getByTestId("temperature-chart").locator("path.recharts-curve").first().waitFor();
    await page.getByTestId("caution-block").waitFor();

    // At the library's 50 mm the rice misses (the deepest layer is shallower); at the deepest layer found, rounded down, it meets both.
    assert.ok(maxDepth_mm < 50, `the demo rice at 50 mm should be deeper than the deepest layer (${maxDepth_mm} mm)`);
    assert.match(await page.getByTestId("cool-headline").innerText(), /miss/);
    await page.getByLabel("Food depth in the pan").fill(String(Math.floor(maxDepth_mm)));
    await page.waitForFunction(() => /meets$/.test(document.querySelector('[data-testid="cool-stage-2"]')?.textContent ?? ""), undefined, { timeout: 60_000 });
    assert.match(await page.getByTestId("cool-stage-1").innerText(), /meets$/);
    assert.match(await page.getByTestId("cool-headline").innerText(), /meet both cooling stages/);
    await fullAnswer(page);

    // The ice paddle is not modelled: a message tied to the field says why, and nothing is computed.
    await page.getByLabel("Method", { exact: true }).selectOption("ice_paddle");
    const msg = page.locator("#method-kind-msg");
    await msg.waitFor();
    assert.match(await msg.innerText(), /no published heat-transfer correlation/);
    assert.equal(await page.getByLabel("Method", { exact: true }).getAttribute("aria-describedby"), "method-kind-msg");
    await page.getByTestId("cool-errors").waitFor();
    await page.getByLabel("Method", { exact: true }).selectOption("walk_in");
    await fullAnswer(page);

    // The CSV has the slowest point, top and base in the user's units.
    const csv = await downloadCurves(page);
    assert.match(csv.split("\n")[0], /^t_s,slowest_C,top_C,base_C/);

    // Printed: the cooling record with its blanks and the sign-off; the form is left off.
    await page.emulateMedia({ media: "print" });
    const record = page.getByTestId("cool-record");
    assert.ok(await record.isVisible());
    const head = await record.locator("thead").innerText();
    for (const col of ["Probe reading (°C)", "Initials", "Clock time", "Model estimate (°C)"]) assert.ok(head.includes(col), `${col} in ${head}`);
    const rows = record.locator("tbody tr");
    assert.ok((await rows.count()) >= 4);
    assert.ok(await rows.first().getByText("__________").first().isVisible());
    assert.match(await record.innerText(), /Stage 1 due: at or below 21 °C/);
    assert.match(await record.innerText(), /Stage 2 due: at or below 5 °C/);
    assert.ok(await page.getByTestId("sign-off").isVisible());
    assert.match(await page.getByTestId("sign-off").innerText(), /Checked by \(initials\)/);
    assert.equal(await page.locator("form.planner-inputs").isVisible(), false);
    await page.emulateMedia({ media: "screen" });

    // Saved, and reopened from its id with the depth as saved.
    await page.getByLabel("Save as a plan").fill("Rice for tomorrow, shallow pan");
    await page.getByRole("button", { name: "Save plan" }).click();
    const href = await page.getByRole("link", { name: "open the saved plan" }).getAttribute("href");
    const id = /\/plans\/(\d+)$/.exec(href ?? "")?.[1];
    assert.ok(id, href ?? "no link");
    await page.goto(`${suite.h.baseUrl}/cool?plan=${id}`);
    await page.getByText(/Reopened the saved plan/).waitFor();
    await page.getByTestId("cool-stage-1").waitFor();
    assert.equal(await page.getByLabel("Food depth in the pan").inputValue(), String(Math.floor(maxDepth_mm)));
  });

  it("answers POST /api/v1/cool with the issue's names, and 422 with the field for a pan that would flood", async () => {
    const page = suite.page;
    const ok = await page.request.post(suite.h.baseUrl + "/api/v1/cool", {
      data: { product: "Steamed rice, full pan", start_C: 74, setup: { kind: "pan", size: "1/1", height_m: 0.065, depth_m: 0.04 }, method: { kind: "ice_bath" }, compare: false },
    });
    assert.equal(ok.status(), 200);
    const b = (await ok.json()) as Record<string, unknown> & { stages: Record<string, unknown>[] };
    for (const k of ["stages", "maxDepth_m", "warnings", "assumptions", "series"]) assert.ok(k in b, k);
    for (const k of ["from_C", "to_C", "limit_s", "reached_s", "meets"]) assert.ok(k in b.stages[0], k);
    const bad = await page.request.post(suite.h.baseUrl + "/api/v1/cool", {
      data: { product: "Steamed rice, full pan", start_C: 74, setup: { kind: "pan", height_m: 0.065, depth_m: 0.04 }, method: { kind: "ice_bath", level_m: 0.1 } },
    });
    assert.equal(bad.status(), 422);
    assert.match(JSON.stringify(await bad.json()), /rim/);
  });
});
