import { describe, it } from "node:test";
import assert from "node:assert/strict";
import { browserSuite } from "./harness";
import { downloadCurves, installLatencyProbes, mainText, measureLatency, planIdOf, settled, setUnits } from "./planner-checks";

const suite = browserSuite();

describe("warm-up / cool-down check in the browser", () => {
  it("shows the curve and the time to the limit, updates when a value changes, saves a plan and reopens it", async () => {
    await suite.page.goto(suite.h.baseUrl + "/warmup");
    // Choose the product only once the page has hydrated (its first answer, from the page's worker, is on
    // screen): a choice made on the server-rendered form can be reset by hydration, as a loaded CI run showed.
    await suite.page.getByTestId("ttl-center").waitFor();
    await suite.page.getByLabel("Product").selectOption("Steamed rice, full pan");
    await suite.page.getByLabel("Starting temperature").fill("3");
    await suite.page.getByLabel("Temperature", { exact: true }).fill("25");
    await suite.page.getByTestId("temperature-chart").locator("svg path.recharts-curve").first().waitFor();
    await settled(suite.page);
    const before = await suite.page.getByTestId("ttl-center").innerText();
    assert.match(before, /\d+ (h|min)/);
    assert.match(await suite.page.getByTestId("method").innerText(), /^(lumped capacitance|exact series|numerical enthalpy solver): /);
    await suite.page.getByTestId("caution-block").waitFor();
    // A warmer room: the centre reaches the limit sooner, and the page shows it without a button press.
    await suite.page.getByLabel("Temperature", { exact: true }).fill("35");
    await suite.page.waitForFunction((prev) => document.querySelector('[data-testid="ttl-center"]')?.textContent !== prev, before);
    await settled(suite.page);
    const after = await suite.page.getByTestId("ttl-center").innerText();
    const minutes = (s: string) => {
      const hm = /(\d+) h (\d+) min/.exec(s);
      if (hm) return Number(hm[1]) * 60 + Number(hm[2]);
      const m = /(\d+) min/.exec(s);
      return m ? Number(m[1]) : NaN;
    };
    assert.ok(minutes(after) < minutes(before), `${after} should be sooner than ${before}`);
    // A bad value gets a field message and no result.
    await suite.page.getByLabel("Starting temperature").fill("-500");
    await suite.page.getByText(/cannot be below absolute zero/).first().waitFor();
    await suite.page.getByLabel("Starting temperature").fill("3");
    await suite.page.getByTestId("ttl-center").waitFor();
    await settled(suite.page);
    await suite.page.getByLabel("Save as a plan").fill("Rice on the buffet, hot day");
    await suite.page.getByRole("button", { name: "Save plan" }).click();
    await suite.page.getByRole("link", { name: "open the saved plan" }).click();
    await suite.page.getByRole("heading", { name: "Rice on the buffet, hot day" }).waitFor();
    assert.match(await suite.page.locator("main").innerText(), /Steamed rice, full pan/);
    const id = planIdOf(suite.page.url());
    await suite.page.goto(`${suite.h.baseUrl}/warmup?plan=${id}`);
    await suite.page.getByText(/Reopened the saved plan “Rice on the buffet, hot day”/).waitFor();
    await suite.page.getByTestId("ttl-center").waitFor();
    assert.equal(await suite.page.getByLabel("Product").inputValue(), "Steamed rice, full pan");
    assert.equal(await suite.page.getByLabel("Starting temperature").inputValue(), "3");
    assert.equal(await suite.page.getByLabel("Temperature", { exact: true }).inputValue(), "35");
    await suite.page.waitForFunction((t) => document.querySelector('[data-testid="ttl-center"]')?.textContent === t, after);
  });

  it("speaks °F after the switch in settings: the page, its field messages and the CSV's columns", async () => {
    const page = suite.page;
    await setUnits(page, suite.h.baseUrl, { temperature: "F", mass: "lb", length: "in" });
    try {
      await page.goto(suite.h.baseUrl + "/warmup");
      await page.getByTestId("ttl-center").waitFor();
      assert.equal(await page.getByLabel("Temperature", { exact: true }).inputValue(), "77");
      const text = await mainText(page);
      assert.doesNotMatch(text, /°C/);
      assert.match(text, /°F/);
      assert.doesNotMatch(text, /chilledMax|hotHoldMin|frozenMax/);
      const csv = await downloadCurves(page);
      assert.match(csv.split(/\r?\n/)[0], /^t_s,center_F,surface_F,mid_face_F,mean_F$/);
      await page.getByLabel("Starting temperature").fill("-500");
      await page.locator("#start_C-error").getByText(/−459\.7 °F/).waitFor();
      assert.equal(await page.getByLabel("Starting temperature").getAttribute("aria-describedby"), "start_C-error");
      assert.doesNotMatch(await mainText(page), /°C/);
    } finally {
      await setUnits(page, suite.h.baseUrl, { temperature: "C", mass: "kg", length: "mm" });
    }
  });

  it("latency: the demo warm-up computed in the page's worker (figures printed, not asserted)", async () => {
    const page = suite.page;
    await installLatencyProbes(page);
    await page.goto(suite.h.baseUrl + "/warmup");
    await page.getByTestId("ttl-center").waitFor();
    await measureLatency(page, "warm-up", "warmup", page.getByLabel("Temperature", { exact: true }), ["26", "27", "28", "29", "30"]);
  });

  it("answers the API with the same schema: 200 with times, 422 with field errors", async () => {
    const ok = await suite.page.request.post(suite.h.baseUrl + "/api/v1/warmup", {
      data: { product: "Roast chicken thighs, half tray", start_C: 3, surroundings: { medium: "air", T_C: 28, speed_m_s: 0 }, limit: "chilledMax" },
    });
    assert.equal(ok.status(), 200);
    const body = (await ok.json()) as { timeToLimit_s: { center: number }; method: string; series: unknown[] };
    assert.ok(body.timeToLimit_s.center > 0);
    assert.ok(body.series.length > 10);
    const bad = await suite.page.request.post(suite.h.baseUrl + "/api/v1/warmup", { data: { product: "Roast chicken thighs, half tray", start_C: "warm" } });
    assert.equal(bad.status(), 422);
    const e = (await bad.json()) as { fieldErrors: Record<string, string[]> };
    assert.ok(e.fieldErrors.start_C);
  });
});
