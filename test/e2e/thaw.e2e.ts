import { describe, it } from "node:test";
import assert from "node:assert/strict";
import { browserSuite } from "./harness";

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
    const rows = page.getByTestId("thaw-compare").locator("tbody tr");
    assert.equal(await rows.count(), 5);
    for (let i = 0; i < 5; i++) assert.match(await rows.nth(i).locator("td").nth(4).innerText(), /Dec|12/);

    await page.getByLabel("Method").selectOption("tray");
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
