import { describe, it } from "node:test";
import assert from "node:assert/strict";
import { browserSuite } from "./harness";
import { downloadCurves, installLatencyProbes, mainText, measureLatency, planIdOf, settled, setUnits } from "./planner-checks";

const suite = browserSuite();

const minutes = (s: string) => {
  const d = /([\d.]+) days/.exec(s);
  if (d) return Number(d[1]) * 1440;
  const hm = /(\d+) h (\d+) min/.exec(s);
  if (hm) return Number(hm[1]) * 60 + Number(hm[2]);
  const m = /(\d+) min/.exec(s);
  return m ? Number(m[1]) : NaN;
};

describe("thaw planner in the browser", () => {
  it("plans the seeded whole bird for a service time: start times per method, and the metal tray beats the plastic board", async () => {
    const page = suite.page;
    await page.goto(suite.h.baseUrl + "/thaw");
    await page.getByLabel("Frozen item").selectOption("Whole turkey, 6 kg");
    await page.getByLabel("Ready by").fill("2026-12-05T11:00");
    await page.getByTestId("start-by").waitFor();
    // The chosen method comes first; the side-by-side comparison follows from the same worker.
    await page.getByTestId("thaw-compare").waitFor();
    const rows = page.getByTestId("thaw-compare").locator("tbody tr");
    assert.equal(await rows.count(), 5);
    for (let i = 0; i < 5; i++) assert.match(await rows.nth(i).locator("td").nth(4).innerText(), /Dec|12/);

    await page.getByLabel("Method", { exact: true }).selectOption("tray");
    await page.getByLabel("Tray material").selectOption("Aluminium (pure)");
    await page.getByLabel("Tray thickness").fill("6");
    await page.waitForFunction(() => /on a tray/i.test(document.querySelector('[data-testid="thaw-headline"]')?.textContent ?? ""));
    const metal = minutes(await page.getByTestId("thaw-time").innerText());
    await page.getByLabel("Tray material").selectOption("HDPE sheet");
    await page.getByLabel("Tray thickness").fill("15");
    await page.waitForFunction((m) => {
      const t = document.querySelector('[data-testid="thaw-time"]')?.textContent ?? "";
      return t !== "" && !t.startsWith(String(m));
    }, String(metal));
    await page.waitForTimeout(300);
    const board = minutes(await page.getByTestId("thaw-time").innerText());
    assert.ok(metal < board, `aluminium ${metal} min should beat polyethylene ${board} min`);
    await page.getByTestId("caution-block").getByText(/refreezing/).waitFor();
    // The methods and limits by name, never the schema's codes.
    assert.doesNotMatch(await mainText(page), /fridge_air|still_water|running_water|room_air/);
  });

  it("saves a plan, shows its record, and reopens it with the same inputs", async () => {
    const page = suite.page;
    await page.goto(suite.h.baseUrl + "/thaw");
    await page.getByLabel("Frozen item").selectOption("Cod fillets, frozen block");
    await page.getByLabel("Method", { exact: true }).selectOption("running_water");
    await page.getByLabel("Water temperature").fill("12");
    await page.getByLabel("Ready by").fill("2026-12-05T18:30");
    await page.waitForFunction(() => /running water/i.test(document.querySelector('[data-testid="thaw-headline"]')?.textContent ?? ""));
    await page.getByTestId("start-by").waitFor();
    const time = await page.getByTestId("thaw-time").innerText();
    await page.getByLabel("Save as a plan").fill("Cod for the evening service");
    await page.getByRole("button", { name: "Save plan" }).click();
    await page.getByRole("link", { name: "open the saved plan" }).click();
    await page.getByRole("heading", { name: "Cod for the evening service" }).waitFor();
    assert.match(await page.locator("main").innerText(), /Cod fillets, frozen block/);
    const id = planIdOf(page.url());
    await page.goto(`${suite.h.baseUrl}/thaw?plan=${id}`);
    await page.getByText(/Reopened the saved plan “Cod for the evening service”/).waitFor();
    await page.getByTestId("thaw-time").waitFor();
    assert.equal(await page.getByLabel("Frozen item").inputValue(), "Cod fillets, frozen block");
    assert.equal(await page.getByLabel("Method", { exact: true }).inputValue(), "running_water");
    assert.equal(await page.getByLabel("Water temperature").inputValue(), "12");
    assert.equal(await page.getByLabel("Ready by").inputValue(), "2026-12-05T18:30");
    await page.waitForFunction((t) => document.querySelector('[data-testid="thaw-time"]')?.textContent === t, time);
    // A plan id that is not one: the empty planner, no error.
    await page.goto(`${suite.h.baseUrl}/thaw?plan=12abc`);
    await page.getByTestId("thaw-time").waitFor();
    assert.equal(await page.getByText(/Reopened the saved plan/).count(), 0);
  });

  it("speaks °F, lb and in after the switch in settings: the page and the CSV's columns", async () => {
    const page = suite.page;
    await setUnits(page, suite.h.baseUrl, { temperature: "F", mass: "lb", length: "in" });
    try {
      await page.goto(suite.h.baseUrl + "/thaw");
      await page.getByTestId("thaw-compare").waitFor();
      assert.equal(await page.getByLabel("Starting temperature").inputValue(), "-0.4");
      await page.getByLabel("Method", { exact: true }).selectOption("tray");
      await page.waitForFunction(() => /on a tray/i.test(document.querySelector('[data-testid="thaw-headline"]')?.textContent ?? ""));
      await settled(page);
      await page.getByTestId("thaw-compare").waitFor();
      const text = await mainText(page);
      assert.doesNotMatch(text, /°C/);
      assert.match(text, /°F/);
      assert.doesNotMatch(text, /\d\s?mm\b/);
      const csv = await downloadCurves(page);
      assert.match(csv.split(/\r?\n/)[0], /^t_s,center_F,surface_F$/);
      assert.ok(csv.split(/\r?\n/).length > 20);
      // A bad value: the message beside the field, in °F, tied to it; one polite summary.
      await page.getByLabel("Starting temperature").fill("-600");
      const msg = page.locator("#start_C-error");
      await msg.waitFor();
      assert.match(await msg.innerText(), /−459\.7 °F/);
      assert.equal(await page.getByLabel("Starting temperature").getAttribute("aria-describedby"), "start_C-error");
      assert.equal(await page.getByLabel("Starting temperature").getAttribute("aria-invalid"), "true");
      assert.equal(await page.locator("main [role=alert]").count(), 0);
    } finally {
      await setUnits(page, suite.h.baseUrl, { temperature: "C", mass: "kg", length: "mm" });
    }
  });

  it("latency: the demo thaw computed in the page's worker (figures printed, not asserted)", async () => {
    const page = suite.page;
    await installLatencyProbes(page);
    await page.goto(suite.h.baseUrl + "/thaw");
    await page.getByTestId("thaw-compare").waitFor();
    await measureLatency(page, "thaw", "thaw", page.getByLabel("Starting temperature"), ["-17", "-19", "-16", "-20", "-18"]);
  });

  it("answers POST /api/v1/thaw with the agreed fields, compare included, and 422 when there is nothing to thaw", async () => {
    const page = suite.page;
    const ok = await page.request.post(suite.h.baseUrl + "/api/v1/thaw", {
      data: { product: "Cod fillets, frozen block", method: { kind: "running_water", water_C: 15, speed_m_s: 0.05 }, compare: true },
    });
    assert.equal(ok.status(), 200);
    const b = (await ok.json()) as Record<string, unknown> & { comparison: unknown[]; series: { t_s: number; center_C: number; surface_C: number }[] };
    for (const k of ["thawTime_s", "surfaceAboveLimit_s", "maxSurface_C", "compliance", "estimates", "warnings"]) assert.ok(k in b, k);
    assert.equal(b.comparison.length, 5);
    assert.ok("center_C" in b.series[0] && "surface_C" in b.series[0]);
    const bad = await page.request.post(suite.h.baseUrl + "/api/v1/thaw", { data: { product: "Cod fillets, frozen block", start_C: 3, method: { kind: "fridge_air", air_C: 4, speed_m_s: 0 } } });
    assert.equal(bad.status(), 422);
    assert.match(JSON.stringify(await bad.json()), /nothing to thaw/);
  });
});
