import { describe, it } from "node:test";
import assert from "node:assert/strict";
import path from "node:path";
import { browserSuite } from "./harness";

const suite = browserSuite();

describe("calibration from a logged trip in the browser", () => {
  it("loads a logger CSV into the demo hold plan, shows it on the plan's chart, fits, saves the calibrated box and plans with it", async () => {
    const page = suite.page;
    await page.goto(suite.h.baseUrl + "/calibrate");
    await page.getByLabel("Plan", { exact: true }).selectOption({ label: "Demo: roast chicken thighs in the thin cooler on the summer lunch run" });
    await page.getByLabel("Open a CSV file").setInputFiles(path.resolve("public", "examples", "logger-trip.csv"));
    // The columns, guessed in the usual order, and the log beside the plan before any fit.
    assert.equal(await page.locator("#cal-col-0").inputValue(), "inside_air");
    assert.equal(await page.locator("#cal-col-1").inputValue(), "product");
    assert.equal(await page.locator("#cal-col-2").inputValue(), "pack");
    await page.getByTestId("plan-log-chart").locator("path.recharts-curve").first().waitFor();
    assert.match(await page.getByTestId("plan-log-rms").innerText(), /^\d+\.\d\d K$/);
    assert.match(await page.getByTestId("plan-log-max").innerText(), /K \(.+ after the start\)/);

    await page.getByTestId("cal-fit").click();
    await page.getByTestId("calibrate-headline").waitFor({ timeout: 120_000 });
    const factors = await page.getByTestId("calibrate-factors").innerText();
    assert.match(factors, /Wall conductance factor.*\d\.\d+ – \d\.\d+/);
    assert.match(await page.getByTestId("calibrate-rms").innerText(), /K \(as built: /);
    await page.getByTestId("calibrate-chart").locator("path.recharts-curve").first().waitFor();

    await page.getByTestId("cal-save-box").click();
    await page.getByTestId("cal-saved").waitFor({ timeout: 120_000 });
    assert.match(await page.getByTestId("cal-saved").innerText(), /Quillfield thin foam cooler — calibrated logger-trip\.csv/);
    await page.getByRole("link", { name: "Plan with it" }).click();
    await page.getByText(/Reopened the saved plan/).waitFor();
    await page.getByTestId("hold-time").waitFor();
    assert.match(await page.getByLabel("Box", { exact: true }).inputValue(), /calibrated logger-trip\.csv/);
    await page.getByText(/Calibrated from logger-trip\.csv/).first().waitFor();
    await page.getByText(/fitted 95 % intervals/).first().waitFor();
  });

  it("a malformed file is refused with its row and column, next to the text box", async () => {
    const page = suite.page;
    await page.goto(suite.h.baseUrl + "/calibrate");
    await page.getByLabel("or paste its text").fill("minutes,Air\n0,4.0\n5,4.2\n10,warm\n15,4.6\n");
    const problems = page.getByTestId("cal-log-problems");
    await problems.waitFor();
    assert.match(await problems.innerText(), /row 4, "Air": "warm" is not a number/);
    assert.equal(await page.getByLabel("or paste its text").getAttribute("aria-describedby"), "cal-log-problems");
    assert.equal(await page.getByTestId("cal-fit").isDisabled(), true);
  });
});
